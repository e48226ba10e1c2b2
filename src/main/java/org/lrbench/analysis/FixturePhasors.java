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
        double[] sense = new double[channel1.length];
        double[] part = new double[channel2.length];
        for (int i = 0; i < sense.length; i++) {
            sense[i] = channel1[i] * attenuation1;
            part[i] = channel2[i] * attenuation2 - (lowSide ? sense[i] : 0);
        }
        SineFitResult senseFit = SineFit.fit(sense, intervalSecond, frequencyHz);
        SineFitResult partFit = SineFit.fit(part, intervalSecond, frequencyHz);
        // the quantizers see the channels' own samples: fit them as they came
        Quantization.Correction q1 = Quantization.of(channel1, intervalSecond,
                attenuation1 == 1 ? senseFit : SineFit.fit(channel1, intervalSecond, frequencyHz));
        SineFitResult raw2 = lowSide || attenuation2 != 1 ? SineFit.fit(channel2, intervalSecond, frequencyHz) : partFit;
        Quantization.Correction q2 = Quantization.of(channel2, intervalSecond, raw2);
        SineFitResult senseCorrected = senseFit.scaled(1 / q1.gain());
        SineFitResult partCorrected = lowSide
                // V2' = a2 ch2 / g2 - V1 / g1 = V2 + a2 ch2 (1/g2 - 1) - V1 (1/g1 - 1)
                ? partFit.plus(raw2, attenuation2 * (1 / q2.gain() - 1)).plus(senseFit, -(1 / q1.gain() - 1))
                : partFit.scaled(1 / q2.gain());
        return new Result(senseCorrected, partCorrected, q1, q2);
    }
}
