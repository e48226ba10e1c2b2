package org.lrbench.results;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchLoader;
import org.lrbench.yaml.ProblemsException;

/**
 * One rule per identifier people type or scan, wherever it enters: lots, serials and bench names reach
 * file and folder names (letters, digits, '.', '_', '-'); an operator's name, a supplier's name and a
 * reason are one printable line of bounded length. Each refusal names the key, the character and its
 * position (a terminal would not show a control character: it is named by its code). The rules are
 * common practice, no source.
 */
class NamesTests {

    @Test
    void aLotOrSerialNamesTheFirstCharacterOutsideTheRule() {
        assertThat(Names.problem("lot", "L-1/../x")).startsWith("lot 'L-1/../x' ('/' at position 4)");
        assertThat(Names.problem("serial", "SN\u00071")).contains("U+0007 at position 3").doesNotContain("\u0007");
        assertThat(Names.problem("serial", "_x")).contains("'_' at position 1");
        assertThat(Names.problem("serial", "S".repeat(65))).contains("(65 characters)");
        assertThat(Names.problem("serial", "SN-0001.a_b")).isNull();
    }

    @Test
    void anOperatorSupplierOrReasonIsOnePrintableLine() {
        assertThat(Names.operatorProblem("Ann Smith")).isNull();
        assertThat(Names.operatorProblem("Ann\nSmith")).startsWith("operator: ").contains("U+000A at position 4");
        assertThat(Names.operatorProblem("A".repeat(65))).startsWith("operator: ").contains("1 to 64");
        assertThat(Names.supplierProblem("Halvern Coil Co.")).isNull();
        assertThat(Names.supplierProblem("Halvern\u0000")).startsWith("supplier: ").contains("U+0000 at position 8");
        assertThat(Names.reasonProblem("reason", "probe slipped")).isNull();
        assertThat(Names.reasonProblem("reason", "x".repeat(201))).startsWith("reason: ").contains("201 characters");
        assertThat(Names.reasonProblem("reason", "a\u2028b")).startsWith("reason: ").contains("U+2028 at position 2");
    }

    @Test
    void aBenchNameThatCouldClimbOutOfAFolderIsRefusedAtItsLine(@TempDir Path dir) throws Exception {
        String bench = Files.readString(TestBench.home().resolve("simulator/bench.yaml"));
        Path file = dir.resolve("b.yaml");
        Files.writeString(file, bench.replaceFirst("(?m)^name: .*$", "name: \"..\""));
        try {
            BenchLoader.load(file);
            throw new AssertionError("a bench named '..' was accepted");
        } catch (ProblemsException e) {
            assertThat(e.problems().get(0).key()).isEqualTo("name");
            assertThat(e.problems().get(0).message()).contains("'.' at position 1");
            assertThat(e.problems().get(0).line()).isPositive();
        }
    }
}
