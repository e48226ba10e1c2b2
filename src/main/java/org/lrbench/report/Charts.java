package org.lrbench.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.text.DecimalFormat;
import java.util.Base64;
import java.util.List;
import org.jfree.chart.ChartFactory;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;

/** Report charts drawn with JFreeChart and embedded as PNG data, so the report needs no network. */
final class Charts {
    static final int WIDTH = 640;
    static final int HEIGHT = 300;

    private Charts() {
    }

    /** The sample's values in measuring order with the tolerance and acceptance limits as lines. */
    static String sample(String title, String unit, double[] values, double lower, double upper, double accLower,
                         double accUpper) throws IOException {
        XYSeries s = new XYSeries("reading");
        for (int i = 0; i < values.length; i++) {
            s.add(i + 1, values[i]);
        }
        JFreeChart c = ChartFactory.createScatterPlot(title, "part (measuring order)", unit, new XYSeriesCollection(s),
                PlotOrientation.VERTICAL, false, false, false);
        XYPlot p = c.getXYPlot();
        p.getDomainAxis().setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        mark(p, lower, Color.RED, false);
        mark(p, upper, Color.RED, false);
        if (accLower != lower) {
            mark(p, accLower, Color.ORANGE, true);
        }
        if (accUpper != upper) {
            mark(p, accUpper, Color.ORANGE, true);
        }
        return png(c);
    }

    /** |Z| and phase against frequency: measured points and the fitted model. */
    static String impedance(String title, double[] f, double[] mag, double[] phaseDeg, double[] fm, double[] magModel,
                            double[] phaseModel) throws IOException {
        XYSeriesCollection m = new XYSeriesCollection();
        m.addSeries(series("|Z| measured", f, mag));
        m.addSeries(series("|Z| model", fm, magModel));
        m.addSeries(series("phase measured", f, phaseDeg));
        m.addSeries(series("phase model", fm, phaseModel));
        XYSeriesCollection magOnly = new XYSeriesCollection();
        magOnly.addSeries(m.getSeries(0));
        magOnly.addSeries(m.getSeries(1));
        JFreeChart c = ChartFactory.createXYLineChart(title, "frequency (Hz)", "|Z| (ohm)", magOnly,
                PlotOrientation.VERTICAL, true, false, false);
        XYPlot p = c.getXYPlot();
        LogAxis x = new LogAxis("frequency (Hz)");
        x.setNumberFormatOverride(new DecimalFormat("0"));
        p.setDomainAxis(x);
        LogAxis y = new LogAxis("|Z| (ohm)");
        y.setNumberFormatOverride(new DecimalFormat("0.###"));
        p.setRangeAxis(y);
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer();
        r.setSeriesLinesVisible(0, false);
        r.setSeriesShapesVisible(1, false);
        p.setRenderer(r);
        XYSeriesCollection phase = new XYSeriesCollection();
        phase.addSeries(m.getSeries(2));
        phase.addSeries(m.getSeries(3));
        p.setDataset(1, phase);
        p.setRangeAxis(1, new NumberAxis("phase (degrees)"));
        p.mapDatasetToRangeAxis(1, 1);
        XYLineAndShapeRenderer r2 = new XYLineAndShapeRenderer();
        r2.setSeriesLinesVisible(0, false);
        r2.setSeriesShapesVisible(1, false);
        p.setRenderer(1, r2);
        return png(c);
    }

    /** A part number's lots over time: mean with +/- one standard deviation. */
    static String history(String title, String unit, List<String> lots, double[] mean, double[] sd) throws IOException {
        XYSeries m = new XYSeries("mean");
        XYSeries hi = new XYSeries("mean + s");
        XYSeries lo = new XYSeries("mean - s");
        for (int i = 0; i < lots.size(); i++) {
            m.add(i + 1, mean[i]);
            if (Double.isFinite(sd[i])) {
                hi.add(i + 1, mean[i] + sd[i]);
                lo.add(i + 1, mean[i] - sd[i]);
            }
        }
        XYSeriesCollection d = new XYSeriesCollection();
        d.addSeries(m);
        d.addSeries(hi);
        d.addSeries(lo);
        JFreeChart c = ChartFactory.createXYLineChart(title, "lot (order started)", unit, d, PlotOrientation.VERTICAL,
                true, false, false);
        return png(c);
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

    private static void mark(XYPlot p, double v, Color color, boolean dashed) {
        if (!Double.isFinite(v)) {
            return;
        }
        ValueMarker mk = new ValueMarker(v);
        mk.setPaint(color);
        mk.setStroke(dashed ? new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
                new float[] {6f, 4f}, 0f) : new BasicStroke(1.5f));
        p.addRangeMarker(mk);
    }

    private static String png(JFreeChart chart) throws IOException {
        chart.setBackgroundPaint(Color.WHITE);
        chart.getXYPlot().setBackgroundPaint(Color.WHITE);
        chart.getXYPlot().setDomainGridlinePaint(Color.LIGHT_GRAY);
        chart.getXYPlot().setRangeGridlinePaint(Color.LIGHT_GRAY);
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ChartUtils.writeChartAsPNG(out, chart, WIDTH, HEIGHT);
        return "data:image/png;base64," + Base64.getEncoder().encodeToString(out.toByteArray());
    }
}
