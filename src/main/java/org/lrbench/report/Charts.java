package org.lrbench.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Graphics2D;
import java.awt.Shape;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Path2D;
import java.awt.geom.Rectangle2D;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.util.ArrayList;
import java.util.Base64;
import java.util.List;
import org.jfree.chart.ChartFactory;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.AxisState;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.NumberTick;
import org.jfree.chart.axis.SymbolAxis;
import org.jfree.chart.axis.ValueTick;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.chart.ui.TextAnchor;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * Report charts drawn with JFreeChart and embedded as PNG data, so the report needs no network.
 * One palette of our own, chosen so that readers with the common colour-vision deficiencies can
 * still tell the hues apart (dark blue, orange, sky blue, purple, with black): pass and fail differ in
 * shape as well as colour (filled circle, cross). Axes carry SI prefixes; logarithmic axes are
 * ticked 1-2-5 in every decade.
 */
final class Charts {
    static final int WIDTH = 640;
    static final int HEIGHT = 300;
    /** Measured data: dark blue. */
    static final Color DATA = new Color(0x1B, 0x4F, 0x8C);
    /** Model lines and acceptance limits: orange. */
    static final Color MODEL = new Color(0xD9, 0x7A, 0x00);
    /** Second quantity (phase), second series: sky blue. */
    static final Color SECOND = new Color(0x4A, 0xA8, 0xD8);
    /** Failures and tolerance limits: purple, never alone (a cross, or a solid line). */
    static final Color FAIL = new Color(0x7B, 0x2D, 0x8E);
    static final Shape PASS_SHAPE = new Ellipse2D.Double(-3.5, -3.5, 7, 7);
    static final Shape FAIL_SHAPE = cross(5);

    private Charts() {
    }

    /**
     * The sample's values in measuring order, pass and fail as different shapes, with the
     * tolerance limits (solid) and acceptance limits (dashed) as lines.
     */
    static String sample(String title, Dimension unit, double[] values, boolean[] pass, double lower, double upper,
                         double accLower, double accUpper) throws IOException {
        XYSeries ok = new XYSeries("pass");
        XYSeries bad = new XYSeries("fail");
        for (int i = 0; i < values.length; i++) {
            (pass[i] ? ok : bad).add(i + 1, values[i]);
        }
        XYSeriesCollection d = new XYSeriesCollection();
        d.addSeries(ok);
        d.addSeries(bad);
        JFreeChart c = ChartFactory.createScatterPlot(title, "part (measuring order)", axisLabel(unit), d,
                PlotOrientation.VERTICAL, true, false, false);
        XYPlot p = c.getXYPlot();
        p.getDomainAxis().setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        p.setRangeAxis(siAxis(axisLabel(unit), unit));
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(false, true);
        r.setSeriesShape(0, PASS_SHAPE);
        r.setSeriesPaint(0, DATA);
        r.setSeriesShape(1, FAIL_SHAPE);
        r.setSeriesPaint(1, FAIL);
        p.setRenderer(r);
        limits(p, lower, upper, accLower, accUpper, false);
        return png(c);
    }

