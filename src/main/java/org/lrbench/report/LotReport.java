package org.lrbench.report;

import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import java.io.IOException;
import java.math.BigDecimal;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.LumpedModel;
import org.lrbench.analysis.LumpedParameter;
import org.lrbench.results.Attempt;
import org.lrbench.results.PartResult;
import org.lrbench.sampling.ClassPlan;
import org.lrbench.sampling.SamplingPlan;
import org.lrbench.store.LotRecord;
import org.lrbench.store.LotStatistics;
import org.lrbench.store.ResultStore;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * One self-contained HTML file per lot, built from the results store alone: the lot and its
 * disposition; per limit the sample's readings against the tolerance and acceptance limits with
 * mean, standard deviation, Cp and Cpk; |Z| and phase against frequency per part with the fitted
 * model; the part number's lots over time; and every part's verdict. Plots are embedded PNG data.
 */
public final class LotReport {
    private static final ObjectMapper READ = new ObjectMapper()
            .setPropertyNamingStrategy(PropertyNamingStrategies.SNAKE_CASE)
            .configure(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES, false);

    private LotReport() {
    }

    public static String html(ResultStore store, String lot) throws IOException {
        System.setProperty("java.awt.headless", "true");
        List<LotRecord> inspections = store.lot(lot);
        if (inspections.isEmpty()) {
            throw new IllegalArgumentException("no lot " + lot + " in the store");
        }
        LotRecord l = inspections.get(inspections.size() - 1);
        List<Attempt> attempts = store.attempts(lot);
        List<Attempt> counting = Attempt.counting(attempts.stream().filter(a -> a.round() == l.round()).toList());
        List<PartResult> parts = new ArrayList<>();
        for (Attempt a : counting) {
            if (!a.skipped()) {
                parts.add(READ.readValue(a.resultJson(), PartResult.class));
            }
        }
        StringBuilder h = new StringBuilder();
        h.append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><title>Inspection record, lot ")
                .append(esc(lot)).append("</title><style>").append(CSS).append("</style></head><body>\n");
        boolean simulated = l.simulated() || parts.stream().anyMatch(PartResult::simulated);
        if (simulated) {
            h.append("<div class=\"banner\" id=\"simulated\">SIMULATED BENCH: parts of this lot were measured on the"
                    + " simulated bench, not on instruments. These results show how the plan behaves; they are not"
                    + " measurements of real parts, and the lot counts toward no real supplier's scheme or"
                    + " history.</div>\n");
        }
        h.append("<h1>Inspection record: lot ").append(esc(lot)).append(" &mdash; ").append(esc(l.partNumber()))
                .append("</h1>\n");
        String disp = l.disposition() == null ? "open" : l.disposition().word();
        h.append("<table id=\"identity\">");
        row(h, "disposition", "<span class=\"" + esc(disp) + "\">" + esc(disp.toUpperCase(Locale.ROOT)) + "</span>"
                + (l.dispositionReason() == null ? "" : " &mdash; " + esc(l.dispositionReason())));
        row(h, "lot size / sample", l.lotSize() + " / " + l.sampleSize());
        if (l.severity() != null) {
            row(h, "supplier", l.supplier().isEmpty() ? "none named" : esc(l.supplier()));
            row(h, "inspection severity", "<span id=\"severity\">" + esc(l.severity()) + "</span> &mdash; "
                    + esc(l.severityReason()));
        }
        if (l.round() > 1) {
            row(h, "inspection", "re-inspection " + l.round() + " &mdash; " + esc(l.reason()));
        }
        row(h, "parts measured", l.measured() + " (" + l.passed() + " pass, " + l.failed() + " fail, " + l.errors()
                + " error)" + (l.skipped() > 0 ? "; " + l.skipped() + " position(s) skipped, not measured" : ""));
        row(h, "attempts stored", l.attempts() + " (every measurement is kept; the latest attempt of a part counts)");
        row(h, "operators", esc(String.join(", ", operators(l, attempts))));
        row(h, "plan", esc(l.planPath()) + "<br>SHA-256 " + esc(l.planSha256()));
        row(h, "bench", esc(l.bench()) + (simulated ? " (simulated)" : ""));
        row(h, "program", esc(String.join(", ", distinct(parts.stream().map(PartResult::programVersion).toList()))));
        row(h, "instruments", instruments(parts));
        row(h, "calibration", calibration(parts, l.createdAt()));
        row(h, "started / finished", esc(l.createdAt()) + " / " + esc(l.finishedAt() == null ? "-" : l.finishedAt()));
        h.append("</table>\n");
        sampling(h, l);
        limits(h, parts);
        h.append("<h2>Parts</h2><table id=\"parts\"><tr><th>#</th><th>serial</th><th>verdict</th><th>L &plusmn; U (95 %)</th>"
                + "<th>R_dc &plusmn; U (95 %), as measured at the bench</th><th>reason</th></tr>");
        int i = 1;
        for (PartResult p : parts) {
            h.append("<tr><td>").append(i++).append("</td><td>").append(esc(p.serial())).append("</td><td class=\"")
                    .append(esc(p.verdict().word())).append("\">").append(esc(p.verdict().word())).append("</td>")
                    .append(withU(p.inductanceH(), p.inductanceExpandedUncertaintyH(), Dimension.INDUCTANCE))
                    .append(withU(p.seriesResistanceOhm(), p.seriesResistanceExpandedUncertaintyOhm(), Dimension.RESISTANCE))
                    .append("<td>").append(esc(p.error() != null ? p.error() : String.join("; ", p.failedLimits())))
                    .append("</td></tr>");
        }
        h.append("</table>\n");
        perPart(h, parts);
        attempts(h, inspections, attempts);
        impedance(h, parts);
        // the history of the lot's own kind: a simulated lot's report shows simulated lots, a real one real lots
        String supplier = l.supplier() == null ? "" : l.supplier();
        history(h, store.history(l.partNumber(), supplier, l.simulated()), l.partNumber(), supplier);
        signOff(h, disp);
        h.append("<p class=\"foot\">Written by lrbench from the results store. Hash chain head SHA-256 ")
                .append(esc(String.valueOf(store.chainHead(lot)))).append("; check the records with lrbench verify.</p>")
                .append("</body></html>\n");
        return h.toString();
    }

