package org.lrbench.analysis;

/**
 * The sense-resistor and part phasors at one frequency from the two channels' samples as the
 * digitizer gave them: each channel's voltage times its probe attenuation; with low-side wiring
 * the part's voltage is channel 2 minus the sense voltage. Each channel's fitted sine is corrected
 * for its converter's quantization ({@link Quantization}) on the channel's own samples, where the
 * code grid is visible, and the correction carried into the difference for low-side wiring.
 */
public final class FixturePhasors {

    private FixturePhasors() {
    }

    /** Both fits, corrected, and each channel's quantization correction. */
    public record Result(SineFitResult sense, SineFitResult part, Quantization.Correction senseCorrection,
                         Quantization.Correction partCorrection) {
    }

    public static Result of(double[] channel1, double[] channel2, double intervalSecond, double frequencyHz,
                            double attenuation1, double attenuation2, boolean lowSide) {
        // the quantizers see the channels' own samples: fit and correct them as they came
        SineFitResult raw1 = SineFit.fit(channel1, intervalSecond, frequencyHz);
        SineFitResult raw2 = SineFit.fit(channel2, intervalSecond, frequencyHz);
        Quantization.Correction q1 = Quantization.of(channel1, intervalSecond, raw1);
        Quantization.Correction q2 = Quantization.of(channel2, intervalSecond, raw2);
        SineFitResult sense = times(q1.apply(raw1), attenuation1);
        SineFitResult part2 = times(q2.apply(raw2), attenuation2);
        if (!lowSide) {
            return new Result(sense, part2, q1, q2);
        }
        // low side: channel 2 sees the part and the sense resistor, V2 = a2 ch2 - V1; the fit of the
        // difference gives the residual, the corrected channels the sine and (independent) scatters
        double[] part = new double[channel2.length];
        for (int i = 0; i < part.length; i++) {
            part[i] = channel2[i] * attenuation2 - channel1[i] * attenuation1;
        }
        SineFitResult difference = SineFit.fit(part, intervalSecond, frequencyHz);
        boolean bootstrapped = !Double.isNaN(q1.varianceCosine()) && !Double.isNaN(q2.varianceCosine());
        return new Result(sense, new SineFitResult(frequencyHz, part2.cosineCoefficient() - sense.cosineCoefficient(),
                part2.sineCoefficient() - sense.sineCoefficient(), difference.offset(), difference.residualRms(),
                bootstrapped ? part2.varianceCosine() + sense.varianceCosine() : difference.varianceCosine(),
                bootstrapped ? part2.varianceSine() + sense.varianceSine() : difference.varianceSine(),
                bootstrapped ? part2.covarianceCosineSine() + sense.covarianceCosineSine() : difference.covarianceCosineSine(),
                difference.samples()), q1, q2);
    }

    /** A raw-channel fit at the fixture: everything times the probe attenuation, the covariance times its square. */
    private static SineFitResult times(SineFitResult raw, double attenuation) {
        if (attenuation == 1) {
            return raw;
        }
        double k2 = attenuation * attenuation;
        return new SineFitResult(raw.frequencyHz(), raw.cosineCoefficient() * attenuation,
                raw.sineCoefficient() * attenuation, raw.offset() * attenuation, raw.residualRms() * attenuation,
                raw.varianceCosine() * k2, raw.varianceSine() * k2, raw.covarianceCosineSine() * k2, raw.samples());
    }
}
