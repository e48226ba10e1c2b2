package org.lrbench.report;

import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import java.io.IOException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.LumpedModel;
import org.lrbench.analysis.LumpedParameter;
import org.lrbench.results.PartResult;
import org.lrbench.store.LotRecord;
import org.lrbench.store.LotStatistics;
import org.lrbench.results.Attempt;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;
import org.lrbench.store.ResultStore;

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
        h.append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><title>Lot ").append(esc(lot))
                .append("</title><style>body{font-family:sans-serif;margin:2em;max-width:60em;color:#222}"
                        + "table{border-collapse:collapse;margin:.5em 0}td,th{border:1px solid #bbb;padding:.2em .6em;"
                        + "text-align:left}th{background:#eee}.reject,.fail{color:#a00;font-weight:bold}"
                        + ".accept,.pass{color:#060;font-weight:bold}img{max-width:100%}</style></head><body>\n");
        h.append("<h1>Lot ").append(esc(lot)).append(" &mdash; ").append(esc(l.partNumber())).append("</h1>\n");
        String disp = l.disposition() == null ? "open" : l.disposition();
        h.append("<table>");
        row(h, "disposition", "<span class=\"" + esc(disp) + "\">" + esc(disp.toUpperCase(Locale.ROOT)) + "</span>"
                + (l.dispositionReason() == null ? "" : " &mdash; " + esc(l.dispositionReason())));
        row(h, "lot size / sample", l.lotSize() + " / " + l.sampleSize());
        if (l.round() > 1) {
            row(h, "inspection", "re-inspection " + l.round() + " &mdash; " + esc(l.reason()));
        }
        row(h, "parts measured", l.measured() + " (" + l.passed() + " pass, " + l.failed() + " fail, " + l.errors()
                + " error)" + (l.skipped() > 0 ? "; " + l.skipped() + " position(s) skipped, not measured" : ""));
        row(h, "attempts stored", l.attempts() + " (every measurement is kept; the latest attempt of a part counts)");
        row(h, "operator", esc(String.valueOf(l.operator())));
        row(h, "plan", esc(l.planPath()) + "<br>SHA-256 " + esc(l.planSha256()));
        row(h, "bench", esc(l.bench()));
        row(h, "started / finished", esc(l.createdAt()) + " / " + esc(l.finishedAt() == null ? "-" : l.finishedAt()));
        h.append("</table>\n");
        limits(h, parts);
        impedance(h, parts);
        history(h, store.history(l.partNumber()), l.partNumber());
        h.append("<h2>Parts</h2><table><tr><th>#</th><th>serial</th><th>verdict</th><th>L &plusmn; U (k = 2)</th>"
                + "<th>R_dc &plusmn; U (k = 2)</th><th>reason</th></tr>");
        int i = 1;
        for (PartResult p : parts) {
            h.append("<tr><td>").append(i++).append("</td><td>").append(esc(p.serial())).append("</td><td class=\"")
                    .append(esc(p.verdict())).append("\">").append(esc(p.verdict())).append("</td>")
                    .append(withU(p.inductanceH(), p.inductanceExpandedUncertaintyH(), Dimension.INDUCTANCE))
                    .append(withU(p.seriesResistanceOhm(), p.seriesResistanceExpandedUncertaintyOhm(), Dimension.RESISTANCE))
                    .append("<td>").append(esc(p.error() != null ? p.error() : String.join("; ", p.failedLimits())))
                    .append("</td></tr>");
        }
        h.append("</table>\n");
        attempts(h, inspections, attempts);
        h.append("<p>Written by lrbench from the results store. Hash chain head SHA-256 ")
                .append(esc(String.valueOf(store.chainHead(lot)))).append("; check the records with lrbench verify.</p>")
                .append("</body></html>\n");
        return h.toString();
    }

    /** Every inspection of the lot and every attempt of every part, with the one that counts marked. */
    private static void attempts(StringBuilder h, List<LotRecord> inspections, List<Attempt> attempts) {
        if (inspections.size() > 1) {
            h.append("<h2>Inspections</h2><table><tr><th>inspection</th><th>started</th><th>reason</th>"
                    + "<th>disposition</th><th>decided</th></tr>");
            for (LotRecord i : inspections) {
                h.append("<tr><td>").append(i.round()).append("</td><td>").append(esc(i.createdAt())).append("</td><td>")
                        .append(esc(i.reason() == null ? "first inspection" : i.reason())).append("</td><td>")
                        .append(esc(i.disposition() == null ? "open" : i.disposition())).append("</td><td>")
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
                        .append(esc(a.verdict())).append("\">").append(esc(a.verdict())).append("</td><td>")
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
                    .append(", mean ").append(fmt(c.mean())).append(", s ").append(fmt(c.sd())).append(", Cp ")
                    .append(c.cp() == null ? "-" : String.format(Locale.ROOT, "%.2f", c.cp())).append(", Cpk ")
                    .append(c.cpk() == null ? "-" : String.format(Locale.ROOT, "%.2f", c.cpk())).append("</p>\n");
            double accLo = first.acceptanceLower() == null ? lo : first.acceptanceLower();
            double accHi = first.acceptanceUpper() == null ? hi : first.acceptanceUpper();
            h.append("<img alt=\"").append(esc(e.getKey())).append(" readings\" src=\"")
                    .append(Charts.sample(e.getKey(), unitOf(first.characteristic()), v, lo, hi, accLo, accHi))
                    .append("\">\n<p>Red: tolerance limits; orange dashed: acceptance limits where a guard band"
                            + " moves them.</p>\n");
        }
    }

    private static void impedance(StringBuilder h, List<PartResult> parts) throws IOException {
        h.append("<h2>Impedance per part</h2>\n<p>Points as measured, before bench corrections; lines: the fitted"
                + " model (after corrections).</p>\n");
        for (PartResult p : parts) {
            if (p.points() == null || p.points().isEmpty() || p.model() == null) {
                continue;
            }
            int n = p.points().size();
            double[] f = new double[n];
            double[] mag = new double[n];
            double[] ph = new double[n];
            for (int i = 0; i < n; i++) {
                var pt = p.points().get(i);
                f[i] = pt.frequencyHz();
                Complex z = new Complex(pt.resistanceOhm(), pt.reactanceOhm());
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
            h.append("<h3>").append(esc(p.serial())).append(" <span class=\"").append(esc(p.verdict())).append("\">")
                    .append(esc(p.verdict())).append("</span></h3><img alt=\"impedance of ").append(esc(p.serial()))
                    .append("\" src=\"").append(Charts.impedance(p.serial(), f, mag, ph, fm, mm, pm)).append("\">\n");
        }
    }

    private static void history(StringBuilder h, List<LotStatistics> lots, String partNumber) throws IOException {
        h.append("<h2>").append(esc(partNumber)).append(" over time</h2>\n<table><tr><th>lot</th><th>started</th>"
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
                    .append(esc(s.disposition() == null ? "open" : s.disposition())).append("</td><td>").append(s.measured())
                    .append("</td><td>").append(Double.isNaN(s.yield()) ? "-" : String.format(Locale.ROOT, "%.1f %%",
                            100 * s.yield())).append("</td><td>").append(si(s.meanInductanceH(), Dimension.INDUCTANCE))
                    .append("</td><td>").append(si(s.sdInductanceH(), Dimension.INDUCTANCE)).append("</td><td>")
                    .append(si(s.meanResistanceOhm(), Dimension.RESISTANCE)).append("</td><td>")
                    .append(si(s.sdResistanceOhm(), Dimension.RESISTANCE)).append("</td></tr>");
        }
        h.append("</table>\n<img alt=\"inductance per lot\" src=\"")
                .append(Charts.history(partNumber + ": inductance per lot", "H", names, mean, sd)).append("\">\n");
    }

    private static String unitOf(String characteristic) {
        return switch (characteristic) {
            case "inductance" -> "H";
            case "series_resistance" -> "ohm";
            case "self_resonance" -> "Hz";
            default -> "";
        };
    }

    private static void row(StringBuilder h, String key, String valueHtml) {
        h.append("<tr><th>").append(esc(key)).append("</th><td>").append(valueHtml).append("</td></tr>");
    }

    /** A value with an SI prefix and its unit (the number every command prints), or "-". */
    private static String si(Double v, Dimension d) {
        return v == null || !Double.isFinite(v) ? "-" : esc(Units.format(v, d));
    }

    /** A table cell "value +/- U" with the full-precision value kept in data-value for readers and tests. */
    private static String withU(Double v, Double u, Dimension d) {
        if (v == null || !Double.isFinite(v)) {
            return "<td>-</td>";
        }
        return "<td data-value=\"" + v + "\">" + si(v, d) + (u == null || !Double.isFinite(u) ? "" : " &plusmn; " + si(u, d))
                + "</td>";
    }

    private static String fmt(Double v) {
        return v == null || !Double.isFinite(v) ? "-" : String.format(Locale.ROOT, "%.5g", v);
    }

    static String esc(String s) {
        if (s == null) {
            return "";
        }
        return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;");
    }
}