    /** Screen and print (A4 and letter alike: margins, no content cut, tables and charts kept whole). */
    private static final String CSS = "body{font-family:sans-serif;margin:2em;max-width:60em;color:#222}"
            + "table{border-collapse:collapse;margin:.5em 0}td,th{border:1px solid #bbb;padding:.2em .6em;"
            + "text-align:left;vertical-align:top}th{background:#eee}"
            + ".reject,.fail,.error{color:#7b2d8e;font-weight:bold}.accept,.pass{color:#1b4f8c;font-weight:bold}"
            + "#limits-wide td:first-child{white-space:nowrap}.multiples{display:flex;flex-wrap:wrap;gap:6px}.multiples figure{margin:0;font-size:11px;break-inside:avoid}"
            + ".banner{border:3px solid #d97a00;background:#fff3e0;padding:.6em;font-weight:bold;margin-bottom:1em}"
            + ".warn{color:#8a5a00}img{max-width:100%}.signoff td{height:2.4em;min-width:14em}.foot{color:#555;font-size:90%}"
            + "@page{margin:15mm}"
            + "@media print{body{margin:0;max-width:none;font-size:10pt}h2{break-after:avoid;page-break-after:avoid}"
            + "table,img,.signoff{break-inside:avoid;page-break-inside:avoid}tr{break-inside:avoid}"
            + "img{max-width:100%;height:auto}.banner{-webkit-print-color-adjust:exact;print-color-adjust:exact}}";

    private static List<String> distinct(List<String> values) {
        return values.stream().filter(v -> v != null && !v.isBlank()).distinct().toList();
    }

    private static List<String> operators(LotRecord l, List<Attempt> attempts) {
        List<String> all = new ArrayList<>();
        all.add(l.operator());
        attempts.stream().filter(a -> a.round() == l.round()).forEach(a -> all.add(a.operator()));
        return distinct(all);
    }

    /** Each instrument's identity as it answered *IDN?, by role, over the lot's parts. */
    private static String instruments(List<PartResult> parts) {
        Map<String, List<String>> byRole = new LinkedHashMap<>();
        for (PartResult p : parts) {
            if (p.instruments() != null) {
                p.instruments().forEach((role, idn) -> byRole.computeIfAbsent(role, k -> new ArrayList<>()).add(idn));
            }
        }
        if (byRole.isEmpty()) {
            return "-";
        }
        StringBuilder b = new StringBuilder();
        byRole.forEach((role, ids) -> b.append(esc(role)).append(": ").append(esc(String.join(" / ", distinct(ids))))
                .append("<br>"));
        return b.toString();
    }

