package org.lrbench.calibration;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.lrbench.results.ResultFiles;

/**
 * Keeps a bench's corrections as JSON under {@code DIR/BENCH/}: {@code channel-match.json} and
 * {@code fixture.json}, each with the instant it was measured. Written whole or not at all.
 */
public final class CalibrationStore {
    private static final ObjectMapper JSON = new ObjectMapper()
            .setPropertyNamingStrategy(PropertyNamingStrategies.SNAKE_CASE);

    private final Path dir;

    public CalibrationStore(Path root, String bench) {
        this.dir = root.resolve(bench);
    }

    public Path channelFile() {
        return dir.resolve("channel-match.json");
    }

    public Path fixtureFile() {
        return dir.resolve("fixture.json");
    }

    public Path senseFile() {
        return dir.resolve("sense-resistor.json");
    }

    public void save(SenseTrace s) throws IOException {
        ResultFiles.writeJson(senseFile(), s);
    }

    public void save(ChannelMatch m) throws IOException {
        ResultFiles.writeJson(channelFile(), m);
    }

    public void save(FixtureCompensation f) throws IOException {
        ResultFiles.writeJson(fixtureFile(), f);
    }

    /** The stored corrections; a missing file means that correction is not in force. */
    public Calibration load() throws IOException {
        ChannelMatch c = Files.isRegularFile(channelFile()) ? read(channelFile(), ChannelMatch.class) : null;
        FixtureCompensation f = Files.isRegularFile(fixtureFile()) ? read(fixtureFile(), FixtureCompensation.class) : null;
        SenseTrace s = Files.isRegularFile(senseFile()) ? read(senseFile(), SenseTrace.class) : null;
        return new Calibration(c, f).withSense(s);
    }

    private static <T> T read(Path file, Class<T> type) throws IOException {
        try {
            return JSON.readValue(file.toFile(), type);
        } catch (IOException e) {
            throw new IOException(file + ": not a readable calibration file (" + e.getMessage()
                    + "); measure it again or remove it", e);
        }
    }
}
