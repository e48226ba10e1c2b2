package org.lrbench.analysis;

/**
 * The frequency a record of a sine shows on the digitizer's time base. A generator without the
 * digitizer's reference clock puts out its setting times (1 + e), e a few ppm up to its
 * specification; over a record of N cycles the sine then walks 2 pi N e radians against one fitted
 * at the setting (0.13 rad over 400 cycles at 50 ppm), which lowers the fitted amplitude and leaves a
 * residual that the fit counts as noise. Fitted instead: the four-parameter fit of IEEE Std 1057
 * (4.1.3.2) on the channel whose sine stands higher over its residual, started at the setting. The
 * setting is kept where that fit fails or lands more than {@value #FARTHEST} (relative) from it: no
 * bench's time bases differ by that much, so it found something else.
 */
public final class RecordFrequency {

    /** The farthest a fitted frequency may be from the setting, relative. */
    static final double FARTHEST = 1e-3;

    private RecordFrequency() {
    }

    public static double of(double[] channel1, double[] channel2, double intervalSecond, double settingHz) {
        SineFitResult a = SineFit.fit(channel1, intervalSecond, settingHz);
        SineFitResult b = SineFit.fit(channel2, intervalSecond, settingHz);
        double[] clearer = snr(a) >= snr(b) ? channel1 : channel2;
        try {
            double f = FourParameterSineFit.fit(clearer, intervalSecond, settingHz).frequencyHz();
            return Double.isFinite(f) && Math.abs(f / settingHz - 1) <= FARTHEST ? f : settingHz;
        } catch (IllegalArgumentException e) {
            return settingHz;
        }
    }

    private static double snr(SineFitResult r) {
        return r.residualRms() > 0 ? r.amplitude() / r.residualRms() : Double.POSITIVE_INFINITY;
    }
}