    /** When the corrections in force were measured, and how old they were when the lot started. */
    private static String calibration(List<PartResult> parts, String lotStarted) {
        List<String> match = distinct(parts.stream().map(p -> p.corrections() == null ? null
                : p.corrections().channelMatchMeasuredAt()).toList());
        List<String> fixture = distinct(parts.stream().map(p -> p.corrections() == null ? null
                : p.corrections().fixtureMeasuredAt()).toList());
        if (match.isEmpty() && fixture.isEmpty()) {
            return "<span class=\"warn\">no corrections in force (no channel match, no fixture compensation)</span>";
        }
        List<String> sense = distinct(parts.stream().map(p -> p.corrections() == null || p.corrections().senseTracedAt() == null
                ? null : p.corrections().senseTracedAt()).toList());
        return "channel match " + dated(match, lotStarted) + "<br>fixture short/open " + dated(fixture, lotStarted)
                + "<br>sense resistor traced by the meter " + (sense.isEmpty()
                ? "<span class=\"warn\">never (its nominal and tolerance in U)</span>" : dated(sense, lotStarted));
    }

    private static String dated(List<String> when, String lotStarted) {
        if (when.isEmpty()) {
            return "<span class=\"warn\">none</span>";
        }
        List<String> out = new ArrayList<>();
        for (String w : when) {
            String age = "";
            try {
                Duration d = Duration.between(Instant.parse(w), Instant.parse(lotStarted));
                age = d.isNegative() ? " (after the lot started)" : String.format(Locale.ROOT, " (%s before the lot started)",
                        d.toHours() >= 48 ? d.toDays() + " days" : d.toHours() >= 1 ? d.toHours() + " h" : d.toMinutes() + " min");
            } catch (RuntimeException e) {
                age = "";
            }
            out.add(esc(w) + age);
        }
        return String.join(", ", out);
    }

    /**
     * The sampling the lot was inspected under, from the class plans its terms keep as data: per
     * class the AQL, code letter, n, Ac and Re under the severity the lot was inspected at
     * (ISO 2859-1 Table II-A for normal inspection, the lab's Table II-B or II-C otherwise).
     * Inspections stored before the plans were kept show their sampling line and say so.
     */
    private static void sampling(StringBuilder h, LotRecord l) {
        h.append("<h2>Sampling</h2>\n");
        if (l.sampling() == null || l.lotSize() == null) {
            h.append("<p>No sampling plan: parts measured one by one.</p>\n");
            return;
        }
        String severity = l.severity() == null ? "normal" : l.severity();
        h.append("<p>").append(esc(l.sampling())).append("; ISO 2859-1, single sampling, ").append(esc(severity))
                .append(" inspection").append(severity.equals("normal") ? "" : ", plans from the lab's transcription of"
                        + " Table " + (severity.equals("tightened") ? "II-B" : "II-C")).append(".</p>\n");
        if (l.classPlans() == null) {
            h.append("<p>The plan of each class was not kept with this inspection (stored by an earlier lrbench);"
                    + " the disposition's reason gives the counts it was decided on.</p>\n");
            return;
        }
        h.append("<table id=\"sampling\"><tr><th>class</th><th>AQL</th><th>code letter</th><th>n</th><th>Ac</th><th>Re</th>"
                + "<th>severity</th></tr>");
        for (ClassPlan c : l.classPlans()) {
            SamplingPlan sp = c.plan();
            h.append("<tr><td>").append(esc(c.classWord())).append("</td><td>")
                    .append(BigDecimal.valueOf(sp.aql()).stripTrailingZeros().toPlainString()).append("</td><td>")
                    .append(sp.codeLetter()).append(sp.planLetter() != sp.codeLetter() ? " &rarr; " + sp.planLetter() : "")
                    .append("</td><td>").append(sp.sampleSize()).append("</td><td>").append(sp.acceptance())
                    .append("</td><td>").append(sp.rejection()).append("</td><td>").append(esc(c.severity().word()))
                    .append("</td></tr>");
        }
        h.append("</table>\n");
    }

