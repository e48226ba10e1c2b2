package org.lrbench.analysis;

import java.util.Arrays;
import java.util.List;
import java.util.Locale;

/**
 * A periodic multisine for a sweep: every requested frequency moved to the nearest bin of a common
 * period (a whole multiple of the base frequency {@code 1 / period}), within a relative tolerance,
 * with equal amplitudes and Schroeder's phases {@code phi_i = -pi i (i - 1) / K} for a low crest
 * factor (M. R. Schroeder, "Synthesis of low-peak-factor signals and binary sequences with low
 * autocorrelation", IEEE Trans. Information Theory IT-16, 1970, pp. 85-89), and one period of
 * samples for a generator's arbitrary-waveform memory, normalised to a peak of 1.
 */
public final class MultisineDesign {
    /** Fewest samples of the waveform per period of its highest tone. */
    static final int SAMPLES_PER_TOP_PERIOD = 8;
    /** Fewest samples in the waveform memory. */
    static final int MIN_SAMPLES = 1024;
    /** Fewest samples a capture takes per cycle of the highest tone (its third harmonic below half the rate). */
    public static final int MIN_CAPTURE_SAMPLES_PER_TOP_CYCLE = 10;

    private MultisineDesign() {
    }

    /**
     * The design: base frequency, each tone's bin and frequency, its phase, the waveform (peak 1),
     * the playback rate that repeats it at the base frequency, the crest factor (peak over RMS) and
     * each tone's peak as a fraction of the waveform's.
     */
    public record Design(double baseHz, int[] bins, double[] frequenciesHz, double[] phases, double[] samples,
                         double playbackRateHz, double crestFactor, double toneAmplitude) {
    }

    /**
     * Designs the multisine for {@code requestedHz} (distinct, positive): the largest base frequency
     * that puts every tone on its own bin within {@code tolerance} (relative) of its request.
     *
     * @param maxSamples the longest waveform the generator takes
     * @throws IllegalArgumentException when no base frequency does, or the waveform would be too long
     */
    public static Design of(List<Double> requestedHz, double tolerance, int maxSamples) {
        double[] f = requestedHz.stream().mapToDouble(Double::doubleValue).toArray();
        double base = base(f, tolerance);
        int k = f.length;
        int[] bins = new int[k];
        double[] snapped = new double[k];
        int top = 0;
        for (int i = 0; i < k; i++) {
            bins[i] = (int) Math.rint(f[i] / base);
            snapped[i] = bins[i] * base;
            top = Math.max(top, bins[i]);
        }
        int n = MIN_SAMPLES;
        while (n < SAMPLES_PER_TOP_PERIOD * top) {
            n *= 2;
        }
        if (n > maxSamples) {
            throw new IllegalArgumentException(String.format(Locale.ROOT, "a multisine from %.6g Hz to %.6g Hz on bins"
                    + " of %.6g Hz needs %d waveform samples; the generator takes %d (widen the tolerance or narrow"
                    + " the sweep)", Arrays.stream(f).min().orElse(0), Arrays.stream(f).max().orElse(0), base, n, maxSamples));
        }
        double[] phases = new double[k];
        for (int i = 0; i < k; i++) {
            int index = i + 1;
            phases[i] = -Math.PI * index * (index - 1) / k;
        }
        double[] samples = new double[n];
        double peak = 0;
        double power = 0;
        for (int s = 0; s < n; s++) {
            double v = 0;
            for (int i = 0; i < k; i++) {
                v += Math.cos(2 * Math.PI * ((long) bins[i] * s % n) / n + phases[i]);
            }
            samples[s] = v;
            peak = Math.max(peak, Math.abs(v));
            power += v * v;
        }
        for (int s = 0; s < n; s++) {
            samples[s] /= peak;
        }
        double crest = peak / Math.sqrt(power / n);
        return new Design(base, bins, snapped, phases, samples, n * base, crest, 1 / peak);
    }

    /** Whole common periods that hold {@code cycles} cycles of the lowest tone (at least one). */
    public static int periods(Design d, int cycles) {
        double lowest = Arrays.stream(d.frequenciesHz()).min().orElseThrow();
        return Math.max(1, (int) Math.ceil(cycles * d.baseHz() / lowest - 1e-9));
    }

    /**
     * Samples per common period for a capture with {@code perLowestCycle} samples per cycle of the
     * lowest tone, and at least {@value #MIN_CAPTURE_SAMPLES_PER_TOP_CYCLE} per cycle of the highest.
     */
    public static int captureSamplesPerPeriod(Design d, int perLowestCycle) {
        int low = Arrays.stream(d.bins()).min().orElseThrow();
        int top = Arrays.stream(d.bins()).max().orElseThrow();
        return Math.max(perLowestCycle * low, MIN_CAPTURE_SAMPLES_PER_TOP_CYCLE * top);
    }

    /**
     * The largest base frequency with every tone on a distinct, non-zero bin within the tolerance:
     * candidates are each request divided by a whole number (one tone then lies exactly on a bin),
     * tried from the largest down.
     */
    static double base(double[] f, double tolerance) {
        if (f.length == 0) {
            throw new IllegalArgumentException("a multisine needs at least one frequency");
        }
        double lowest = Arrays.stream(f).min().orElseThrow();
        // a base below tolerance * 2 * lowest always works; no need to look further down
        double floor = lowest * tolerance;
        double best = Double.NaN;
        for (double fi : f) {
            for (int m = 1; fi / m >= floor; m++) {
                double candidate = fi / m;
                if (candidate <= best) {
                    break;
                }
                if (fits(f, candidate, tolerance)) {
                    best = candidate;
                    break;
                }
            }
        }
        if (Double.isNaN(best)) {
            throw new IllegalArgumentException("no common period puts these frequencies within " + 100 * tolerance
                    + " % of their bins");
        }
        return best;
    }

    private static boolean fits(double[] f, double base, double tolerance) {
        int[] bins = new int[f.length];
        for (int i = 0; i < f.length; i++) {
            long bin = Math.round(f[i] / base);
            if (bin < 1 || Math.abs(bin * base - f[i]) > tolerance * f[i] || bin > Integer.MAX_VALUE / 16) {
                return false;
            }
            bins[i] = (int) bin;
        }
        int[] sorted = bins.clone();
        Arrays.sort(sorted);
        for (int i = 1; i < sorted.length; i++) {
            if (sorted[i] == sorted[i - 1]) {
                return false;
            }
        }
        return true;
    }

    /**
     * The frequency of the common period of tones that each lie on one of its bins (as a design
     * places them, bin times base): the largest base of which every tone is a whole multiple, found as
     * the lowest tone over the smallest whole divisor that makes it so (within a millionth of a bin).
     * Tones on no common grid of up to 2^24 bins below the lowest are refused.
     */
    public static double commonBase(double[] tonesHz) {
        double lowest = Arrays.stream(tonesHz).min().orElseThrow();
        for (int k = 1; k <= 1 << 24; k++) {
            double base = lowest / k;
            boolean all = true;
            for (double f : tonesHz) {
                double bin = f / base;
                if (Math.abs(bin - Math.rint(bin)) > 1e-6) {
                    all = false;
                    break;
                }
            }
            if (all) {
                return base;
            }
        }
        throw new IllegalArgumentException("the tones " + Arrays.toString(tonesHz) + " lie on no common period's bins");
    }
}
