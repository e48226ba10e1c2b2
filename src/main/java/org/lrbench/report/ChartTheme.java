package org.lrbench.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.ValueAxis;
import org.jfree.chart.block.BlockBorder;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.title.LegendTitle;
import org.jfree.chart.ui.HorizontalAlignment;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.chart.ui.RectangleInsets;

/**
 * The look of lrbench's charts, the same on every page: the title small and plain at the top
 * left, the legend as a line of keys at the top right without a frame, a white plot with only
 * horizontal guide lines (thin, dashed), left and bottom axis lines and no box around the plot.
 */
final class ChartTheme {
    static final Color INK = new Color(0x22, 0x2B, 0x33);
    static final Color QUIET = new Color(0x5F, 0x6B, 0x75);
    static final Color GUIDE = new Color(0xE3, 0xE7, 0xEA);
    private static final Font TITLE = new Font(Font.SANS_SERIF, Font.PLAIN, 13);
    private static final Font LABEL = new Font(Font.SANS_SERIF, Font.PLAIN, 11);
    private static final Font TICKS = new Font(Font.SANS_SERIF, Font.PLAIN, 10);

    private ChartTheme() {
    }

    static void apply(JFreeChart chart) {
        chart.setBackgroundPaint(Color.WHITE);
        chart.setPadding(new RectangleInsets(6, 6, 6, 10));
        if (chart.getTitle() != null) {
            chart.getTitle().setFont(TITLE);
            chart.getTitle().setPaint(INK);
            chart.getTitle().setHorizontalAlignment(HorizontalAlignment.LEFT);
        }
        LegendTitle legend = chart.getLegend();
        if (legend != null) {
            legend.setPosition(RectangleEdge.TOP);
            legend.setHorizontalAlignment(HorizontalAlignment.RIGHT);
            legend.setFrame(BlockBorder.NONE);
            legend.setItemFont(TICKS);
            legend.setItemPaint(QUIET);
            legend.setBackgroundPaint(Color.WHITE);
        }
        XYPlot p = chart.getXYPlot();
        p.setBackgroundPaint(Color.WHITE);
        p.setOutlineVisible(false);
        p.setDomainGridlinesVisible(false);
        p.setRangeGridlinesVisible(true);
        p.setRangeGridlinePaint(GUIDE);
        p.setRangeGridlineStroke(new BasicStroke(0.8f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
                new float[] {3f, 3f}, 0f));
        for (int i = 0; i < p.getDomainAxisCount(); i++) {
            axis(p.getDomainAxis(i));
        }
        for (int i = 0; i < p.getRangeAxisCount(); i++) {
            axis(p.getRangeAxis(i));
        }
    }

    private static void axis(ValueAxis a) {
        if (a == null) {
            return;
        }
        a.setLabelFont(LABEL);
        a.setLabelPaint(QUIET);
        a.setTickLabelFont(TICKS);
        a.setTickLabelPaint(QUIET);
        a.setAxisLinePaint(QUIET);
        a.setTickMarkPaint(QUIET);
    }
}