    /** Per part and limit: value +/- U, the decision rule, the zone, the margin; then the part's warnings. */
    private static void perPart(StringBuilder h, List<PartResult> parts) {
        if (parts.size() >= SMALL_MULTIPLES_FROM) {
            perPartWide(h, parts);
        } else {
            perPartRows(h, parts);
        }
        warnings(h, parts);
    }

    /**
     * A big lot's limits, one row per part and one column per limit (the specification and decision rule
     * once, in the column's head): every number of the row-per-limit table, in a third of the rows.
     */
    private static void perPartWide(StringBuilder h, List<PartResult> parts) {
        List<String> names = new ArrayList<>();
        java.util.Map<String, PartResult.LimitRecord> first = new java.util.LinkedHashMap<>();
        for (PartResult p : parts) {
            for (PartResult.LimitRecord r : p.limits()) {
                if (first.putIfAbsent(r.name(), r) == null) {
                    names.add(r.name());
                }
            }
        }
        h.append("<h2>Limits per part</h2>\n<p>Each cell: value &plusmn; U (95 % coverage), zone, margin, result.</p>\n"
                + "<table id=\"limits-wide\"><tr><th>serial</th>");
        for (String n : names) {
            PartResult.LimitRecord r = first.get(n);
            h.append("<th>").append(esc(n)).append("<br><small>").append(esc(r.spec())).append("; ")
                    .append(esc(r.decisionRule())).append("</small></th>");
        }
        h.append("</tr>");
        for (PartResult p : parts) {
            h.append("<tr><td>").append(esc(p.serial())).append("</td>");
            for (String n : names) {
                PartResult.LimitRecord r = p.limits().stream().filter(x -> x.name().equals(n)).findFirst().orElse(null);
                if (r == null) {
                    h.append("<td>-</td>");
                    continue;
                }
                Dimension d = dimensionOf(r.characteristic());
                String at = conditions(r);
                String cell = withU(r.value(), r.expandedUncertainty(), d);
                h.append(cell, 0, cell.length() - "</td>".length()).append(at.isEmpty() ? "" : " <small>" + esc(at) + "</small>")
                        .append(", ").append(esc(r.zone())).append(", ").append(si(r.margin(), d)).append(", <span class=\"")
                        .append(r.pass() ? "pass\">pass" : "fail\">fail").append("</span></td>");
            }
            h.append("</tr>");
        }
        h.append("</table>\n");
    }

    /** The conditions a value was judged under, when its own (a winding resistance at the reference temperature). */
    private static String conditions(PartResult.LimitRecord r) {
        java.util.regex.Matcher at = java.util.regex.Pattern.compile(
                java.util.regex.Pattern.quote(r.name()) + " (at -?[0-9.]+ C \\([^)]*\\))").matcher(
                r.reason() == null ? "" : r.reason());
        return at.lookingAt() ? at.group(1) : "";
    }

    private static void perPartRows(StringBuilder h, List<PartResult> parts) {
        h.append("<h2>Limits per part</h2>\n<table id=\"limits\"><tr><th>serial</th><th>limit</th><th>value &plusmn; U (95 %)</th>"
                + "<th>specification</th><th>decision rule</th><th>zone</th><th>margin</th><th>result</th></tr>");
        for (PartResult p : parts) {
            for (PartResult.LimitRecord r : p.limits()) {
                Dimension d = dimensionOf(r.characteristic());
                // a value judged under conditions of its own (a winding resistance carried to the reference
                // temperature) says so beside the limit's name, so it is not taken for the measured one
                String at = conditions(r);
                String label = r.name() + (at.isEmpty() ? "" : ", " + at);
                h.append("<tr><td>").append(esc(p.serial())).append("</td><td>").append(esc(label)).append("</td>")
                        .append(withU(r.value(), r.expandedUncertainty(), d)).append("<td>").append(esc(r.spec()))
                        .append("</td><td>").append(esc(r.decisionRule())).append("</td><td>").append(esc(r.zone()))
                        .append("</td><td>").append(si(r.margin(), d)).append("</td><td class=\"")
                        .append(r.pass() ? "pass\">pass" : "fail\">fail").append("</td></tr>");
            }
        }
        h.append("</table>\n");
    }