    /**
     * A histogram of a characteristic with its tolerance limits (solid) and acceptance limits
     * (dashed) as vertical lines; bins by the square-root rule, widened to take in the limits.
     */
    static String histogram(String title, Dimension unit, double[] values, double lower, double upper, double accLower,
                            double accUpper) throws IOException {
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        for (double v : values) {
            min = Math.min(min, v);
            max = Math.max(max, v);
        }
        for (double v : new double[] {lower, upper}) {
            if (Double.isFinite(v)) {
                min = Math.min(min, v);
                max = Math.max(max, v);
            }
        }
        int bins = Math.max(5, (int) Math.ceil(Math.sqrt(values.length)) * 2);
        double width = max > min ? (max - min) / bins : Math.max(Math.abs(min) * 1e-3, 1e-30);
        XYSeries s = new XYSeries("parts");
        int[] count = new int[bins + 1];
        for (double v : values) {
            count[(int) Math.min(bins, Math.floor((v - min) / width))]++;
        }
        for (int i = 0; i <= bins; i++) {
            s.add(min + (i + 0.5) * width, count[i]);
        }
        XYSeriesCollection d = new XYSeriesCollection(s);
        d.setAutoWidth(false);
        d.setIntervalWidth(width);
        JFreeChart c = ChartFactory.createXYBarChart(title, axisLabel(unit), false, "parts", d,
                PlotOrientation.VERTICAL, false, false, false);
        XYPlot p = c.getXYPlot();
        p.setDomainAxis(siAxis(axisLabel(unit), unit));
        p.getRangeAxis().setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        XYBarRenderer r = (XYBarRenderer) p.getRenderer();
        r.setSeriesPaint(0, DATA);
        r.setShadowVisible(false);
        r.setDrawBarOutline(true);
        r.setSeriesOutlinePaint(0, Color.WHITE);
        r.setBarPainter(new org.jfree.chart.renderer.xy.StandardXYBarPainter());
        limits(p, lower, upper, accLower, accUpper, true);
        return png(c);
    }

    /**
     * |Z| and phase against frequency: the corrected points (the same basis as the model) as
     * shapes, the fitted model as lines; logarithmic axes ticked 1-2-5 with SI prefixes.
     */
    static String impedance(String title, double[] f, double[] mag, double[] phaseDeg, double[] fm, double[] magModel,
                            double[] phaseModel) throws IOException {
        XYSeriesCollection magnitude = new XYSeriesCollection();
        magnitude.addSeries(series("|Z| measured", f, mag));
        magnitude.addSeries(series("|Z| model", fm, magModel));
        JFreeChart c = ChartFactory.createXYLineChart(title, "frequency", "|Z|", magnitude,
                PlotOrientation.VERTICAL, true, false, false);
        XYPlot p = c.getXYPlot();
        p.setDomainAxis(new EngineeringLogAxis("frequency", Dimension.FREQUENCY));
        p.setRangeAxis(new EngineeringLogAxis("|Z|", Dimension.RESISTANCE));
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer();
        r.setSeriesLinesVisible(0, false);
        r.setSeriesShape(0, PASS_SHAPE);
        r.setSeriesPaint(0, DATA);
        r.setSeriesShapesVisible(1, false);
        r.setSeriesPaint(1, DATA);
        r.setSeriesStroke(1, new BasicStroke(1.6f));
        p.setRenderer(r);
        XYSeriesCollection phase = new XYSeriesCollection();
        phase.addSeries(series("phase measured", f, phaseDeg));
        phase.addSeries(series("phase model", fm, phaseModel));
        p.setDataset(1, phase);
        NumberAxis deg = new NumberAxis("phase (degrees)");
        deg.setAutoRangeIncludesZero(false);
        p.setRangeAxis(1, deg);
        p.mapDatasetToRangeAxis(1, 1);
        XYLineAndShapeRenderer r2 = new XYLineAndShapeRenderer();
        r2.setSeriesLinesVisible(0, false);
        r2.setSeriesShape(0, new Rectangle2D.Double(-3, -3, 6, 6));
        r2.setSeriesPaint(0, MODEL);
        r2.setSeriesShapesVisible(1, false);
        r2.setSeriesPaint(1, MODEL);
        r2.setSeriesStroke(1, new BasicStroke(1.6f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
                new float[] {6f, 3f}, 0f));
        p.setRenderer(1, r2);
        return png(c);
    }

