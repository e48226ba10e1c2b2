package org.lrbench.cli;

import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.traces.CsvTraces;
import org.lrbench.traces.TraceAnalysis;
import org.lrbench.units.Dimension;
import org.lrbench.units.UnitException;
import org.lrbench.units.Units;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code lrbench analyze --csv FILE --sense-resistor R}: the metrology on traces from any scope. */
@Command(name = "analyze", description = {"Extract R, X, L and Q from a two-channel trace file.",
        "Time, sense-resistor voltage and part voltage with a header, as any scope or simulator writes them."})
final class AnalyzeCommand implements Callable<Integer> {

    @Option(names = "--csv", required = true, paramLabel = "FILE", description = "the trace file")
    Path csv;

    @Option(names = "--sense-resistor", required = true, paramLabel = "R", description = "the sense resistor, e.g. 100ohm")
    String sense;

    @Option(names = "--frequency", paramLabel = "F", description = "the drive frequency (default: estimated from the data)")
    String frequency;

    @Override
    public Integer call() throws Exception {
        double rs;
        Double f = null;
        try {
            rs = Units.parse(sense, Dimension.RESISTANCE);
            if (frequency != null) {
                f = Units.parse(frequency, Dimension.FREQUENCY);
            }
        } catch (UnitException e) {
            throw new BadInputException(e.getMessage());
        }
        Inputs.requireFile(csv, "trace file");
        CsvTraces t;
        try {
            t = CsvTraces.read(csv);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
        ImpedancePoint z = TraceAnalysis.analyse(t, rs, f);
        System.out.printf(Locale.ROOT, "%s: %d samples at %s, frequency %s%n", csv, t.sense().length,
                Units.format(t.intervalSecond(), Dimension.TIME), Units.format(z.frequencyHz(), Dimension.FREQUENCY));
        System.out.printf(Locale.ROOT, "  R = %s, X = %s, L = %s, Q = %.3f (component uncertainty %s)%n",
                Units.format(z.resistanceOhm(), Dimension.RESISTANCE), Units.format(z.reactanceOhm(), Dimension.RESISTANCE),
                Units.format(z.inductanceHenry(), Dimension.INDUCTANCE), z.qualityFactor(),
                Units.format(z.componentUncertaintyOhm(), Dimension.RESISTANCE));
        return ExitCodes.PASS;
    }
}