    private static void warnings(StringBuilder h, List<PartResult> parts) {
        boolean any = false;
        for (PartResult p : parts) {
            if (p.warnings() != null && !p.warnings().isEmpty()) {
                if (!any) {
                    h.append("<h3>Warnings</h3><ul id=\"warnings\">");
                    any = true;
                }
                for (String w : p.warnings()) {
                    h.append("<li class=\"warn\">").append(esc(p.serial())).append(": ").append(esc(w)).append("</li>");
                }
            }
        }
        if (any) {
            h.append("</ul>\n");
        }
    }

    /** Where the people who stand behind the record sign. */
    private static void signOff(StringBuilder h, String disposition) {
        h.append("<h2>Sign-off</h2>\n<table class=\"signoff\" id=\"signoff\"><tr><th>disposition</th><td>")
                .append(esc(disposition.toUpperCase(Locale.ROOT))).append("</td></tr>"
                        + "<tr><th>inspected by</th><td></td></tr><tr><th>approved by</th><td></td></tr>"
                        + "<tr><th>date</th><td></td></tr></table>\n");
    }

    /** Every inspection of the lot and every attempt of every part, with the one that counts marked. */
    private static void attempts(StringBuilder h, List<LotRecord> inspections, List<Attempt> attempts) {
        if (inspections.size() > 1) {
            h.append("<h2>Inspections</h2><table><tr><th>inspection</th><th>started</th><th>reason</th>"
                    + "<th>disposition</th><th>decided</th></tr>");
            for (LotRecord i : inspections) {
                h.append("<tr><td>").append(i.round()).append("</td><td>").append(esc(i.createdAt())).append("</td><td>")
                        .append(esc(i.reason() == null ? "first inspection" : i.reason())).append("</td><td>")
                        .append(esc(i.disposition() == null ? "open" : i.disposition().word())).append("</td><td>")
                        .append(esc(i.finishedAt() == null ? "-" : i.finishedAt())).append("</td></tr>");
            }
            h.append("</table>\n");
        }
        h.append("<h2>Attempts</h2><table><tr><th>inspection</th><th>#</th><th>serial</th><th>attempt</th>"
                + "<th>counts</th><th>verdict</th><th>L</th><th>R_dc</th><th>measured</th><th>operator</th>"
                + "<th>why measured again</th></tr>");
        for (LotRecord i : inspections) {
            List<Attempt> round = attempts.stream().filter(a -> a.round() == i.round()).toList();
            List<Attempt> counting = Attempt.counting(round);
            for (Attempt a : round) {
                h.append("<tr><td>").append(a.round()).append("</td><td>").append(a.position()).append("</td><td>")
                        .append(esc(a.serial())).append("</td><td>").append(a.number()).append("</td><td>")
                        .append(counting.contains(a) ? "yes" : "no (superseded)").append("</td><td class=\"")
                        .append(esc(a.verdict().word())).append("\">").append(esc(a.verdict().word())).append("</td><td>")
                        .append(si(a.inductanceH(), Dimension.INDUCTANCE)).append("</td><td>")
                        .append(si(a.seriesResistanceOhm(), Dimension.RESISTANCE))
                        .append("</td><td>").append(esc(a.measuredAt())).append("</td><td>")
                        .append(esc(String.valueOf(a.operator()))).append("</td><td>")
                        .append(esc(a.reason() == null ? "" : a.reason())).append("</td></tr>");
            }
        }
        h.append("</table>\n");
    }

