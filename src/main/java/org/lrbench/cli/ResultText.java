package org.lrbench.cli;

import java.io.PrintStream;
import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.lrbench.judge.Characteristic;
import org.lrbench.judge.Limit;
import org.lrbench.plan.Plan;
import org.lrbench.results.LotSummary;
import org.lrbench.results.PartResult;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.lot.LotScheme;
import org.lrbench.sampling.SamplingScheme;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/** How results look on the console: a detailed part report, lot table rows, and a lot summary. */
final class ResultText {
    private static final String ROW = "%-14s %12s %12s %10s  %-7s %s%n";

    private ResultText() {
    }

    /** Which corrections are in force and when they were measured, in one line. */
    static String corrections(PartResult.CorrectionsRecord c) {
        if (c == null || c.channelMatchMeasuredAt() == null && c.fixtureMeasuredAt() == null && c.senseTracedAt() == null) {
            return "no corrections in force: U includes the fixture's and the channels' bench bounds (lrbench calibrate"
                    + " measures them)";
        }
        return "corrections in force: channel match " + (c.channelMatchMeasuredAt() == null ? "none"
                : "of " + c.channelMatchMeasuredAt()) + ", fixture short/open " + (c.fixtureMeasuredAt() == null
                ? "none (U includes the fixture's bench bounds)" : "of " + c.fixtureMeasuredAt())
                + ", sense resistor " + (c.senseTracedAt() == null ? "nominal (its tolerance in U)"
                : Units.format(c.senseOhm(), Dimension.RESISTANCE) + " traced on " + c.senseTracedAt());
    }


    static void part(PrintStream out, PartResult r) {
        out.printf("part %s of lot %s, part number %s, bench %s%s%n", r.serial(), r.lot(), r.partNumber(), r.bench(),
                r.simulated() ? " (simulated)" : "");
        if (!r.points().isEmpty()) {
            out.printf("  %12s %12s %12s %12s %8s%n", "frequency", "R", "X", "L", "Q");
            for (PartResult.PointRecord p : r.points()) {
                out.printf("  %12s %12s %12s %12s %8.2f%n", Units.format(p.frequencyHz(), Dimension.FREQUENCY),
                        Units.format(p.resistanceOhm(), Dimension.RESISTANCE),
                        Units.format(p.reactanceOhm(), Dimension.RESISTANCE),
                        Units.format(p.inductanceH(), Dimension.INDUCTANCE), p.qualityFactor());
            }
        }
        if (r.inductanceH() != null) {
            // each value to the digits its expanded uncertainty supports
            out.printf("  %s: L = %s, R_dc = %s (expanded, 95 %% coverage)%n", r.model().name(),
                    withU(r.inductanceH(), r.inductanceExpandedUncertaintyH(), Dimension.INDUCTANCE),
                    withU(r.seriesResistanceOhm(), r.seriesResistanceExpandedUncertaintyOhm(), Dimension.RESISTANCE));
            if (r.selfResonanceHz() != null) {
                out.printf("  self-resonance %s%n", Units.format(r.selfResonanceHz(), Dimension.FREQUENCY));
            } else if (r.selfResonanceAboveHz() != null) {
                out.printf("  self-resonance above %s (not reached by the sweep)%n",
                        Units.format(r.selfResonanceAboveHz(), Dimension.FREQUENCY));
            }
            r.model().dropped().forEach(d -> out.println("  model term dropped: " + d));
            if (r.triangle() != null) {
                out.printf("  triangle-wave check at %s: L = %s, R = %s (residual %s)%n",
                        Units.format(r.triangle().frequencyHz(), Dimension.FREQUENCY),
                        Units.format(r.triangle().inductanceH(), Dimension.INDUCTANCE),
                        Units.format(r.triangle().resistanceOhm(), Dimension.RESISTANCE),
                        Units.format(r.triangle().residualRmsV(), Dimension.VOLTAGE));
            }
        }
        if (r.dcResistance() != null) {
            var dc = r.dcResistance();
            out.printf(Locale.ROOT, "  multimeter (%s): %s at %.1f C, %s at %.1f C; sweep R_dc %s; %s%n", dc.wiring(),
                    Units.format(dc.measuredOhm(), Dimension.RESISTANCE), dc.temperatureC(),
                    Units.format(dc.atReferenceOhm(), Dimension.RESISTANCE), dc.referenceTemperatureC(),
                    dc.sweepResistanceOhm() == null ? "-" : Units.format(dc.sweepResistanceOhm(), Dimension.RESISTANCE),
                    Boolean.TRUE.equals(dc.agrees()) ? "agree" : "disagree");
        }
        out.println("  " + corrections(r.corrections()));
        r.warnings().forEach(w -> out.println("  warning: " + w));
        for (PartResult.LimitRecord l : r.limits()) {
            out.printf("  %-4s %s (spec %s)%n", l.pass() ? "ok" : "FAIL", l.reason(), l.spec());
        }
        if (r.error() != null) {
            out.println("  error: " + r.error());
        }
        out.println("verdict: " + r.verdict().word().toUpperCase(Locale.ROOT));
    }

