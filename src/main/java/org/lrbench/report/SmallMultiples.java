package org.lrbench.report;

import java.util.List;
import java.util.Locale;

/**
 * Many parts' |Z| against frequency as small multiples: one small inline SVG per part, every one on the
 * same log-log axes (the lot's whole range), so a part whose curve departs from the others shows at a
 * glance, and a lot of hundreds of parts stays a few pages and a few hundred kilobytes. The axes' range is
 * written once above the grid; each tile carries its serial and verdict in words.
 */
final class SmallMultiples {
    private static final int W = 150;
    private static final int H = 84;
    private static final int PAD = 4;

    /** One part's tile: its serial, verdict word, measured points and model curve. */
    record Tile(String serial, String verdict, double[] f, double[] mag, double[] fm, double[] mm) {
    }

    private SmallMultiples() {
    }

    static void write(StringBuilder h, List<Tile> tiles) {
        double fLo = Double.POSITIVE_INFINITY;
        double fHi = 0;
        double zLo = Double.POSITIVE_INFINITY;
        double zHi = 0;
        for (Tile t : tiles) {
            for (double[][] xy : new double[][][] {{t.f(), t.mag()}, {t.fm(), t.mm()}}) {
                for (int i = 0; i < xy[0].length; i++) {
                    if (xy[0][i] > 0 && xy[1][i] > 0 && Double.isFinite(xy[1][i])) {
                        fLo = Math.min(fLo, xy[0][i]);
                        fHi = Math.max(fHi, xy[0][i]);
                        zLo = Math.min(zLo, xy[1][i]);
                        zHi = Math.max(zHi, xy[1][i]);
                    }
                }
            }
        }
        if (!(fHi > fLo) || !(zHi > zLo)) {
            return;
        }
        double lf0 = Math.log10(fLo);
        double lf1 = Math.log10(fHi);
        double lz0 = Math.log10(zLo) - 0.05;
        double lz1 = Math.log10(zHi) + 0.05;
        h.append("<p class=\"axes\">Every tile: frequency ").append(LotReport.esc(org.lrbench.units.Units.format(fLo,
                org.lrbench.units.Dimension.FREQUENCY))).append(" to ").append(LotReport.esc(org.lrbench.units.Units.format(
                fHi, org.lrbench.units.Dimension.FREQUENCY))).append(" across (log), |Z| ")
                .append(LotReport.esc(org.lrbench.units.Units.format(Math.pow(10, lz0), org.lrbench.units.Dimension.RESISTANCE)))
                .append(" to ").append(LotReport.esc(org.lrbench.units.Units.format(Math.pow(10, lz1),
                        org.lrbench.units.Dimension.RESISTANCE))).append(" up (log); dots measured, line the model.</p>\n")
                .append("<div class=\"multiples\">\n");
        for (Tile t : tiles) {
            h.append("<figure><svg viewBox=\"0 0 ").append(W).append(' ').append(H).append("\" width=\"").append(W)
                    .append("\" height=\"").append(H).append("\" role=\"img\" aria-label=\"|Z| of ")
                    .append(LotReport.esc(t.serial())).append("\"><rect x=\"0.5\" y=\"0.5\" width=\"").append(W - 1)
                    .append("\" height=\"").append(H - 1).append("\" fill=\"none\" stroke=\"#bbb\"/><polyline fill=\"none\""
                            + " stroke=\"#444\" stroke-width=\"1\" points=\"");
            for (int i = 0; i < t.fm().length; i++) {
                if (t.mm()[i] > 0 && Double.isFinite(t.mm()[i])) {
                    h.append(x(t.fm()[i], lf0, lf1)).append(',').append(y(t.mm()[i], lz0, lz1)).append(' ');
                }
            }
            h.append("\"/>");
            for (int i = 0; i < t.f().length; i++) {
                if (t.mag()[i] > 0 && Double.isFinite(t.mag()[i])) {
                    h.append("<circle r=\"1.8\" cx=\"").append(x(t.f()[i], lf0, lf1)).append("\" cy=\"")
                            .append(y(t.mag()[i], lz0, lz1)).append("\"/>");
                }
            }
            h.append("</svg><figcaption>").append(LotReport.esc(t.serial())).append(" <span class=\"")
                    .append(LotReport.esc(t.verdict())).append("\">").append(LotReport.esc(t.verdict()))
                    .append("</span></figcaption></figure>\n");
        }
        h.append("</div>\n");
    }

    private static String x(double f, double lf0, double lf1) {
        return String.format(Locale.ROOT, "%.1f", PAD + (W - 2 * PAD) * (Math.log10(f) - lf0) / (lf1 - lf0));
    }

    private static String y(double z, double lz0, double lz1) {
        return String.format(Locale.ROOT, "%.1f", H - PAD - (H - 2 * PAD) * (Math.log10(z) - lz0) / (lz1 - lz0));
    }
}