    private static void limits(StringBuilder h, List<PartResult> parts) throws IOException {
        Map<String, List<PartResult.LimitRecord>> byLimit = new LinkedHashMap<>();
        for (PartResult p : parts) {
            for (PartResult.LimitRecord r : p.limits()) {
                if (r.value() != null) {
                    byLimit.computeIfAbsent(r.name(), k -> new ArrayList<>()).add(r);
                }
            }
        }
        h.append("<h2>Characteristics</h2>\n");
        for (var e : byLimit.entrySet()) {
            List<PartResult.LimitRecord> rs = e.getValue();
            PartResult.LimitRecord first = rs.get(0);
            double[] v = rs.stream().mapToDouble(PartResult.LimitRecord::value).toArray();
            double lo = first.lower() == null ? Double.NEGATIVE_INFINITY : first.lower();
            double hi = first.upper() == null ? Double.POSITIVE_INFINITY : first.upper();
            Capability c = Capability.of(v, lo, hi);
            h.append("<h3>").append(esc(e.getKey())).append("</h3><p>spec ").append(esc(first.spec()))
                    .append(", decision rule ").append(esc(first.decisionRule())).append("; n = ").append(c.n())
                    .append(", mean ").append(si(c.mean(), dimensionOf(first.characteristic()))).append(", s ")
                    .append(si(c.sd(), dimensionOf(first.characteristic()))).append(", Cp ")
                    .append(c.cp() == null ? "-" : String.format(Locale.ROOT, "%.2f", c.cp())).append(", Cpk ")
                    .append(c.cpk() == null ? "-" : String.format(Locale.ROOT, "%.2f", c.cpk())).append("</p>\n");
            double accLo = first.acceptanceLower() == null ? lo : first.acceptanceLower();
            double accHi = first.acceptanceUpper() == null ? hi : first.acceptanceUpper();
            boolean[] pass = new boolean[rs.size()];
            for (int k = 0; k < pass.length; k++) {
                pass[k] = rs.get(k).pass();
            }
            Dimension d = dimensionOf(first.characteristic());
            h.append("<img alt=\"").append(esc(e.getKey())).append(" readings\" src=\"")
                    .append(Charts.sample(e.getKey(), d, v, pass, lo, hi, accLo, accHi)).append("\">\n")
                    .append("<img alt=\"").append(esc(e.getKey())).append(" histogram\" src=\"")
                    .append(Charts.histogram(e.getKey() + ": distribution", d, v, lo, hi, accLo, accHi)).append("\">\n")
                    .append("<p>Circles: pass; crosses: fail. Solid purple lines: tolerance limits; dashed orange:"
                            + " acceptance limits where a guard band moves them.</p>\n");
        }
    }

    /** From this many parts with curves on, the impedance plots are small multiples, not one full chart each. */
    static final int SMALL_MULTIPLES_FROM = 25;

    /** One part's curve: the corrected points and the fitted model on a log frequency grid. */
    private record Curve(PartResult part, double[] f, double[] mag, double[] phase, double[] fm, double[] mm, double[] pm) {
    }

    private static void impedance(StringBuilder h, List<PartResult> parts) throws IOException {
        List<Curve> curves = new ArrayList<>();
        for (PartResult p : parts) {
            if (p.points() == null || p.points().isEmpty() || p.model() == null) {
                continue;
            }
            curves.add(curve(p));
        }
        h.append("<h2>Impedance per part</h2>\n<p>Points: each frequency after the bench's corrections (what the"
                + " model was fitted to); lines: the fitted model. Records kept before corrected points were stored show"
                + " the points as measured.");
        if (curves.size() >= SMALL_MULTIPLES_FROM) {
            h.append(" With ").append(curves.size()).append(" parts, |Z| of each on the same axes, small, so the"
                    + " parts compare at a glance; every part's numbers are in the tables above.</p>\n");
            SmallMultiples.write(h, curves.stream().map(c -> new SmallMultiples.Tile(c.part().serial(),
                    c.part().verdict().word(), c.f(), c.mag(), c.fm(), c.mm())).toList());
            return;
        }
        h.append("</p>\n");
        for (Curve c : curves) {
            PartResult p = c.part();
            h.append("<h3>").append(esc(p.serial())).append(" <span class=\"").append(esc(p.verdict().word())).append("\">")
                    .append(esc(p.verdict().word())).append("</span></h3><img alt=\"impedance of ").append(esc(p.serial()))
                    .append("\" src=\"").append(Charts.impedance(p.serial(), c.f(), c.mag(), c.phase(), c.fm(), c.mm(),
                            c.pm())).append("\">\n");
        }
    }

