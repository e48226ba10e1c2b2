package org.lrbench.report;

import java.io.IOException;
import java.util.List;
import org.lrbench.study.ControlChart;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/** The check standard's control chart as one self-contained HTML page, rewritten after every check. */
public final class ControlChartPage {

    private ControlChartPage() {
    }

    public static String html(String bench, String serial, double certified, double certifiedExpanded,
                              List<String> takenAt, double[] values, ControlChart.State state) throws IOException {
        StringBuilder h = new StringBuilder("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>Check standard ")
                .append(LotReport.esc(serial)).append(" on ").append(LotReport.esc(bench)).append("</title><style>")
                .append("body{font-family:sans-serif;max-width:60rem;margin:1rem auto;color:#222}img{max-width:100%}")
                .append("table{border-collapse:collapse}td,th{border:1px solid #bbb;padding:.2rem .5rem}")
                .append(".ok{color:#1b4f8c;font-weight:bold}.no{color:#7b2d8e;font-weight:bold}</style></head><body>");
        h.append("<h1>Check standard ").append(LotReport.esc(serial)).append(" on bench ").append(LotReport.esc(bench)).append("</h1>");
        h.append("<p>Certified ").append(LotReport.esc(Units.formatWithUncertainty(certified, certifiedExpanded,
                Dimension.INDUCTANCE))).append(" (U, k = 2). Limits ")
                .append(state.fromHistory() ? "from the check's own history (individuals chart)" : "from the certificate"
                        + " and each reading's uncertainty (normalized error)").append(": ")
                .append(Units.format(state.lower(), Dimension.INDUCTANCE)).append(" to ")
                .append(Units.format(state.upper(), Dimension.INDUCTANCE)).append(".</p>");
        h.append("<p class=\"").append(state.inControl() ? "ok" : "no").append("\">")
                .append(state.inControl() ? "In control" : "Out of control: lot runs on this bench are refused")
                .append("</p><p>").append(LotReport.esc(state.reason())).append("</p>");
        h.append("<img alt=\"individuals chart\" src=\"").append(Charts.individuals("Check standard " + serial,
                Dimension.INDUCTANCE, values, state.centre(), state.lower(), state.upper())).append("\">");
        h.append("<table><tr><th>#</th><th>taken at</th><th>inductance</th><th>less the certified value</th></tr>");
        for (int i = 0; i < values.length; i++) {
            h.append("<tr><td>").append(i + 1).append("</td><td>").append(LotReport.esc(takenAt.get(i))).append("</td><td>")
                    .append(Units.format(values[i], Dimension.INDUCTANCE)).append("</td><td>")
                    .append(Units.format(values[i] - certified, Dimension.INDUCTANCE)).append("</td></tr>");
        }
        return h.append("</table></body></html>\n").toString();
    }
}
