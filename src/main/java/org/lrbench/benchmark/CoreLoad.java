package org.lrbench.benchmark;

import java.io.IOException;
import java.util.concurrent.TimeUnit;

/**
 * A second process that keeps one core busy while a benchmark measures, as another program on a
 * lab's computer would: it computes without pause until it is stopped, its parent ends, or an hour
 * has passed.
 */
public final class CoreLoad implements AutoCloseable {
    private static final long LONGEST_NANOS = TimeUnit.HOURS.toNanos(1);
    private static volatile double sink;
    private final Process process;

    private CoreLoad(Process process) {
        this.process = process;
    }

    /** Starts the loading process (the same Java, the same class path). */
    public static CoreLoad start() throws IOException {
        String java = ProcessHandle.current().info().command().orElse("java");
        Process p = new ProcessBuilder(java, "-Xmx32m", "-cp", System.getProperty("java.class.path"),
                CoreLoad.class.getName(), Long.toString(ProcessHandle.current().pid()))
                .redirectErrorStream(true).redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
        return new CoreLoad(p);
    }

    /** Whether the loading process is running. */
    public boolean running() {
        return process.isAlive();
    }

    @Override
    public void close() {
        process.destroy();
        try {
            if (!process.waitFor(5, TimeUnit.SECONDS)) {
                process.destroyForcibly();
            }
        } catch (InterruptedException e) {
            process.destroyForcibly();
            Thread.currentThread().interrupt();
        }
    }

    /** Spins; the argument is the parent's process id, whose end ends the load. */
    public static void main(String[] args) {
        long parent = Long.parseLong(args[0]);
        long start = System.nanoTime();
        double x = 1;
        while (System.nanoTime() - start < LONGEST_NANOS) {
            for (int i = 0; i < 10_000_000; i++) {
                x = x * 1.0000001 + 1e-9;
            }
            sink = x;
            if (ProcessHandle.of(parent).map(ProcessHandle::isAlive).orElse(false) == Boolean.FALSE) {
                return;
            }
        }
    }
}
