package org.lrbench.driver;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.lrbench.TestBench;
import org.lrbench.instrument.Trace;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.instrument.Waveform;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimSettings;

/** The same simulated record fetched in every trace format gives the same volts. */
class TraceFormatTests {

    @ParameterizedTest(name = "{0}")
    @CsvSource({
        "int8, 'INTeger,8', NORMal",
        "int16-big, 'INTeger,16', NORMal",
        "int16-little, 'INTeger,16', SWAPped",
        "real32-big, 'REAL,32', NORMal",
        "real32-little, 'REAL,32', SWAPped",
        "real64-big, 'REAL,64', NORMal",
        "ascii, 'ASCii', NORMal"})
    void everyFormatCarriesTheSameRecord(String format, String scpiFormat, String order, @TempDir Path dir)
            throws Exception {
        String text = Files.readString(TestBench.genericDigitizer())
                .replace("trace_format: int8", "trace_format: " + format)
                // text traces come one per message: the two channels' blocks together are for binary formats
                .replaceAll("(?m)^fetch_together: yes.*$", format.startsWith("ascii") ? "fetch_together: no" : "fetch_together: yes")
                .replace(":FORMat:DATA INTeger,8;:FORMat:BORDer NORMal", ":FORMat:DATA " + scpiFormat + ";:FORMat:BORDer " + order);
        Path driver = dir.resolve("d.yaml");
        Files.writeString(driver, text);
        // 8-bit quantization: every format can carry the codes exactly (REAL32 to float precision)
        TestBench b = new TestBench(new SimSettings(50, 1e-3, 8, 5), 100, new PartModel(1e-3, 2.3, 0), driver);
        b.generator.prepare();
        b.digitizer.prepare();
        b.generator.setWaveform(Waveform.SINE);
        b.generator.setFrequency(1000);
        b.generator.setAmplitude(3);
        b.generator.outputOn();
        b.digitizer.setTiming(1e-6, 5000);
        b.digitizer.setTrigger(TriggerSource.CHANNEL1, 0, true);
        double range = b.digitizer.setRange(1, 6.0);
        b.digitizer.setRange(2, 0.5);
        b.digitizer.acquire();
        Trace t = b.digitizer.fetch(1);
        assertThat(t.length()).isEqualTo(5000);
        double lsb = range / 256;
        for (double v : t.volts()) {
            // every sample is a whole number of 8-bit steps of the range
            assertThat(v / lsb).isCloseTo(Math.rint(v / lsb), within(1e-4));
        }
        assertThat(t.peakToPeak()).isBetween(0.5 * range, 0.8 * range);
        // both channels in one message (binary formats: two blocks separated by ';', IEEE 488.2 response
        // message units) carry the same samples as one fetch per channel
        long before = b.digitizerSession.queries();
        Trace[] both = b.digitizer.fetchBoth();
        assertThat(both[0].volts()).containsExactly(t.volts());
        assertThat(both[1].volts()).containsExactly(b.digitizer.fetch(2).volts());
        assertThat(b.digitizerSession.queries() - before).isEqualTo(format.startsWith("ascii") ? 3 : 2);
    }
}
