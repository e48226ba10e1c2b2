package org.lrbench;

import java.nio.file.Path;
import java.time.Duration;
import org.lrbench.driver.DriverFile;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.ScpiDigitizer;
import org.lrbench.driver.ScpiGenerator;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimSettings;
import org.lrbench.transport.inproc.InProcessTransport;
import org.lrbench.yaml.Problems;

/** A simulated bench reached through the real drivers and SCPI sessions, for tests. */
public final class TestBench {
    public final SimBench sim;
    public final ScpiGenerator generator;
    public final ScpiDigitizer digitizer;
    public final ScpiSession generatorSession;
    public final ScpiSession digitizerSession;

    public TestBench(SimSettings settings, double senseOhm, PartModel part, Path digitizerDriver) throws Exception {
        this(new SimBench(settings, senseOhm, part), digitizerDriver);
    }

    /** The generator and digitizer of a simulated bench built elsewhere (a tray behind its switch). */
    public TestBench(SimBench bench, Path digitizerDriver) throws Exception {
        sim = bench;
        DriverFile source = DriverLoader.read(home().resolve("drivers/generic-source.yaml"), "generic-source",
                DriverKind.SOURCE, new Problems("generic-source.yaml"));
        DriverFile dig = DriverLoader.read(digitizerDriver, "digitizer", DriverKind.DIGITIZER,
                new Problems(digitizerDriver.toString()));
        generatorSession = new ScpiSession("generator", new InProcessTransport("sim://generator", sim.generator()),
                Duration.ofSeconds(1));
        digitizerSession = new ScpiSession("digitizer", new InProcessTransport("sim://digitizer", sim.digitizer()),
                Duration.ofSeconds(1));
        generator = new ScpiGenerator(generatorSession, source);
        digitizer = new ScpiDigitizer(digitizerSession, dig);
    }

    public static Path home() {
        return Path.of(System.getProperty("lrbench.home", "."));
    }

    public static Path genericDigitizer() {
        return home().resolve("drivers/generic-digitizer.yaml");
    }

    public static Path real64Digitizer() {
        return home().resolve("src/test/resources/drivers/real64-digitizer.yaml");
    }
}
