package org.lrbench.measure;

import org.lrbench.analysis.MultisineDesign;
import org.lrbench.analysis.MultisineFit;
import org.lrbench.analysis.SineFitResult;
import org.lrbench.instrument.Trace;
import org.lrbench.plan.SineSweep;

/**
 * How many samples the multisine's record takes so that every tone's phasor is about as certain
 * as the stepped sweep's point at that frequency would be. A stepped point has the whole plan
 * amplitude on one frequency and both channels ranged for it; in a multisine each tone has a
 * fraction of the peak, and each channel's range must hold the sum of all tones, so a tone whose
 * voltage is small beside the others' (the part's voltage at low frequencies, the current at high
 * ones) sits far down in its range. The record lasts what the plan's cycles of the lowest tone
 * last either way; what can be had is more samples in that time (a least-squares phasor's variance
 * falls as one over the samples where the noise is white).
 *
 * <p>Per tone and channel the prediction takes the amplitude the probe saw and the range the
 * capture will use, against the stepped point's amplitude (the plan's, over the tone's share) on a
 * range at the auto-ranger's target fill (or the channel's smallest range). A channel's noise on a
 * range is the digitizer's input noise (its driver's {@code vertical.noise}, the manual's figure)
 * with the quantization of that range (one code step, the smallest gap between the probe's
 * samples, over root 12, the step taken proportional to the range). Without a declared noise
 * the floor is the smallest range's quantization: the stepped point then looks quieter than it is
 * and the record comes out longer than needed, never shorter. The factor is capped at
 * {@value #MOST}, at {@value #MOST_SAMPLES} samples and by the digitizer's longest record and
 * shortest interval; what it still lacks shows in the points' uncertainties.
 */
final class MultisineRecord {
    /**
     * The multisine's per-tone uncertainty aimed at, over the stepped point's: the ratio the fast
     * sweep is held to. The limits' uncertainties come out lower (measured: 0.5x to 1.3x on the
     * benchmark's parts), as not every limit rests on the tone that needs most samples.
     */
    static final double AIM = 1.5;
    /** The most samples per period, over the plan's: beyond it the stepped sweep is the better choice. */
    static final int MOST = 64;
    /**
     * The most samples a channel's record takes, whatever the digitizer allows: about 2 million, 16 MB a
     * channel in the trace archive and a second or two of fitting; beyond it the stepped sweep is the
     * better choice.
     */
    static final int MOST_SAMPLES = 1 << 21;

    private MultisineRecord() {
    }

    /**
     * Samples per common period: the plan's ({@code basePerPeriod}) times the smallest whole factor
     * that puts every tone within {@link #AIM} of the stepped point's certainty, within the digitizer's limits.
     *
     * @param probe         both channels' traces of the probe (one period), at any ranges
     * @param captureRanges the ranges the capture will use, peak-to-peak volts, channels 1 and 2
     * @param minRanges     each channel's smallest range, peak-to-peak volts
     */
    static int samplesPerPeriod(SineSweep sweep, MultisineDesign.Design d, Trace[] probe, double[] captureRanges,
                                double[] minRanges, double declaredNoise, int basePerPeriod, int periods, int maxRecord,
                                double minInterval) {
        double[] tones = d.frequenciesHz();
        double stepped = sweep.cycles() * (double) sweep.samplesPerCycle();
        double needed = 0;
        double[] multi = new double[tones.length];
        double[] step = new double[tones.length];
        for (int c = 0; c < 2; c++) {
            SineFitResult[] fit = MultisineFit.fit(probe[c].volts(), probe[c].intervalSecond(), tones);
            Noise noise = Noise.of(probe[c], minRanges[c], declaredNoise);
            for (int i = 0; i < tones.length; i++) {
                double a = fit[i].amplitude();
                if (!(a > 0)) {
                    return cap(MOST, basePerPeriod, periods, maxRecord, minInterval, d);
                }
                double amplitude = a / d.toneAmplitude();
                double rangeStepped = Math.max(2 * amplitude / AutoRanger.TARGET_FILL, minRanges[c]);
                multi[i] += noise.variance(captureRanges[c]) / (a * a);
                step[i] += noise.variance(rangeStepped) / (amplitude * amplitude);
            }
        }
        // the tone that needs most samples sets the record: a limit may rest on that tone alone
        for (int i = 0; i < tones.length; i++) {
            needed = Math.max(needed, stepped * multi[i] / (step[i] * AIM * AIM));
        }
        double factor = Math.ceil(needed / ((double) basePerPeriod * periods) - 1e-9);
        return cap(Math.min(factor, MOST), basePerPeriod, periods, maxRecord, minInterval, d);
    }

    /** A channel's noise variance on a range: the input noise and the range's quantization. */
    private record Noise(double floorVariance, double stepPerRange) {
        static Noise of(Trace probe, double minRange, double declared) {
            // the smallest gap between sample values: unlike Quantization.codeStep, which refuses a
            // record with more distinct values than half its samples, this holds for a probe of one
            // short period too (on data without a grid it is tiny and adds nothing)
            double[] v = probe.volts().clone();
            java.util.Arrays.sort(v);
            double step = Double.POSITIVE_INFINITY;
            for (int k = 1; k < v.length; k++) {
                double dv = v[k] - v[k - 1];
                if (dv > 0) {
                    step = Math.min(step, dv);
                }
            }
            double perRange = Double.isFinite(step) ? step / probe.rangeVolt() : 0;
            double floor = declared > 0 ? declared : perRange * minRange / Math.sqrt(12);
            if (!(floor > 0) && !(perRange > 0)) {
                // neither known: noise proportional to the range
                return new Noise(0, 1);
            }
            return new Noise(floor * floor, perRange);
        }

        double variance(double range) {
            double q = stepPerRange * range;
            return floorVariance + q * q / 12;
        }
    }

    private static int cap(double factor, int basePerPeriod, int periods, int maxRecord, double minInterval,
                           MultisineDesign.Design d) {
        // a margin for the interval the digitizer grants (a shorter one takes more samples for the same record)
        long byRecord = (long) (0.98 * Math.min(maxRecord, MOST_SAMPLES)) / ((long) basePerPeriod * periods);
        long byRate = (long) Math.floor(1 / (d.baseHz() * minInterval) / basePerPeriod);
        long most = Math.max(1, Math.min(byRecord, byRate));
        return (int) (basePerPeriod * Math.max(1, Math.min(most, (long) Math.min(factor, Integer.MAX_VALUE))));
    }
}
