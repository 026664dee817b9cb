package hammerstep.plot;

import hammerstep.analysis.Capability;
import hammerstep.analysis.CapabilityStudy;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.markers.SeriesMarkers;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Pictures of a capability study: for each program (and window), the final-torque histogram
 * against its window with the fitted normal curve, and the run chart of final torque in joint
 * order against the same limits.
 */
public final class CapabilityCharts {

    /** Programs drawn into one picture at most; the table and JSON carry all of them. */
    public static final int MAX_PROGRAMS = 8;

    static final int WIDTH = 1000;
    static final int HEIGHT = 420;

    private CapabilityCharts() {
    }

    public static void write(CapabilityStudy.Report report, Path file) throws IOException {
        List<XYChart> charts = new ArrayList<>();
        int programs = 0;
        for (CapabilityStudy.Entry e : report.entries()) {
            if (e.perPosition() || e.torque().n() == 0) {
                continue;
            }
            if (programs++ == MAX_PROGRAMS) {
                break;
            }
            charts.add(histogram(e));
            charts.add(runChart(e));
        }
        Picture.write(charts, WIDTH, HEIGHT, file);
    }

    static XYChart histogram(CapabilityStudy.Entry e) {
        Capability t = e.torque();
        double lsl = t.lsl();
        double usl = t.usl();
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double v : e.finalTorquesNm()) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        int bins = (int) Math.max(5, Math.min(30, Math.round(Math.sqrt(t.n()))));
        double width = hi > lo ? (hi - lo) / bins : Math.max(1e-3, (usl - lsl) / 50);
        if (hi == lo) {
            lo -= width / 2;
            bins = 1;
        }
        int[] counts = new int[bins];
        for (double v : e.finalTorquesNm()) {
            int k = (int) Math.floor((v - lo) / width);
            counts[Math.max(0, Math.min(bins - 1, k))]++;
        }
        int top = 0;
        double[] x = new double[bins * 2 + 2];
        double[] y = new double[bins * 2 + 2];
        x[0] = lo;
        for (int k = 0; k < bins; k++) {
            x[2 * k + 1] = lo + k * width;
            y[2 * k + 1] = counts[k];
            x[2 * k + 2] = lo + (k + 1) * width;
            y[2 * k + 2] = counts[k];
            top = Math.max(top, counts[k]);
        }
        x[bins * 2 + 1] = lo + bins * width;

        String title = title(e, "final torque") + String.format(java.util.Locale.ROOT, "   n=%d  mean %.2f  s %s  Cm %s  Cmk %s",
                t.n(), t.mean(), Double.isNaN(t.sd()) ? "-" : String.format(java.util.Locale.ROOT, "%.3f", t.sd()),
                Series.index(t.cm()), Series.index(t.cmk()));
        XYChart c = Series.chart(WIDTH, HEIGHT, title, "final torque, N·m", "joints");
        XYSeries bars = c.addSeries("joints per " + String.format(java.util.Locale.ROOT, "%.2f", width) + " N·m", x, y);
        bars.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Area);
        bars.setMarker(SeriesMarkers.NONE);
        bars.setFillColor(Series.BARS);
        bars.setLineColor(Series.TORQUE);

        double yTop = Math.max(1, top) * 1.15;
        double xMin = Math.min(lsl, lo);
        double xMax = Math.max(usl, lo + bins * width);
        double pad = 0.05 * (xMax - xMin);
        if (t.n() >= 2 && t.sd() > 0) {
            int m = 120;
            double[] nx = new double[m + 1];
            double[] ny = new double[m + 1];
            for (int i = 0; i <= m; i++) {
                nx[i] = xMin - pad + (xMax - xMin + 2 * pad) * i / m;
                double z = (nx[i] - t.mean()) / t.sd();
                ny[i] = t.n() * width * Math.exp(-0.5 * z * z) / (t.sd() * Math.sqrt(2 * Math.PI));
            }
            Series.line(c, "normal, mean and s of the joints", nx, ny, Series.TORQUE, Series.dotted());
        }
        Series.vertical(c, "LSL " + Series.nm(lsl) + " N·m", lsl, 0, yTop, Series.WINDOW, Series.dashed());
        Series.vertical(c, "USL " + Series.nm(usl) + " N·m", usl, 0, yTop, Series.WINDOW, Series.dashed());
        c.getStyler().setXAxisMin(xMin - pad);
        c.getStyler().setXAxisMax(xMax + pad);
        c.getStyler().setYAxisMin(0.0);
        c.getStyler().setYAxisMax(yTop);
        return c;
    }

    static XYChart runChart(CapabilityStudy.Entry e) {
        Capability t = e.torque();
        List<Double> values = e.finalTorquesNm();
        int n = values.size();
        double[] x = new double[n];
        double[] y = new double[n];
        double lo = t.lsl();
        double hi = t.usl();
        for (int i = 0; i < n; i++) {
            x[i] = i + 1;
            y[i] = values.get(i);
            lo = Math.min(lo, y[i]);
            hi = Math.max(hi, y[i]);
        }
        XYChart c = Series.chart(WIDTH, HEIGHT, title(e, "run chart"), "joint, in order of the results", "final torque, N·m");
        XYSeries s = c.addSeries("final torque", x, y);
        s.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
        s.setMarker(SeriesMarkers.CIRCLE);
        s.setLineColor(Series.TORQUE);
        s.setMarkerColor(Series.TORQUE);
        double x0 = 0.5;
        double x1 = n + 0.5;
        Series.horizontal(c, "USL " + Series.nm(t.usl()) + " N·m", t.usl(), x0, x1, Series.WINDOW, Series.dashed());
        Series.horizontal(c, "mean " + String.format(java.util.Locale.ROOT, "%.2f", t.mean()) + " N·m", t.mean(), x0, x1,
                Series.TARGET, Series.dotted());
        Series.horizontal(c, "LSL " + Series.nm(t.lsl()) + " N·m", t.lsl(), x0, x1, Series.WINDOW, Series.dashed());
        double pad = 0.08 * (hi - lo);
        c.getStyler().setYAxisMin(lo - pad);
        c.getStyler().setYAxisMax(hi + pad);
        c.getStyler().setXAxisMin(x0);
        c.getStyler().setXAxisMax(x1);
        return c;
    }

    private static String title(CapabilityStudy.Entry e, String what) {
        return e.program() + (e.mixedLimits() ? " [" + Series.nm(e.limits().torqueMinNm()) + ".."
                + Series.nm(e.limits().torqueMaxNm()) + " N·m]" : "") + ": " + what;
    }
}
