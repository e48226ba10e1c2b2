package org.lrbench.benchmark;

import java.io.PrintStream;
import java.util.Arrays;
import java.util.Locale;
import java.util.Random;
import org.lrbench.analysis.FourParameterSineFit;
import org.lrbench.analysis.SineFit;

/**
 * Throughput of the sine fits on 1 M and 10 M samples, side by side with a plain pass that sums the
 * same array (the least work any fit must do), measured in the same run.
 */
public final class FitBenchmark {

    private FitBenchmark() {
    }

    public static void run(PrintStream out, int repeats) {
        out.printf(Locale.ROOT, "sine-fit throughput, median of %d runs each, after warm-up%n", repeats);
        for (int n : new int[] {1_000_000, 10_000_000}) {
            double[] y = signal(n);
            double dt = 1e-6;
            double f = 1234.5;
            // warm-up so the JIT has compiled every path
            for (int i = 0; i < 3; i++) {
                sum(y);
                SineFit.fit(y, dt, f);
            }
            FourParameterSineFit.fit(y, dt, f * 1.0001);
            double[] plain = new double[repeats];
            double[] three = new double[repeats];
            double[] four = new double[repeats];
            double sink = 0;
            int iterations = 0;
            for (int r = 0; r < repeats; r++) {
                long t0 = System.nanoTime();
                sink += sum(y);
                long t1 = System.nanoTime();
                sink += SineFit.fit(y, dt, f).amplitude();
                long t2 = System.nanoTime();
                FourParameterSineFit.Result four4 = FourParameterSineFit.fit(y, dt, f * 1.0001);
                long t3 = System.nanoTime();
                sink += four4.frequencyHz();
                iterations = four4.iterations();
                plain[r] = n / ((t1 - t0) / 1e3);
                three[r] = n / ((t2 - t1) / 1e3);
                four[r] = n / ((t3 - t2) / 1e3);
            }
            double p = median(plain);
            double t = median(three);
            double q = median(four);
            out.printf(Locale.ROOT, "  %,d samples: plain sum %.0f Msamples/s, three-parameter fit %.0f Msamples/s"
                    + " (%.2fx the plain pass's time; goal <= 3x), four-parameter fit %.0f Msamples/s (%d iterations"
                    + " from 0.01 %% off, %.1fx)%n", n, p, t, p / t, q, iterations, p / q);
            if (sink == 42) {
                out.println();
            }
        }
    }

    static double sum(double[] y) {
        double s = 0;
        for (double v : y) {
            s += v;
        }
        return s;
    }

    private static double[] signal(int n) {
        Random rnd = new Random(1);
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            y[i] = 0.8 * Math.cos(2 * Math.PI * 1234.5 * i * 1e-6 + 0.4) + 0.01 + 1e-3 * rnd.nextGaussian();
        }
        return y;
    }

    private static double median(double[] v) {
        double[] c = v.clone();
        Arrays.sort(c);
        return c[c.length / 2];
    }
}
