package org.lrbench.cli;

import java.io.PrintStream;
import java.lang.reflect.Method;
import java.lang.reflect.Proxy;
import java.util.ArrayList;
import java.util.List;
import org.lrbench.lot.LotStop;

/**
 * SIGTERM and SIGINT (Ctrl-C) during a lot run: the run is asked to stop ({@link LotStop}); the
 * part in progress is dropped, a commit in progress completes, the output goes off, and the
 * process ends with exit code 5 and a word on how to resume. When the run waits for the operator
 * nothing is in progress and the process ends at once; otherwise the run ends at the next sweep
 * point, and if it has not within {@link #GRACE_MS} (an instrument that does not answer, say) the
 * process ends anyway, its shutdown hooks switching the output off. The JDK's signal interface
 * ({@code sun.misc.Signal}, module jdk.unsupported) is reached by reflection; where it is missing
 * the JVM's default handling stays (exit 130/143, the output still switched off by the hooks).
 */
final class StopSignals implements AutoCloseable {
    static final long GRACE_MS = 30_000;
    private final List<Runnable> restore = new ArrayList<>();

    private StopSignals() {
    }

    static StopSignals install(LotStop stop, String lot, PrintStream err) {
        StopSignals s = new StopSignals();
        for (String name : List.of("TERM", "INT")) {
            s.handle(name, () -> onSignal(stop, lot, err));
        }
        return s;
    }

    /** The line the operator reads when a stop ends a lot run. */
    static String stoppedMessage(String lot, LotStop stop) {
        return "lot " + lot + " stopped after " + stop.progress() + "; run the same command to resume";
    }

    private static void onSignal(LotStop stop, String lot, PrintStream err) {
        if (stop.requested()) {
            return;
        }
        if (stop.request()) {
            err.println();
            err.println("lrbench: " + stoppedMessage(lot, stop));
            err.flush();
            System.exit(ExitCodes.LOT_OPEN);
        }
        err.println();
        err.println("lrbench: stopping: the part in progress is dropped and the generator output switched off");
        err.flush();
        Thread watchdog = new Thread(() -> {
            try {
                Thread.sleep(GRACE_MS);
            } catch (InterruptedException e) {
                return;
            }
            err.println("lrbench: the run did not end within " + GRACE_MS / 1000 + " s; ending it now. "
                    + stoppedMessage(lot, stop));
            System.exit(ExitCodes.LOT_OPEN);
        }, "lrbench-stop-watchdog");
        watchdog.setDaemon(true);
        watchdog.start();
    }

    private void handle(String name, Runnable action) {
        try {
            Class<?> signal = Class.forName("sun.misc.Signal");
            Class<?> handler = Class.forName("sun.misc.SignalHandler");
            Object sig = signal.getConstructor(String.class).newInstance(name);
            Object ours = Proxy.newProxyInstance(handler.getClassLoader(), new Class<?>[] {handler}, (proxy, m, args) -> {
                if (m.getName().equals("handle")) {
                    action.run();
                    return null;
                }
                return switch (m.getName()) {
                    case "hashCode" -> System.identityHashCode(proxy);
                    case "equals" -> proxy == args[0];
                    default -> "lrbench stop handler";
                };
            });
            Method install = signal.getMethod("handle", signal, handler);
            Object previous = install.invoke(null, sig, ours);
            restore.add(() -> {
                try {
                    install.invoke(null, sig, previous);
                } catch (ReflectiveOperationException ignored) {
                    // the process is ending
                }
            });
        } catch (ReflectiveOperationException | RuntimeException | LinkageError unavailable) {
            // no signal interface here (or the signal is reserved): the JVM's default handling stays
        }
    }

    @Override
    public void close() {
        restore.forEach(Runnable::run);
    }
}
