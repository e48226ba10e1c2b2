package org.lrbench.cli;

import java.io.IOException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.Callable;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.results.ResultFiles;
import org.lrbench.traces.CsvTraces;
import org.lrbench.traces.Reanalysis;
import org.lrbench.traces.TraceAnalysis;
import org.lrbench.units.Dimension;
import org.lrbench.units.UnitException;
import org.lrbench.units.Units;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code lrbench analyze --csv FILE --sense-resistor R}: the metrology on traces from any scope. */
@Command(name = "analyze", mixinStandardHelpOptions = true, description = {"Extract R, X, L and Q from a two-channel trace file.",
        "Time, sense-resistor voltage and part voltage with a header, as any scope or simulator writes them."})
final class AnalyzeCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    FolderOptions.Calibration calibrationOption;

    @Option(names = "--csv", paramLabel = "FILE", description = "a trace file from any scope")
    Path csv;

    @Option(names = "--archive", paramLabel = "FILE.lrtraces",
            description = "a part's trace archive: re-run the extraction, show old against new, add an analysis record")
    Path archive;

    @Option(names = "--sense-resistor", paramLabel = "R", description = "the sense resistor, e.g. 100ohm (with --csv)")
    String sense;

    @Option(names = "--frequency", paramLabel = "F", description = "the drive frequency (default: estimated from the data)")
    String frequency;

    @Option(names = "--json", paramLabel = "OUT.json", description = "with --csv: also write the figures as JSON")
    Path json;

    @Option(names = "--plan", paramLabel = "PLAN", description = "with --archive: the plan the part was measured with"
            + " (default: the one its result names; its content must be the same)")
    Path planFile;

    @Override
    public Integer call() throws Exception {
        if ((csv == null) == (archive == null)) {
            throw new BadInputException("give --csv FILE --sense-resistor R, or --archive FILE.lrtraces");
        }
        if (archive != null) {
            return reanalyse();
        }
        if (sense == null) {
            throw new BadInputException("--csv needs --sense-resistor R");
        }
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
        ImpedancePoint z;
        try {
            z = TraceAnalysis.analyse(t, rs, f);
        } catch (RuntimeException e) {
            throw new BadInputException(csv + ": the traces cannot be analysed: " + e.getMessage());
        }
        System.out.printf(Locale.ROOT, "%s: %d samples at %s, frequency %s%n", csv, t.sense().length,
                Units.format(t.intervalSecond(), Dimension.TIME), Units.format(z.frequencyHz(), Dimension.FREQUENCY));
        // full precision: these numbers are compared with other instruments' and re-used
        System.out.printf(Locale.ROOT, "  frequency_hz %.17g%n  resistance_ohm %.17g%n  reactance_ohm %.17g%n"
                        + "  inductance_h %.17g%n  quality_factor %.17g%n  component_uncertainty_ohm %.17g%n",
                z.frequencyHz(), z.resistanceOhm(), z.reactanceOhm(), z.inductanceHenry(), z.qualityFactor(),
                z.componentUncertaintyOhm());
        if (json != null) {
            Map<String, Object> out = new LinkedHashMap<>();
            out.put("schema", "lrbench.trace-analysis.v1");
            out.put("file", csv.toString());
            out.put("samples", t.sense().length);
            out.put("sample_interval_s", t.intervalSecond());
            out.put("sense_resistor_ohm", rs);
            out.put("frequency_hz", z.frequencyHz());
            out.put("resistance_ohm", z.resistanceOhm());
            out.put("reactance_ohm", z.reactanceOhm());
            out.put("inductance_h", z.inductanceHenry());
            out.put("quality_factor", z.qualityFactor());
            out.put("component_uncertainty_ohm", z.componentUncertaintyOhm());
            ResultFiles.writeJson(json, out);
            System.out.println("written: " + json);
        }
        return ExitCodes.PASS;
    }

    /** Re-runs the extraction on archived traces and prints old against new; the original result is never touched. */
    private int reanalyse() throws Exception {
        Inputs.requireFile(archive, "trace archive");
        BenchConfig b = benchOptions.load();
        var calibration = new CalibrationStore(calibrationOption.calibration, b.name()).load();
        Reanalysis.Outcome o;
        try {
            o = Reanalysis.run(archive, planFile, b, calibration, Home.version());
        } catch (Reanalysis.Refused e) {
            throw new BadInputException(e.getMessage());
        } catch (java.io.IOException e) {
            throw new BadInputException(e.getMessage());
        }
        System.out.printf("re-analysis of %s (lot %s, serial %s), sense resistor %s%n", archive,
                o.header().get("lot").asText(), o.header().get("serial").asText(),
                Units.format(o.senseOhm(), Dimension.RESISTANCE));
        System.out.printf("  %12s %14s %14s %14s %14s%n", "frequency", "R before", "R now", "L before", "L now");
        for (Reanalysis.Row r : o.rows()) {
            System.out.printf(Locale.ROOT, "  %12s %14s %14s %14s %14s%n", Units.format(r.now().frequencyHz(), Dimension.FREQUENCY),
                    r.previousResistanceOhm() == null ? "-" : Units.format(r.previousResistanceOhm(), Dimension.RESISTANCE),
                    Units.format(r.now().resistanceOhm(), Dimension.RESISTANCE),
                    r.previousInductanceH() == null ? "-" : Units.format(r.previousInductanceH(), Dimension.INDUCTANCE),
                    Units.format(r.now().inductanceHenry(), Dimension.INDUCTANCE));
        }
        Reanalysis.Rejudged j = o.rejudged();
        if (j == null) {
            System.out.println("no stored result beside the archive: the limits are not judged again");
        } else {
            if (!Objects.equals(j.channelMatchThen(), j.channelMatchNow())) {
                System.out.println("note: the channel match in force now (" + j.channelMatchNow() + ") is not the one of the"
                        + " measurement (" + j.channelMatchThen() + ")");
            }
            String before = j.storedVerdict();
            String now = j.now().verdict().word();
            System.out.printf("verdict: stored %s, re-judged %s%s%n", before, now, before.equals(now) ? " (it stands)" : " (CHANGED)");
            for (var l : j.now().limits()) {
                Double was = j.storedValues().get(l.limit().name());
                System.out.printf(Locale.ROOT, "  %-28s stored %-14s now %-14s %s%n", l.limit().name(),
                        was == null ? "-" : String.format(Locale.ROOT, "%.6g", was),
                        String.format(Locale.ROOT, "%.6g", l.value()), l.pass() ? "pass" : "fail");
            }
            if (j.now().error() != null) {
                System.out.println("  error: " + j.now().error());
            }
        }
        System.out.println("analysis record added: " + o.record() + " (the original result is unchanged)");
        return ExitCodes.PASS;
    }
}
