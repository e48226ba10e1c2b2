package org.lrbench.cli;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverLoader;
import org.lrbench.judge.Characteristic;
import org.lrbench.plan.Plan;
import org.lrbench.records.StudyRecords;
import org.lrbench.rehearsal.SimulatedStudy;
import org.lrbench.report.StudyPage;
import org.lrbench.results.Names;
import org.lrbench.results.ResultFiles;
import org.lrbench.sim.PartFile;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimLot;
import org.lrbench.study.GaugeStudy;
import org.lrbench.study.TypeOneStudy;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code lrbench study PLAN}: the measurement system studies of a plan's inductance on the
 * simulated bench: a crossed study (parts x benches x trials, ANOVA) and a type-1 study.
 */
@Command(name = "study", mixinStandardHelpOptions = true, description = {
    "Measurement system studies of a plan's inductance on the simulated benches.",
    "A crossed study (the lot file's parts x benches x trials, analysis of variance) with %GRR against"
        + " the tolerance and the total variation and the number of distinct categories, and a type-1"
        + " study (one reference part measured again and again: Cg, Cgk); both also as an HTML page.",
    "Exit 0 when %GRR of the tolerance is at most 10 %, ndc at least 5, and Cg and Cgk at least 1.33."})
final class StudyCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "PLAN", description = "the plan file (YAML)")
    Path plan;

    @Option(names = "--benches", split = ",", paramLabel = "BENCH.yaml",
            description = "simulated benches as the appraisers (default: the three shipped ones)")
    List<Path> benches;

    @Option(names = "--lot-file", paramLabel = "LOT.yaml", description = "the parts (default: the demo lot's tray)")
    Path lotFile;

    @Option(names = "--reference", paramLabel = "PART.yaml",
            description = "the type-1 study's reference part (default: the demo part at its nominal values)")
    Path reference;

    @Mixin
    FolderOptions.Runs runs = new FolderOptions.Runs();

    @Option(names = "--records", paramLabel = "LOT",
            description = "instead of simulating: the crossed study from the part records of RUNS/LOT (every serial"
                    + " measured by every operator the same number of times with run --serial --operator)")
    String records;

    @Option(names = "--trials", defaultValue = "3", paramLabel = "N", description = "trials per part and bench (default: ${DEFAULT-VALUE})")
    int trials;

    @Option(names = "--repeats", defaultValue = "25", paramLabel = "N", description = "type-1 readings (default: ${DEFAULT-VALUE})")
    int repeats;

    @Override
    public Integer call() throws Exception {
        if (trials < 2 || trials > 10) {
            throw new BadInputException("--trials " + trials + ": use 2 to 10");
        }
        if (repeats < 10 || repeats > 200) {
            throw new BadInputException("--repeats " + repeats + ": use 10 to 200");
        }
        if (records != null) {
            return fromRecords();
        }
        Path root = Home.root();
        List<Path> files = benches != null ? benches : List.of(root.resolve("simulator/bench.yaml"),
                root.resolve("simulator/bench-pm12.yaml"), root.resolve("simulator/bench-div8.yaml"));
        List<BenchConfig> configs = new ArrayList<>();
        for (Path f : files) {
            BenchConfig b = Inputs.bench(f);
            if (b.simulation() == null) {
                throw new BadInputException(f + ": a study runs on simulated benches only (this bench file has no simulation)");
            }
            configs.add(b);
        }
        if (configs.size() < 2) {
            throw new BadInputException("--benches: a crossed study needs at least 2 benches");
        }
        Plan p = Inputs.plan(plan, configs.get(0));
        DriverLoader drivers = new DriverLoader(Home.drivers());
        for (BenchConfig b : configs) {
            Inputs.requireFit(p, b, drivers);
        }
        SimLot lot = SimLot.load(lotFile != null ? lotFile : Home.demoLot());
        List<PartModel> parts = lot.parts().stream().map(SimLot.Part::model).toList();
        if (parts.size() < 2) {
            throw new BadInputException("the lot file names " + parts.size() + " part(s); a crossed study needs at least 2");
        }
        PartModel ref = PartFile.load(reference != null ? reference : root.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml"));
        SimulatedStudy.Crossed crossed;
        try {
            crossed = SimulatedStudy.crossed(p, configs, drivers, parts, trials);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
        GaugeStudy.Result g = crossed.result();
        System.out.printf(Locale.ROOT, "crossed study of '%s' (plan %s): %d parts x %d benches x %d trials on the simulated bench%n",
                crossed.limit(), plan, parts.size(), configs.size(), trials);
        table(g, "reproducibility (benches)", "bench x part");
        double truth = truth(p, ref);
        SimulatedStudy.TypeOne one = SimulatedStudy.typeOne(p, configs.get(0), drivers, ref, truth, repeats);
        TypeOneStudy.Result t = one.result();
        System.out.printf(Locale.ROOT, "type-1 study on %s: %d readings of a reference part of %s: mean %s, s %s, bias %s"
                        + " (p = %.3g); Cg %.2f, Cgk %.2f%n", configs.get(0).name(), t.n(), Units.format(truth, Dimension.INDUCTANCE),
                Units.format(t.mean(), Dimension.INDUCTANCE), Units.format(t.standardDeviation(), Dimension.INDUCTANCE),
                Units.format(t.bias(), Dimension.INDUCTANCE), t.biasPValue(), t.cg(), t.cgk());
        String stamp = Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
        StudyPage.Content page = new StudyPage.Content(plan.toString(), crossed.limit(), true,
                configs.stream().map(BenchConfig::name).toList(), crossed.readings(), g, one.readings(), truth, t, stamp);
        writePage(page, p.partNumber(), stamp);
        boolean fit = g.acceptable() && t.capable();
        System.out.println(fit ? "the bench is fit for this plan's inductance (%GRR <= 10 % of the tolerance, ndc >= 5,"
                + " Cg and Cgk >= 1.33)" : "the bench is not shown fit for this plan's inductance (want %GRR <= 10 % of the"
                + " tolerance, ndc >= 5, Cg and Cgk >= 1.33)");
        return fit ? ExitCodes.PASS : ExitCodes.FAIL;
    }

    /** The crossed study from a lot folder's records: operators as the appraisers, no type-1 study. */
    private int fromRecords() throws Exception {
        BenchConfig b = Inputs.bench(benches != null && !benches.isEmpty() ? benches.get(0) : Home.defaultBench());
        Plan p = Inputs.plan(plan, b);
        var limit = p.firstLimit(Characteristic.INDUCTANCE)
                .orElseThrow(() -> new BadInputException(plan + ": a study needs an inductance limit"));
        Path folder = runs.runs.resolve(Inputs.name("--records", records));
        if (!Files.isDirectory(folder)) {
            throw new BadInputException("--records " + records + ": no folder " + folder);
        }
        StudyRecords.Layout layout;
        GaugeStudy.Result g;
        try {
            layout = StudyRecords.read(folder, limit.name());
            g = GaugeStudy.analyse(layout.readings(),
                    Double.isFinite(limit.lower()) && Double.isFinite(limit.upper()) ? limit.upper() - limit.lower() : 0);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
        System.out.printf(Locale.ROOT, "crossed study of '%s' from the records of %s: %d parts x %d operators (%s) x %d trials%n",
                limit.name(), folder, layout.serials().size(), layout.operators().size(), String.join(", ", layout.operators()),
                layout.readings()[0][0].length);
        table(g, "reproducibility (operators)", "operator x part");
        String stamp = Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
        writePage(new StudyPage.Content(plan.toString(), limit.name(), false, layout.operators(), layout.readings(), g,
                null, Double.NaN, null, stamp), p.partNumber(), stamp);
        boolean fit = g.acceptable();
        System.out.println(fit ? "the measurement system is fit for this plan's inductance (%GRR <= 10 % of the tolerance,"
                + " ndc >= 5; no type-1 study here)" : "the measurement system is not shown fit for this plan's inductance"
                + " (want %GRR <= 10 % of the tolerance, ndc >= 5)");
        return fit ? ExitCodes.PASS : ExitCodes.FAIL;
    }

    private static void table(GaugeStudy.Result g, String reproducibility, String interaction) {
        System.out.printf(Locale.ROOT, "  %-36s %4s %14s %14s %9s %9s%n", "source", "df", "SS (H^2)", "MS (H^2)", "F", "p");
        for (GaugeStudy.Row r : g.table()) {
            System.out.printf(Locale.ROOT, "  %-36s %4d %14.6g %14s %9s %9s%n", r.source(), r.df(), r.sumOfSquares(),
                    Double.isNaN(r.meanSquare()) ? "" : String.format(Locale.ROOT, "%.6g", r.meanSquare()),
                    Double.isNaN(r.f()) ? "" : String.format(Locale.ROOT, "%.3g", r.f()),
                    Double.isNaN(r.p()) ? "" : String.format(Locale.ROOT, "%.3g", r.p()));
        }
        System.out.printf(Locale.ROOT, "  %-36s %14s %11s%n", "component", "sigma", "% of total");
        line("repeatability", g.repeatability(), g);
        line(reproducibility, g.appraiser(), g);
        line(interaction, g.interaction(), g);
        line("GRR", g.grr(), g);
        line("part to part", g.part(), g);
        System.out.printf(Locale.ROOT, "  %%GRR of the tolerance (6 sigma over %s): %.2f %%; distinct categories: %d%n",
                Units.format(g.tolerance(), Dimension.INDUCTANCE), g.percentOfTolerance(), g.distinctCategories());
    }

    private void writePage(StudyPage.Content page, String partNumber, String stamp) throws Exception {
        Path out = runs.runs.resolve("studies").resolve((Names.valid(partNumber) ? partNumber : "study") + "-"
                + stamp.replace(":", "") + ".html");
        Files.createDirectories(out.getParent());
        ResultFiles.writeNew(out, StudyPage.html(page).getBytes(StandardCharsets.UTF_8));
        System.out.println("study page: " + out + " (opens in any browser, offline)");
    }

    private static void line(String name, double variance, GaugeStudy.Result g) {
        System.out.printf(Locale.ROOT, "  %-36s %14s %10.2f %%%n", name, Units.format(Math.sqrt(variance), Dimension.INDUCTANCE),
                100 * Math.sqrt(variance / g.total()));
    }

    /** The reference part's true inductance as the plan's limit reads it: apparent at its frequency, if any. */
    private static double truth(Plan p, PartModel ref) {
        var limit = p.firstLimit(Characteristic.INDUCTANCE).orElseThrow();
        if (limit.atFrequencyHz() == null) {
            return ref.inductanceHenry();
        }
        double omega = 2 * Math.PI * limit.atFrequencyHz();
        return ref.impedance(omega).getImaginary() / omega;
    }
}
