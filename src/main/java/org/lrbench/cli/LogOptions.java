package org.lrbench.cli;

import ch.qos.logback.classic.Level;
import ch.qos.logback.classic.Logger;
import ch.qos.logback.classic.LoggerContext;
import ch.qos.logback.classic.encoder.PatternLayoutEncoder;
import ch.qos.logback.core.FileAppender;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.slf4j.LoggerFactory;
import picocli.CommandLine.Option;

/**
 * The logging options of commands that talk to instruments: {@code --io-log FILE} records every
 * message sent to and received from each instrument, timestamped (binary blocks as their length
 * and first bytes), and {@code --verbose} shows lrbench's own diagnostics on the error stream.
 */
final class LogOptions {
    static final String IO_LOGGER = "org.lrbench.io";

    @Option(names = "--io-log", paramLabel = "FILE",
            description = "record every message to and from each instrument, timestamped, in FILE (appended)")
    Path ioLog;

    @Option(names = "--verbose", description = "show lrbench's diagnostics (instruments opened, ranging) on stderr")
    boolean verbose;

    /** Sets the logging up as the options ask; called first by each command that has them. */
    void apply() {
        if (!(LoggerFactory.getILoggerFactory() instanceof LoggerContext context)) {
            return;
        }
        if (verbose) {
            context.getLogger("org.lrbench").setLevel(Level.DEBUG);
        }
        if (ioLog == null) {
            return;
        }
        Path parent = ioLog.toAbsolutePath().getParent();
        try {
            Files.createDirectories(parent);
        } catch (IOException e) {
            throw new BadInputException("--io-log " + ioLog + ": cannot create " + parent + ": " + e.getMessage());
        }
        if (Files.isDirectory(ioLog) || (Files.exists(ioLog) && !Files.isWritable(ioLog))) {
            throw new BadInputException("--io-log " + ioLog + ": not a writable file");
        }
        PatternLayoutEncoder encoder = new PatternLayoutEncoder();
        encoder.setContext(context);
        encoder.setPattern("%d{yyyy-MM-dd'T'HH:mm:ss.SSSXXX,UTC} %msg%n");
        encoder.start();
        FileAppender<ch.qos.logback.classic.spi.ILoggingEvent> file = new FileAppender<>();
        file.setContext(context);
        file.setName("io-log");
        file.setFile(ioLog.toString());
        file.setAppend(true);
        file.setImmediateFlush(true);
        file.setEncoder(encoder);
        file.start();
        Logger io = context.getLogger(IO_LOGGER);
        io.detachAndStopAllAppenders();
        io.addAppender(file);
        io.setLevel(Level.DEBUG);
        io.setAdditive(false);
    }
}