    /**
     * A part number's lots in the order they were started, each named on the x axis: mean with
     * +/- one standard deviation, the y range fitted to the data (not from zero) so the variation shows.
     */
    static String history(String title, Dimension unit, List<String> lots, double[] mean, double[] sd) throws IOException {
        XYSeries m = new XYSeries("mean");
        XYSeries hi = new XYSeries("mean + s");
        XYSeries lo = new XYSeries("mean - s");
        for (int i = 0; i < lots.size(); i++) {
            if (!Double.isFinite(mean[i])) {
                continue;
            }
            m.add(i, mean[i]);
            if (Double.isFinite(sd[i])) {
                hi.add(i, mean[i] + sd[i]);
                lo.add(i, mean[i] - sd[i]);
            }
        }
        XYSeriesCollection d = new XYSeriesCollection();
        d.addSeries(m);
        d.addSeries(hi);
        d.addSeries(lo);
        JFreeChart c = ChartFactory.createXYLineChart(title, "lot (in the order started)", axisLabel(unit), d,
                PlotOrientation.VERTICAL, true, false, false);
        XYPlot p = c.getXYPlot();
        SymbolAxis x = new SymbolAxis("lot (in the order started)", lots.toArray(new String[0]));
        x.setGridBandsVisible(false);
        x.setVerticalTickLabels(lots.size() > 6);
        x.setRange(-0.5, Math.max(0.5, lots.size() - 0.5));
        if (lots.size() > 25) {
            // many lots: every k-th named, so the names stay readable (every lot keeps its point and its table row)
            x.setAutoTickUnitSelection(false);
            x.setTickUnit(new org.jfree.chart.axis.NumberTickUnit(Math.ceil(lots.size() / 25.0)));
        }
        p.setDomainAxis(x);
        NumberAxis y = siAxis(axisLabel(unit), unit);
        p.setRangeAxis(y);
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, true);
        r.setSeriesPaint(0, DATA);
        r.setSeriesShape(0, PASS_SHAPE);
        r.setSeriesStroke(0, new BasicStroke(1.6f));
        for (int s = 1; s <= 2; s++) {
            r.setSeriesPaint(s, SECOND);
            r.setSeriesShape(s, new Rectangle2D.Double(-6, -1, 12, 2));
            r.setSeriesStroke(s, new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
                    new float[] {4f, 3f}, 0f));
        }
        p.setRenderer(r);
        return png(c);
    }

    /**
     * A study's readings: each part on the horizontal axis, each appraiser's readings beside it
     * (offset a little), in its own colour and shape.
     */
    static String byPart(String title, Dimension unit, List<String> appraisers, double[][][] y) throws IOException {
        XYSeriesCollection d = new XYSeriesCollection();
        int a = appraisers.size();
        for (int j = 0; j < a; j++) {
            XYSeries s = new XYSeries(appraisers.get(j), false);
            for (int i = 0; i < y.length; i++) {
                for (double v : y[i][j]) {
                    s.add(i + 1 + 0.5 * (j - (a - 1) / 2.0) / a, v);
                }
            }
            d.addSeries(s);
        }
        JFreeChart c = ChartFactory.createScatterPlot(title, "part", axisLabel(unit), d, PlotOrientation.VERTICAL, true,
                false, false);
        XYPlot p = c.getXYPlot();
        p.getDomainAxis().setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        p.setRangeAxis(siAxis(axisLabel(unit), unit));
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(false, true);
        Color[] colours = {DATA, MODEL, SECOND, FAIL};
        Shape[] shapes = {PASS_SHAPE, FAIL_SHAPE, new java.awt.Rectangle(-3, -3, 6, 6), PASS_SHAPE};
        for (int j = 0; j < a; j++) {
            r.setSeriesPaint(j, colours[j % colours.length]);
            r.setSeriesShape(j, shapes[j % shapes.length]);
        }
        p.setRenderer(r);
        return png(c);
    }

    /**
     * Readings less the reference value in measuring order, with zero (solid) and, where they are no
     * farther than ten times the readings' spread, the band +/- {@code band} (dashed): a band far
     * outside would flatten the readings into a line.
     */
    static String run(String title, Dimension unit, double[] values, double reference, double band) throws IOException {
        XYSeries s = new XYSeries("reading", false);
        double spread = 0;
        for (int i = 0; i < values.length; i++) {
            s.add(i + 1, values[i] - reference);
            spread = Math.max(spread, Math.abs(values[i] - reference));
        }
        JFreeChart c = ChartFactory.createScatterPlot(title, "reading (measuring order)", "reading less the reference ("
                        + unit.symbol() + ")",
                new XYSeriesCollection(s), PlotOrientation.VERTICAL, false, false, false);
        XYPlot p = c.getXYPlot();
        p.getDomainAxis().setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        p.setRangeAxis(siAxis(axisLabel(unit), unit));
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, true);
        r.setSeriesPaint(0, DATA);
        r.setSeriesShape(0, PASS_SHAPE);
        p.setRenderer(r);
        p.getRangeAxis().setLabel("reading less the reference (" + unit.symbol() + ")");
        mark(p, 0, MODEL, false, false);
        if (band <= 10 * spread) {
            mark(p, -band, MODEL, true, false);
            mark(p, band, MODEL, true, false);
        }
        return png(c);
    }

    /**
     * An individuals chart: readings in order less the centre, zero (solid) and the control limits
     * (dashed), the axis wide enough to show the limits.
     */
    static String individuals(String title, Dimension unit, double[] values, double centre, double lower, double upper)
            throws IOException {
        XYSeries s = new XYSeries("reading", false);
        double lo = lower - centre;
        double hi = upper - centre;
        for (int i = 0; i < values.length; i++) {
            s.add(i + 1, values[i] - centre);
            lo = Math.min(lo, values[i] - centre);
            hi = Math.max(hi, values[i] - centre);
        }
        JFreeChart c = ChartFactory.createScatterPlot(title, "check (in order)", "reading less the centre",
                new XYSeriesCollection(s), PlotOrientation.VERTICAL, false, false, false);
        XYPlot p = c.getXYPlot();
        p.getDomainAxis().setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        NumberAxis y = siAxis("reading less the centre (" + unit.symbol() + ")", unit);
        double pad = 0.1 * (hi - lo);
        if (pad > 0) {
            y.setRange(lo - pad, hi + pad);
        }
        p.setRangeAxis(y);
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, true);
        r.setSeriesPaint(0, DATA);
        r.setSeriesShape(0, PASS_SHAPE);
        p.setRenderer(r);
        mark(p, 0, MODEL, false, false);
        mark(p, lower - centre, FAIL, true, false);
        mark(p, upper - centre, FAIL, true, false);
        return png(c);
    }

    private static String axisLabel(Dimension unit) {
        return unit == null || unit == Dimension.NONE ? "value" : "value (" + unit.symbol() + ")";
    }

    /** A linear axis whose labels carry SI prefixes (1.012 m, not 0.001012), range from the data. */
    private static NumberAxis siAxis(String label, Dimension unit) {
        NumberAxis a = new NumberAxis(label);
        a.setAutoRangeIncludesZero(false);
        if (unit != null) {
            a.setNumberFormatOverride(new SiFormat(unit));
        }
        return a;
    }

    private static void limits(XYPlot p, double lower, double upper, double accLower, double accUpper, boolean vertical) {
        mark(p, lower, FAIL, false, vertical);
        mark(p, upper, FAIL, false, vertical);
        if (accLower != lower) {
            mark(p, accLower, MODEL, true, vertical);
        }
        if (accUpper != upper) {
            mark(p, accUpper, MODEL, true, vertical);
        }
    }

    private static XYSeries series(String name, double[] x, double[] y) {
        XYSeries s = new XYSeries(name, false);
        for (int i = 0; i < x.length; i++) {
            if (Double.isFinite(x[i]) && Double.isFinite(y[i])) {
                s.add(x[i], y[i]);
            }
        }
        return s;
    }

    private static void mark(XYPlot p, double v, Color color, boolean dashed, boolean vertical) {
        if (!Double.isFinite(v)) {
            return;
        }
        ValueMarker mk = new ValueMarker(v);
        mk.setPaint(color);
        mk.setStroke(dashed ? new BasicStroke(1.4f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
                new float[] {6f, 4f}, 0f) : new BasicStroke(1.8f));
        if (vertical) {
            p.addDomainMarker(mk);
        } else {
            p.addRangeMarker(mk);
        }
    }

    private static Shape cross(double h) {
        Path2D.Double x = new Path2D.Double();
        double t = h / 3;
        x.moveTo(-h, -h + t);
        x.lineTo(-h + t, -h);
        x.lineTo(0, -t);
        x.lineTo(h - t, -h);
        x.lineTo(h, -h + t);
        x.lineTo(t, 0);
        x.lineTo(h, h - t);
        x.lineTo(h - t, h);
        x.lineTo(0, t);
        x.lineTo(-h + t, h);
        x.lineTo(-h, h - t);
        x.lineTo(-t, 0);
        x.closePath();
        return x;
    }

    private static String png(JFreeChart chart) throws IOException {
        ChartTheme.apply(chart);
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ChartUtils.writeChartAsPNG(out, chart, WIDTH, HEIGHT);
        return "data:image/png;base64," + Base64.getEncoder().encodeToString(out.toByteArray());
    }

    /** Formats axis numbers the way every command prints them: an SI prefix and the unit's symbol. */
    static final class SiFormat extends java.text.NumberFormat {
        private static final long serialVersionUID = 1L;
        private final Dimension unit;

        SiFormat(Dimension unit) {
            this.unit = unit;
        }

        @Override
        public StringBuffer format(double number, StringBuffer to, java.text.FieldPosition pos) {
            return to.append(number == 0 ? "0" : Units.formatTick(number, unit));
        }

        @Override
        public StringBuffer format(long number, StringBuffer to, java.text.FieldPosition pos) {
            return format((double) number, to, pos);
        }

        @Override
        public Number parse(String source, java.text.ParsePosition pos) {
            throw new UnsupportedOperationException("axis labels are not parsed");
        }
    }

    /** A logarithmic axis ticked at 1, 2 and 5 of every decade, labelled with SI prefixes. */
    static final class EngineeringLogAxis extends LogAxis {
        private static final long serialVersionUID = 1L;
        private final Dimension unit;

        EngineeringLogAxis(String label, Dimension unit) {
            super(label + " (" + unit.symbol() + ")");
            this.unit = unit;
        }

        /** The 1-2-5 values inside [lower, upper]. */
        static List<Double> ticks(double lower, double upper) {
            List<Double> out = new ArrayList<>();
            if (!(lower > 0) || !(upper > lower)) {
                return out;
            }
            for (int e = (int) Math.floor(Math.log10(lower)); e <= (int) Math.ceil(Math.log10(upper)); e++) {
                for (int m : new int[] {1, 2, 5}) {
                    double v = m * Math.pow(10, e);
                    if (v >= lower * (1 - 1e-9) && v <= upper * (1 + 1e-9)) {
                        out.add(v);
                    }
                }
            }
            return out;
        }

        @Override
        public List<ValueTick> refreshTicks(Graphics2D g2, AxisState state, Rectangle2D dataArea, RectangleEdge edge) {
            List<ValueTick> out = new ArrayList<>();
            boolean horizontal = RectangleEdge.isTopOrBottom(edge);
            TextAnchor anchor = horizontal ? TextAnchor.TOP_CENTER
                    : edge == RectangleEdge.LEFT ? TextAnchor.CENTER_RIGHT : TextAnchor.CENTER_LEFT;
            for (double v : ticks(getLowerBound(), getUpperBound())) {
                out.add(new NumberTick(v, Units.formatTick(v, unit), anchor, TextAnchor.CENTER, 0.0));
            }
            return out;
        }
    }
}
