package org.lrbench.run;

import org.lrbench.instrument.Generator;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Keeps the generator output off on every way out of a measurement: at the end, on an error, and
 * when the JVM is asked to stop (Ctrl-C, SIGTERM) through a shutdown hook. Use with
 * try-with-resources around everything that may switch the output on.
 */
public final class OutputGuard implements AutoCloseable {
    private static final Logger LOG = LoggerFactory.getLogger(OutputGuard.class);
    private final Generator generator;
    private final Thread hook;
    private String failure;

    public OutputGuard(Generator generator) {
        this.generator = generator;
        this.hook = new Thread(this::switchOff, "lrbench-output-off");
        Runtime.getRuntime().addShutdownHook(hook);
    }

    /** Switches the output off; remembers, never throws, a failure to do so. */
    public synchronized void switchOff() {
        try {
            generator.outputOff();
            failure = null;
        } catch (RuntimeException e) {
            failure = "could not switch the generator output off: " + e.getMessage()
                    + " -- switch it off at the instrument";
            // the shutdown hook has no caller to tell: the log (on stderr by default) does
            LOG.error(failure);
        }
    }

    /** Why the last attempt to switch off failed, or null when it worked. */
    public synchronized String failure() {
        return failure;
    }

    @Override
    public void close() {
        switchOff();
        try {
            Runtime.getRuntime().removeShutdownHook(hook);
        } catch (IllegalStateException shuttingDown) {
            // the hook is running or has run; it switches the output off itself
        }
    }
}