    /** The frequency the table's Q column is headed with: the first Q limit's, else the top of the sweep. */
    static double qFrequency(Plan plan) {
        return plan.limits().stream().filter(l -> l.characteristic() == Characteristic.QUALITY_FACTOR)
                .map(Limit::atFrequencyHz).findFirst().orElse(plan.sweep().highestHz());
    }

    static void tableHeader(PrintStream out, double qAtHz) {
        out.printf(ROW, "serial", "L", "R", "Q@" + Units.format(qAtHz, Dimension.FREQUENCY).replace(" ", ""),
                "verdict", "reason");
    }

    static void tableRow(PrintStream out, PartResult r, double qAtHz) {
        String l = r.inductanceH() == null ? "-" : Units.format(r.inductanceH(), Dimension.INDUCTANCE);
        String res = r.seriesResistanceOhm() == null ? "-" : Units.format(r.seriesResistanceOhm(), Dimension.RESISTANCE);
        String q = r.limits().stream().filter(x -> x.characteristic().equals("quality_factor") && x.value() != null)
                .findFirst().map(x -> String.format(Locale.ROOT, "%.1f", x.value())).orElse("-");
        String reason = r.error() != null ? r.error() : String.join("; ", r.failedLimits());
        String serial = r.attempt() != null && r.attempt().number() > 1 ? r.serial() + " #" + r.attempt().number() : r.serial();
        if (r.attempt() != null && r.attempt().reason() != null) {
            reason = (reason.isEmpty() ? "" : reason + "; ") + "measured again: " + r.attempt().reason();
        }
        out.printf(ROW, serial, l, res, q, r.verdict(), reason);
    }

    static void summary(PrintStream out, LotSummary s) {
        double yield = s.measured() == 0 ? 0 : 100.0 * s.passed() / s.measured();
        out.printf("lot %s (%s)%s: %d measured, %d pass, %d fail, %d error%s; yield %.1f %%%n", s.lot(), s.partNumber(),
                s.inspection() > 1 ? ", re-inspection " + s.inspection() : "", s.measured(), s.passed(), s.failed(),
                s.errors(), s.skipped() > 0 ? ", " + s.skipped() + " skipped (not measured)" : "", yield);
        if (!s.failedSerials().isEmpty()) {
            out.println("  failed: " + String.join(", ", s.failedSerials()));
        }
        if (!s.errorSerials().isEmpty()) {
            out.println("  not measured (error): " + String.join(", ", s.errorSerials()));
        }
        if (s.disposition() != null) {
            out.printf("disposition: %s (%s)%n", s.disposition().toUpperCase(Locale.ROOT), s.dispositionReason());
        }
    }

    /** The severity a lot is inspected under, the supplier's scheme and why, one line. */
    static void severity(PrintStream out, LotScheme scheme) {
        severity(out, scheme, false);
    }

    /** As above; a lot on the simulated bench says its scheme is the simulated bench's, apart from the real one. */
    static void severity(PrintStream out, LotScheme scheme, boolean simulated) {
        out.printf(Locale.ROOT, "%s inspection, %s%s: %s%n", scheme.severity().word(),
                scheme.supplier().isEmpty() ? "no supplier named" : "supplier " + scheme.supplier(),
                simulated ? " (the simulated bench's scheme, apart from the real one)" : "", scheme.why());
    }

    /** The lot's sampling plans per class, one line. */
    static void samplingPlans(PrintStream out, int lotSize, SamplingScheme scheme) {
        StringBuilder sb = new StringBuilder(String.format(Locale.ROOT, "lot size %d, inspection level %s (ISO 2859-1,"
                + " %s, single):", lotSize, scheme.level(), scheme.severity().word()));
        List<String> parts = new ArrayList<>();
        LotDisposition.plans(lotSize, scheme).forEach((c, p) -> parts.add(String.format(Locale.ROOT,
                "%s AQL %s: letter %c%s, n = %d, Ac %d, Re %d%s", c.name().toLowerCase(Locale.ROOT), p.aql(),
                p.codeLetter(), p.planLetter() != p.codeLetter() ? " -> " + p.planLetter() : "", p.sampleSize(),
                p.acceptance(), p.rejection(), p.fullInspection() ? " (100 % inspection)" : "")));
        out.println(sb.append(' ').append(String.join("; ", parts)));
    }

    private static String withU(Double value, Double u, Dimension d) {
        if (value == null) {
            return "-";
        }
        return u == null ? Units.format(value, d) : Units.formatWithUncertainty(value, u, d).replace("\u00b1", "+/-");
    }

    static void problems(PrintWriter err, List<?> problems) {
        problems.forEach(err::println);
    }
}
