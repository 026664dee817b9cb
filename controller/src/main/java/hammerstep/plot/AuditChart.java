package hammerstep.plot;

import hammerstep.analysis.AuditStudy;
import hammerstep.analysis.LinearFit;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.markers.SeriesMarkers;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Residual torque against dynamic final torque for each program and audit method: the audits,
 * the fitted line with its prediction band, the line residual = dynamic, the residual-torque
 * specification and the suggested dynamic window.
 */
public final class AuditChart {

    static final int WIDTH = 1000;
    static final int HEIGHT = 600;

    private AuditChart() {
    }

    public static void write(AuditStudy.Report report, Path file) throws IOException {
        List<XYChart> charts = new ArrayList<>();
        for (AuditStudy.Group g : report.groups()) {
            if (charts.size() == CapabilityCharts.MAX_PROGRAMS) {
                break;
            }
            charts.add(chart(report, g));
        }
        Picture.write(charts, WIDTH, HEIGHT, file);
    }

    static XYChart chart(AuditStudy.Report report, AuditStudy.Group g) {
        LinearFit f = g.fit();
        String title = g.program() + ", " + g.method().key() + ": n=" + g.n()
                + (f == null ? "" : String.format(Locale.ROOT, "  r=%.3f  residual = %.2f + %.4f·dynamic", f.r(), f.a(), f.b()));
        XYChart c = Series.chart(WIDTH, HEIGHT, title, "dynamic final torque, N·m", "residual torque, N·m");
        double x0 = g.minDynamicNm();
        double x1 = g.maxDynamicNm();
        if (g.window() != null) {
            x0 = Math.min(x0, g.window().minNm());
            x1 = Math.max(x1, g.window().maxNm());
        }
        double pad = Math.max(1, 0.1 * (x1 - x0));
        x0 -= pad;
        x1 += pad;
        double ylo = Double.POSITIVE_INFINITY;
        double yhi = Double.NEGATIVE_INFINITY;
        for (double v : g.residualNm()) {
            ylo = Math.min(ylo, v);
            yhi = Math.max(yhi, v);
        }
        XYSeries pts = c.addSeries("audits", g.dynamicNm(), g.residualNm());
        pts.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
        pts.setMarker(SeriesMarkers.CIRCLE);
        pts.setMarkerColor(Series.TORQUE);
        if (f != null) {
            int m = 100;
            double[] x = new double[m + 1];
            double[] y = new double[m + 1];
            double[] lo = new double[m + 1];
            double[] hi = new double[m + 1];
            for (int i = 0; i <= m; i++) {
                x[i] = x0 + (x1 - x0) * i / m;
                y[i] = f.predict(x[i]);
                double h = f.predictionHalfWidth(x[i], report.confidence());
                lo[i] = y[i] - h;
                hi[i] = y[i] + h;
            }
            Series.line(c, "fit", x, y, Series.TORQUE, Series.solid());
            String band = String.format(Locale.ROOT, "%.0f %% prediction band", report.confidence() * 100);
            Series.line(c, band, x, hi, Series.TORQUE, Series.dotted());
            Series.line(c, band + " ", x, lo, Series.TORQUE, Series.dotted()).setShowInLegend(false);
            ylo = Math.min(ylo, lo[0]);
            yhi = Math.max(yhi, hi[m]);
        }
        Series.line(c, "residual = dynamic", new double[] {x0, x1}, new double[] {x0, x1}, Series.TARGET, Series.dotted());
        if (report.hasSpec()) {
            Series.horizontal(c, "spec max " + Series.nm(report.specMaxNm()) + " N·m", report.specMaxNm(), x0, x1,
                    Series.WINDOW, Series.dashed());
            Series.horizontal(c, "spec min " + Series.nm(report.specMinNm()) + " N·m", report.specMinNm(), x0, x1,
                    Series.WINDOW, Series.dashed());
            ylo = Math.min(ylo, report.specMinNm());
            yhi = Math.max(yhi, report.specMaxNm());
        }
        double ypad = 0.08 * (yhi - ylo);
        if (g.window() != null) {
            String w = "dynamic window " + Series.nm(g.window().minNm()) + ".." + Series.nm(g.window().maxNm()) + " N·m";
            Series.vertical(c, w, g.window().minNm(), ylo - ypad, yhi + ypad, Series.SHUTOFF, Series.dashDot());
            Series.vertical(c, w + " ", g.window().maxNm(), ylo - ypad, yhi + ypad, Series.SHUTOFF, Series.dashDot())
                    .setShowInLegend(false);
        }
        c.getStyler().setXAxisMin(x0);
        c.getStyler().setXAxisMax(x1);
        c.getStyler().setYAxisMin(ylo - ypad);
        c.getStyler().setYAxisMax(yhi + ypad);
        return c;
    }
}
