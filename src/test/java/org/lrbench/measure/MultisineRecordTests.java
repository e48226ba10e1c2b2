package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.lrbench.analysis.MultisineDesign;
import org.lrbench.instrument.Trace;
import org.lrbench.plan.PlanLoader;
import org.lrbench.plan.SineSweep;

/**
 * How long a multisine's record is made. Facts used: a least-squares phasor's variance is the noise
 * variance over half the samples (IEEE 1057, the sine fit's uncertainty); an 8-bit converter's
 * quantization noise is a code step over root 12 (common practice, no source).
 */
class MultisineRecordTests {
    private static final SineSweep SWEEP = sweep();
    private static final MultisineDesign.Design DESIGN = MultisineDesign.of(SWEEP.frequenciesHz(), 0.01, 65536);

    private static SineSweep sweep() {
        try {
            return PlanLoader.parse("""
            plan_format: 1
            part_number: T-1
            fixture: {sense_resistor: 100 ohm}
            sine_sweep: {amplitude: 3 V, frequencies: [1 kHz, 3 kHz], cycles: 10, samples_per_cycle: 200, settle: 0 s}
            limits: [{characteristic: inductance, min: 1 uH}]
            """, "t.yaml", 5.0).sweep();
        } catch (org.lrbench.yaml.ProblemsException e) {
            throw new IllegalStateException(e);
        }
    }

    /** One period of the tones with these amplitudes (volts at the digitizer), quantized to 8 bits of {@code range}. */
    private static Trace trace(int channel, double[] amplitudes, double range) {
        int top = java.util.Arrays.stream(DESIGN.bins()).max().orElseThrow();
        int n = 8 * top;
        double dt = 1 / (DESIGN.baseHz() * n);
        double lsb = range / 256;
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            double x = 0;
            for (int k = 0; k < amplitudes.length; k++) {
                x += amplitudes[k] * Math.sin(2 * Math.PI * DESIGN.frequenciesHz()[k] * i * dt + DESIGN.phases()[k]);
            }
            v[i] = Math.round(x / lsb) * lsb;
        }
        return new Trace(channel, dt, 0, v, range, 0, 0);
    }

    private static int perPeriod(double[] sense, double[] part, double noise, int maxRecord) {
        double range = 4;
        return MultisineRecord.samplesPerPeriod(SWEEP, DESIGN, new Trace[] {trace(1, sense, range), trace(2, part, range)},
                new double[] {range, range}, new double[] {0.01, 0.01}, noise, 1000, 1, maxRecord, 1e-9);
    }

    /**
     * Tones whose sum sits on the range a stepped point of the plan's amplitude would use: each has
     * its share of the peak, so its phasor's variance per sample is 1 / share^2 the point's, and the
     * record needs that many times the point's samples (over the aim squared).
     */
    @Test
    void tonesSharingTheRangeOfAPointNeedTheSamplesTheirShareCosts() {
        double a = 1.5 * DESIGN.toneAmplitude();
        double share = DESIGN.toneAmplitude();
        double point = SWEEP.cycles() * SWEEP.samplesPerCycle();
        int expected = (int) (1000 * Math.ceil(point / (share * share) / (MultisineRecord.AIM * MultisineRecord.AIM) / 1000));
        assertThat(perPeriod(new double[] {a, a}, new double[] {a, a}, 0.5e-3, 1 << 24)).isEqualTo(expected);
    }

    @Test
    void aToneFarDownItsRangeAsksForMoreSamplesTheFurtherDown() {
        double a = 1.5 * DESIGN.toneAmplitude();
        int equal = perPeriod(new double[] {a, a}, new double[] {a, a}, 0.5e-3, 1 << 24);
        int tenth = perPeriod(new double[] {a, a}, new double[] {a / 10, a}, 0.5e-3, 1 << 24);
        int thirtieth = perPeriod(new double[] {a, a}, new double[] {a / 30, a}, 0.5e-3, 1 << 24);
        assertThat(tenth).isGreaterThan(equal);
        assertThat(thirtieth).isGreaterThan(tenth);
        // the record is a whole multiple of the plan's samples per period
        assertThat(thirtieth % 1000).isZero();
    }

    @Test
    void theRecordStaysWithinTheDigitizersLongestAndTheCap() {
        double a = 1.5 * DESIGN.toneAmplitude();
        assertThat(perPeriod(new double[] {a, a}, new double[] {a / 1000, a}, 0.5e-3, 1 << 24))
                .isEqualTo(1000 * MultisineRecord.MOST);
        assertThat(perPeriod(new double[] {a, a}, new double[] {a / 1000, a}, 0.5e-3, 5000)).isLessThanOrEqualTo(5000);
    }

    @Test
    void withoutADeclaredNoiseTheRecordIsNotShorter() {
        double a = 1.5 * DESIGN.toneAmplitude();
        for (double s : List.of(3.0, 10.0, 30.0)) {
            assertThat(perPeriod(new double[] {a, a}, new double[] {a / s, a}, Double.NaN, 1 << 24))
                    .isGreaterThanOrEqualTo(perPeriod(new double[] {a, a}, new double[] {a / s, a}, 0.5e-3, 1 << 24));
        }
    }
}
