package hammerstep.plot;

import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.Styler;
import org.knowm.xchart.style.XYStyler;
import org.knowm.xchart.style.lines.SeriesLines;
import org.knowm.xchart.style.markers.SeriesMarkers;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.util.Locale;

/** The few chart building blocks the engineer's plots share: colours, limit lines, a plain white style. */
final class Series {

    static final Color TORQUE = new Color(0x1f, 0x4e, 0x9a);
    static final Color PEAK = new Color(0xc0, 0x1c, 0x28);
    static final Color WINDOW = new Color(0x26, 0x8b, 0x3c);
    static final Color TARGET = new Color(0x60, 0x60, 0x60);
    static final Color SHUTOFF = new Color(0xe0, 0x6c, 0x00);
    static final Color BARS = new Color(0x9f, 0xb8, 0xdc);

    private Series() {
    }

    static XYChart chart(int width, int height, String title, String xTitle, String yTitle) {
        Picture.headless();
        XYChart c = new XYChartBuilder().width(width).height(height).title(title)
                .xAxisTitle(xTitle).yAxisTitle(yTitle).build();
        XYStyler s = c.getStyler();
        s.setChartBackgroundColor(Color.WHITE);
        s.setPlotBackgroundColor(Color.WHITE);
        s.setPlotBorderVisible(true);
        s.setLegendPosition(Styler.LegendPosition.OutsideE);
        s.setLegendBorderColor(Color.LIGHT_GRAY);
        s.setChartTitleFont(new Font(Font.SANS_SERIF, Font.BOLD, 15));
        s.setAxisTitleFont(new Font(Font.SANS_SERIF, Font.PLAIN, 13));
        s.setAxisTickLabelsFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        s.setLegendFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        s.setMarkerSize(7);
        return c;
    }

    /** A horizontal line at {@code y} from {@code x0} to {@code x1}. */
    static void horizontal(XYChart c, String name, double y, double x0, double x1, Color color, BasicStroke stroke) {
        line(c, name, new double[] {x0, x1}, new double[] {y, y}, color, stroke);
    }

    /** A vertical line at {@code x} from {@code y0} to {@code y1}. */
    static XYSeries vertical(XYChart c, String name, double x, double y0, double y1, Color color, BasicStroke stroke) {
        return line(c, name, new double[] {x, x}, new double[] {y0, y1}, color, stroke);
    }

    static XYSeries line(XYChart c, String name, double[] x, double[] y, Color color, BasicStroke stroke) {
        XYSeries s = c.addSeries(name, x, y);
        s.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
        s.setMarker(SeriesMarkers.NONE);
        s.setLineColor(color);
        s.setLineStyle(stroke);
        return s;
    }

    static BasicStroke solid() {
        return SeriesLines.SOLID;
    }

    static BasicStroke dashed() {
        return new BasicStroke(2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f, new float[] {9f, 6f}, 0f);
    }

    static BasicStroke dotted() {
        return new BasicStroke(1.5f, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND, 10f, new float[] {2f, 4f}, 0f);
    }

    static BasicStroke dashDot() {
        return new BasicStroke(2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f, new float[] {10f, 4f, 2f, 4f}, 0f);
    }

    static String nm(double v) {
        return String.format(Locale.ROOT, v == Math.rint(v) ? "%.0f" : "%.1f", v);
    }

    static String index(double v) {
        if (Double.isNaN(v)) {
            return "-";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "inf" : "-inf";
        }
        return String.format(Locale.ROOT, "%.2f", v);
    }
}
