package org.lrbench.report;

import java.io.IOException;
import java.util.List;
import java.util.Locale;
import org.lrbench.study.GaugeStudy;
import org.lrbench.study.TypeOneStudy;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * The measurement system study as one self-contained HTML page: what was studied and on which
 * benches, the analysis-of-variance table, the variance components with their shares, %GRR,
 * ndc, the type-1 figures, the acceptance reached or not, and the plots (readings by part and
 * bench, the type-1 run chart with the reference and +/- 10 % of the tolerance).
 */
public final class StudyPage {

    private StudyPage() {
    }

    /** What the page shows. */
    public record Content(String plan, String characteristic, boolean simulated, List<String> benches, double[][][] readings,
                          GaugeStudy.Result crossed, double[] typeOneReadings, double reference, TypeOneStudy.Result typeOne,
                          String when) {
    }

    public static String html(Content c) throws IOException {
        GaugeStudy.Result g = c.crossed();
        TypeOneStudy.Result t = c.typeOne();
        StringBuilder h = new StringBuilder();
        h.append("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>Measurement system study: ")
                .append(LotReport.esc(c.characteristic())).append("</title><style>")
                .append("body{font-family:sans-serif;max-width:60rem;margin:1rem auto;color:#222}")
                .append("table{border-collapse:collapse;margin:.5rem 0}td,th{border:1px solid #bbb;padding:.2rem .5rem;text-align:right}")
                .append("th{background:#eef}td:first-child,th:first-child{text-align:left}.banner{background:#fff3cd;padding:.5rem;border:1px solid #e0c060}")
                .append("img{max-width:100%}.ok{color:#1b4f8c;font-weight:bold}.no{color:#7b2d8e;font-weight:bold}")
                .append("</style></head><body>");
        h.append("<h1>Measurement system study</h1>");
        if (c.simulated()) {
            h.append("<p class=\"banner\">Measured on the simulated bench: these figures show the method and the simulated"
                    + " instruments, not a real bench.</p>");
        }
        h.append("<p>Characteristic <b>").append(LotReport.esc(c.characteristic())).append("</b> of plan ")
                .append(LotReport.esc(c.plan())).append("; appraisers: ").append(LotReport.esc(String.join(", ", c.benches())))
                .append("; ").append(c.readings().length).append(" parts, ").append(c.readings()[0][0].length)
                .append(" trials each; ").append(LotReport.esc(c.when())).append(".</p>");
        h.append("<h2>Crossed study (analysis of variance)</h2><table><tr><th>source</th><th>df</th><th>SS (H&sup2;)</th>"
                + "<th>MS (H&sup2;)</th><th>F</th><th>p</th></tr>");
        for (GaugeStudy.Row r : g.table()) {
            h.append("<tr><td>").append(LotReport.esc(r.source())).append("</td><td>").append(r.df()).append("</td><td>")
                    .append(num(r.sumOfSquares())).append("</td><td>").append(num(r.meanSquare())).append("</td><td>")
                    .append(num(r.f())).append("</td><td>").append(num(r.p())).append("</td></tr>");
        }
        h.append("</table>");
        h.append("<table><tr><th>component</th><th>standard deviation</th><th>% of total variation</th>"
                + "<th>% of tolerance (6 sigma)</th></tr>");
        component(h, "repeatability", g.repeatability(), g);
        component(h, "reproducibility (appraisers)", g.appraiser(), g);
        component(h, "appraiser &times; part", g.interaction(), g);
        component(h, "GRR", g.grr(), g);
        component(h, "part to part", g.part(), g);
        h.append("</table><p>Number of distinct categories: <b>").append(g.distinctCategories()).append("</b>")
                .append(g.interactionPooled() ? "; the appraiser &times; part interaction was not significant (p &gt; 0.25)"
                        + " and is pooled into repeatability" : "").append(".</p>");
        h.append("<img alt=\"readings by part and bench\" src=\"")
                .append(Charts.byPart("Readings by part and bench", Dimension.INDUCTANCE, c.benches(), c.readings()))
                .append("\">");
        if (t != null) {
        h.append("<h2>Type-1 study</h2><p>").append(t.n()).append(" readings of a reference part of ")
                .append(Units.format(c.reference(), Dimension.INDUCTANCE)).append(" on ").append(LotReport.esc(c.benches().get(0)))
                .append(": mean ").append(Units.format(t.mean(), Dimension.INDUCTANCE)).append(", s ")
                .append(Units.format(t.standardDeviation(), Dimension.INDUCTANCE)).append(", bias ")
                .append(Units.format(t.bias(), Dimension.INDUCTANCE))
                .append(String.format(Locale.ROOT, " (t-test p = %.3g); Cg <b>%.2f</b>, Cgk <b>%.2f</b>.</p>", t.biasPValue(),
                        t.cg(), t.cgk()));
        h.append("<img alt=\"type-1 run chart\" src=\"")
                .append(Charts.run("Type-1 readings less the reference (\u00b110 % of the tolerance: \u00b1"
                        + Units.format(0.1 * g.tolerance(), Dimension.INDUCTANCE) + ")", Dimension.INDUCTANCE,
                        c.typeOneReadings(), c.reference(), 0.1 * g.tolerance()))
                .append("\">");
        }
        boolean fit = g.acceptable() && (t == null || t.capable());
        h.append("<h2>Acceptance</h2><p class=\"").append(fit ? "ok" : "no").append("\">")
                .append(fit ? "Fit for this characteristic" : "Not shown fit for this characteristic")
                .append("</p><p>Wanted: %GRR of the tolerance at most 10 %, at least 5 distinct categories")
                .append(t == null ? " (no type-1 study in this page)" : ", Cg and Cgk at least 1.33")
                .append(" (the usual acceptance; a lab may set its own).</p></body></html>\n");
        return h.toString();
    }

    private static void component(StringBuilder h, String name, double variance, GaugeStudy.Result g) {
        double sd = Math.sqrt(variance);
        h.append("<tr><td>").append(name).append("</td><td>").append(Units.format(sd, Dimension.INDUCTANCE))
                .append("</td><td>").append(String.format(Locale.ROOT, "%.2f %%", 100 * Math.sqrt(variance / g.total())))
                .append("</td><td>").append(g.tolerance() > 0 ? String.format(Locale.ROOT, "%.2f %%", 100 * 6 * sd / g.tolerance()) : "")
                .append("</td></tr>");
    }

    private static String num(double v) {
        return Double.isNaN(v) ? "" : String.format(Locale.ROOT, "%.4g", v);
    }
}
