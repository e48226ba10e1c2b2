package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;

import java.lang.reflect.InvocationHandler;
import java.lang.reflect.Proxy;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Timing;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimSettings;

/**
 * A digitizer whose sample interval is its time window over its record length rounded up to a 1-2-5
 * step, with record lengths from a list (rounded up): asked for the interval a plan needs, it grants the
 * next coarser step, and only a request below that step gives a fine enough one. lrbench must find it
 * instead of taking the first coarse grant for the instrument's limit.
 */
class TimeBaseTests {

    /** The next 1-2-5 step at or above {@code x} (common practice, no source: the usual oscilloscope sequence). */
    static double up125(double x) {
        double decade = Math.pow(10, Math.floor(Math.log10(x) + 1e-12));
        for (double m : new double[] {1, 2, 5, 10}) {
            if (m * decade >= x * (1 - 1e-9)) {
                return m * decade;
            }
        }
        return 10 * decade;
    }

    static final List<Integer> LENGTHS = List.of(1000, 2000, 5000, 10_000, 20_000, 50_000, 100_000);

    /** Wraps a digitizer so that setTiming behaves as the instrument above, counting the requests. */
    static Digitizer windowed(Digitizer inner, int[] requests) {
        InvocationHandler h = (proxy, method, args) -> {
            if (method.getName().equals("setTiming")) {
                requests[0]++;
                double interval = (double) args[0];
                int wanted = (int) args[1];
                int length = LENGTHS.stream().filter(n -> n >= wanted).findFirst().orElse(LENGTHS.get(LENGTHS.size() - 1));
                double window = interval * length;
                return inner.setTiming(up125(window / length), length);
            }
            if (method.isDefault()) {
                return InvocationHandler.invokeDefault(proxy, method, args);
            }
            return method.invoke(inner, args);
        };
        return (Digitizer) Proxy.newProxyInstance(Digitizer.class.getClassLoader(), new Class<?>[] {Digitizer.class}, h);
    }

    @Test
    void anIntervalRoundedUpToItsStepsIsAskedBelowTheStep() throws Exception {
        TestBench b = new TestBench(SimSettings.defaults().withSeed(3), 100, new PartModel(1e-3, 2.3, 0),
                TestBench.genericDigitizer());
        Plan plan = PlanLoader.load(TestBench.home().resolve("plans/qfd-ind-1m0.yaml"), 5.0);
        int[] requests = new int[1];
        Digitizer d = windowed(b.digitizer, requests);
        SweepRunner.Measurement m = new SweepRunner(b.generator, d, BenchClock.NONE).run(plan, SweepListener.NONE);
        // 200 samples per cycle at 200 Hz needs 25 us or finer: 1-2-5 steps give 20 us, never 50 us
        for (PointResult p : m.points()) {
            double perCycle = 1 / (p.impedance().frequencyHz() * p.sampleIntervalSecond());
            assertThat(perCycle).as("at %s Hz", p.impedance().frequencyHz()).isGreaterThanOrEqualTo(200 * (1 - 1e-9));
        }
        assertThat(requests[0]).isPositive();
    }
}