    private static Curve curve(PartResult p) {
        int n = p.points().size();
        double[] f = new double[n];
        double[] mag = new double[n];
        double[] ph = new double[n];
        for (int i = 0; i < n; i++) {
            var pt = p.points().get(i);
            f[i] = pt.frequencyHz();
            Complex z = pt.correctedResistanceOhm() != null && pt.correctedReactanceOhm() != null
                    ? new Complex(pt.correctedResistanceOhm(), pt.correctedReactanceOhm())
                    : new Complex(pt.resistanceOhm(), pt.reactanceOhm());
            mag[i] = z.abs();
            ph[i] = Math.toDegrees(z.getArgument());
        }
        double[] params = new double[LumpedParameter.values().length];
        for (LumpedParameter q : LumpedParameter.values()) {
            var rec = p.model().parameters().get(q.key());
            params[q.ordinal()] = rec == null ? 0 : rec.value();
        }
        int m = 60;
        double[] fm = new double[m];
        double[] mm = new double[m];
        double[] pm = new double[m];
        for (int i = 0; i < m; i++) {
            fm[i] = f[0] * Math.pow(f[n - 1] / f[0], i / (m - 1.0));
            Complex z = LumpedModel.impedance(params, fm[i]);
            mm[i] = z.abs();
            pm[i] = Math.toDegrees(z.getArgument());
        }
        return new Curve(p, f, mag, ph, fm, mm, pm);
    }

    private static void history(StringBuilder h, List<LotStatistics> lots, String partNumber, String supplier)
            throws IOException {
        // one supplier's lots: a trend mixing suppliers says nothing of either
        h.append("<h2>").append(esc(partNumber)).append(" over time, ").append(supplier.isEmpty() ? "lots without a supplier"
                : "supplier " + esc(supplier)).append("</h2>\n<table><tr><th>lot</th><th>started</th>"
                + "<th>disposition</th><th>measured</th><th>yield</th><th>mean L</th><th>s(L)</th><th>mean R_dc</th>"
                + "<th>s(R_dc)</th></tr>");
        List<String> names = new ArrayList<>();
        double[] mean = new double[lots.size()];
        double[] sd = new double[lots.size()];
        for (int i = 0; i < lots.size(); i++) {
            LotStatistics s = lots.get(i);
            names.add(s.lot());
            mean[i] = s.meanInductanceH() == null ? Double.NaN : s.meanInductanceH();
            sd[i] = s.sdInductanceH() == null ? Double.NaN : s.sdInductanceH();
            h.append("<tr><td>").append(esc(s.lot())).append("</td><td>").append(esc(s.createdAt())).append("</td><td>")
                    .append(esc(s.disposition() == null ? "open" : s.disposition().word())).append("</td><td>").append(s.measured())
                    .append("</td><td>").append(Double.isNaN(s.yield()) ? "-" : String.format(Locale.ROOT, "%.1f %%",
                            100 * s.yield())).append("</td><td>").append(si(s.meanInductanceH(), Dimension.INDUCTANCE))
                    .append("</td><td>").append(si(s.sdInductanceH(), Dimension.INDUCTANCE)).append("</td><td>")
                    .append(si(s.meanResistanceOhm(), Dimension.RESISTANCE)).append("</td><td>")
                    .append(si(s.sdResistanceOhm(), Dimension.RESISTANCE)).append("</td></tr>");
        }
        h.append("</table>\n<img alt=\"inductance per lot\" src=\"")
                .append(Charts.history(partNumber + ": inductance per lot", Dimension.INDUCTANCE, names, mean, sd))
                .append("\">\n");
    }

    private static Dimension dimensionOf(String characteristic) {
        return switch (characteristic) {
            case "inductance" -> Dimension.INDUCTANCE;
            case "series_resistance" -> Dimension.RESISTANCE;
            case "self_resonance" -> Dimension.FREQUENCY;
            default -> Dimension.NONE;
        };
    }

    private static void row(StringBuilder h, String key, String valueHtml) {
        h.append("<tr><th>").append(esc(key)).append("</th><td>").append(valueHtml).append("</td></tr>");
    }

    /** A value with an SI prefix and its unit (the number every command prints), or "-". */
    private static String si(Double v, Dimension d) {
        if (v == null || !Double.isFinite(v)) {
            return "-";
        }
        return esc(Units.format(v, d));
    }

    /** A table cell "value +/- U" with the full-precision value kept in data-value for readers and tests. */
    private static String withU(Double v, Double u, Dimension d) {
        if (v == null || !Double.isFinite(v)) {
            return "<td>-</td>";
        }
        return "<td data-value=\"" + v + "\">" + (u == null || !Double.isFinite(u) || !(u > 0) ? si(v, d)
                : esc(Units.formatWithUncertainty(v, u, d))) + "</td>";
    }

    static String esc(String s) {
        if (s == null) {
            return "";
        }
        return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;");
    }
}
