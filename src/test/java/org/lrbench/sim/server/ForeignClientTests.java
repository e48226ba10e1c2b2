package org.lrbench.sim.server;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimSettings;

/**
 * The simulated bench's SCPI checked by code lrbench did not write: PyVISA with its pure-Python
 * backend (Debian's python3-pyvisa-py) reads the identities, sets a sine, captures both channels as
 * IEEE 488.2 blocks, fits them with NumPy's least squares and reads the error queue. Its ratio of the
 * part's voltage to the sense resistor's must be the series circuit's Z / R_s (circuit theory, from
 * memory), and an unknown header must give SCPI-1999's -113 "Undefined header" then "0" (no error).
 */
class ForeignClientTests {

    private static final String PYTHON = "/usr/bin/python3";

    @Test
    void pyvisaMeasuresTheSimulatedBenchAsAnyInstrument(@TempDir Path dir) throws Exception {
        Assumptions.assumeTrue(Files.isExecutable(Path.of(PYTHON)) && new ProcessBuilder(PYTHON, "-c",
                "import pyvisa, pyvisa_py, numpy").start().waitFor() == 0,
                "python3-pyvisa-py is not installed (.ci/run installs it)");
        Path script = dir.resolve("visa_client.py");
        try (var in = ForeignClientTests.class.getResourceAsStream("visa_client.py")) {
            Files.write(script, in.readAllBytes());
        }
        double sense = 100;
        PartModel part = new PartModel(1e-3, 2.3, 0);
        SimBench bench = new SimBench(SimSettings.defaults().withSeed(5), sense, part);
        try (SimServer server = new SimServer(bench, 0)) {
            Process p = new ProcessBuilder(PYTHON, script.toString(), Integer.toString(server.generatorPort()),
                    Integer.toString(server.digitizerPort())).redirectErrorStream(true).start();
            assertThat(p.waitFor(60, TimeUnit.SECONDS)).isTrue();
            String output = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
            assertThat(p.exitValue()).as(output).isZero();
            JsonNode r = new ObjectMapper().readTree(output.lines().reduce((a, b) -> b).orElseThrow());
            assertThat(r.get("generator").asText()).startsWith("LRBENCH,SIM-SOURCE");
            assertThat(r.get("digitizer").asText().split(",")).hasSize(4);
            assertThat(r.get("complete").asText()).isEqualTo("1");
            // series circuit: V_part / V_sense = Z / R_s with Z = R + j omega L
            Complex z = new Complex(part.seriesResistanceOhm(), 2 * Math.PI * 1000 * part.inductanceHenry());
            double magnitude = z.abs() / sense;
            assertThat(r.get("ratio_magnitude").asDouble()).isCloseTo(magnitude, within(0.01 * magnitude));
            assertThat(r.get("ratio_phase").asDouble()).isCloseTo(z.getArgument(), within(0.01));
            assertThat(r.get("first_error").asText()).startsWith("-113");
            assertThat(r.get("then").asText()).startsWith("0");
        }
    }
}
