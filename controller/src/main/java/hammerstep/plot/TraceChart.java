package hammerstep.plot;

import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.markers.SeriesMarkers;

import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;

/**
 * Torque over time of a trace, with each blow's peak marked (as the controller's own chain found
 * them), the program's torque window, its target and its shut-off line. Long traces are drawn as
 * their min/max envelope per pixel column, so no peak disappears between drawn points.
 */
public final class TraceChart {

    static final int WIDTH = 1200;
    static final int HEIGHT = 600;
    static final int COLUMNS = 2000;

    private TraceChart() {
    }

    /**
     * What to draw.
     *
     * @param samples     the trace in N·m, {@code length} of them, sample 0 taken at {@code firstNs}
     * @param results     the judged rundowns, their peaks and peak times in the trace's clock
     * @param fromNs      start of the span drawn (inclusive)
     * @param toNs        end of the span drawn (inclusive)
     */
    public record Data(String title, float[] samples, int length, double rateHz, long firstNs,
                       JointProgram program, List<JointResult> results, long fromNs, long toNs) { }

    public static void write(Data d, Path file) throws IOException {
        XYChart chart;
        try {
            chart = chart(d);
        } catch (RuntimeException e) {
            // the chart library refuses series it cannot scale
            throw new IOException(file + ": cannot draw these values (infinite or out of the chart's range)");
        }
        Picture.write(List.of(chart), WIDTH, HEIGHT, file);
    }

    static XYChart chart(Data d) {
        double periodNs = 1e9 / d.rateHz();
        int a = (int) Math.max(0, Math.ceil((d.fromNs() - d.firstNs()) / periodNs - 1e-6));
        int b = (int) Math.min(d.length() - 1, Math.floor((d.toNs() - d.firstNs()) / periodNs + 1e-6));
        boolean seconds = (d.toNs() - d.fromNs()) > 5e9;
        double unit = seconds ? 1e-9 : 1e-6;
        String axis = seconds ? "time, s" : "time, ms";

        XYChart c = Series.chart(WIDTH, HEIGHT, d.title(), axis, "torque, N·m");
        double[][] xy = envelope(d.samples(), a, b, d.firstNs(), periodNs, unit);
        double lo = 0;
        double hi = 0;
        for (double v : xy[1]) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        double x0 = (d.fromNs() - d.firstNs()) * unit;
        double x1 = (d.toNs() - d.firstNs()) * unit;
        XYSeries torque = c.addSeries("torque", xy[0], xy[1]);
        torque.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
        torque.setMarker(SeriesMarkers.NONE);
        torque.setLineColor(Series.TORQUE);
        torque.setLineStyle(new java.awt.BasicStroke(1.2f));

        int blows = 0;
        for (JointResult r : d.results()) {
            for (long t : r.peakTimesNs()) {
                if (t >= d.fromNs() && t <= d.toNs()) {
                    blows++;
                }
            }
        }
        if (blows > 0) {
            double[] px = new double[blows];
            double[] py = new double[blows];
            int k = 0;
            for (JointResult r : d.results()) {
                for (int i = 0; i < r.peakTimesNs().length; i++) {
                    long t = r.peakTimesNs()[i];
                    if (t >= d.fromNs() && t <= d.toNs()) {
                        px[k] = (t - d.firstNs()) * unit;
                        py[k] = r.peaksNm()[i];
                        hi = Math.max(hi, py[k]);
                        k++;
                    }
                }
            }
            XYSeries peaks = c.addSeries("blow peak (" + blows + ")", px, py);
            peaks.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
            peaks.setMarker(SeriesMarkers.CIRCLE);
            peaks.setMarkerColor(Series.PEAK);
        }
        JointProgram p = d.program();
        JointProgram.Torque t = p.torque();
        Series.horizontal(c, "window max " + Series.nm(t.maxNm()) + " N·m", t.maxNm(), x0, x1, Series.WINDOW, Series.dashed());
        Series.horizontal(c, "target " + Series.nm(t.targetNm()) + " N·m", t.targetNm(), x0, x1, Series.TARGET, Series.dotted());
        Series.horizontal(c, "window min " + Series.nm(t.minNm()) + " N·m", t.minNm(), x0, x1, Series.WINDOW, Series.dashed());
        hi = Math.max(hi, t.maxNm());
        if (p.hasShutoff()) {
            Series.horizontal(c, "shut-off " + Series.nm(p.shutoffAtNm()) + " N·m", p.shutoffAtNm(), x0, x1,
                    Series.SHUTOFF, Series.dashDot());
            hi = Math.max(hi, p.shutoffAtNm());
        }
        c.getStyler().setXAxisMin(x0);
        c.getStyler().setXAxisMax(x1);
        c.getStyler().setYAxisMin(Math.min(0, lo * 1.05));
        c.getStyler().setYAxisMax(hi * 1.08);
        c.getStyler().setXAxisDecimalPattern(seconds ? "0.0#" : "0");
        return c;
    }

    /** The samples [a, b] as points, or as their min and max per column when there are many. */
    static double[][] envelope(float[] x, int a, int b, long firstNs, double periodNs, double unit) {
        int n = Math.max(0, b - a + 1);
        if (n <= 2 * COLUMNS) {
            double[] tx = new double[n];
            double[] ty = new double[n];
            for (int i = 0; i < n; i++) {
                tx[i] = (a + i) * periodNs * unit;
                ty[i] = x[a + i];
            }
            return new double[][] {tx, ty};
        }
        double[] tx = new double[2 * COLUMNS];
        double[] ty = new double[2 * COLUMNS];
        for (int col = 0; col < COLUMNS; col++) {
            int s = a + (int) ((long) n * col / COLUMNS);
            int e = a + (int) ((long) n * (col + 1) / COLUMNS);
            int iMin = s;
            int iMax = s;
            for (int i = s; i < e; i++) {
                if (x[i] < x[iMin]) {
                    iMin = i;
                }
                if (x[i] > x[iMax]) {
                    iMax = i;
                }
            }
            int first = Math.min(iMin, iMax);
            int second = Math.max(iMin, iMax);
            tx[2 * col] = first * periodNs * unit;
            ty[2 * col] = x[first];
            tx[2 * col + 1] = second * periodNs * unit;
            ty[2 * col + 1] = x[second];
        }
        return new double[][] {tx, ty};
    }

    /** A one-line summary of the judged rundowns for the title. */
    public static String summary(List<JointResult> results) {
        if (results.isEmpty()) {
            return "no rundown";
        }
        if (results.size() == 1) {
            JointResult r = results.get(0);
            return String.format(Locale.ROOT, "%d blows, final %.1f N·m, %s%s", r.blows(), r.finalTorqueNm(),
                    r.verdict(), r.reasons().isEmpty() ? "" : " " + r.reasons());
        }
        long go = results.stream().filter(r -> r.verdict() == hammerstep.joint.Verdict.GO).count();
        return results.size() + " rundowns, " + go + " GO, " + (results.size() - go) + " NO_GO";
    }
}
