package hammerstep.web;

import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.trace.StoredTrace;

import java.util.Locale;

/**
 * A joint's picture, as {@code hammerstep plot} draws it: torque over time from the rundown's start
 * (its stored trace when one is kept, drawn as the min/max envelope per pixel column so no peak
 * disappears), each blow's peak as the chain found it, the program's torque window as a band, its
 * target and its shut-off line. Without a stored trace the blow peaks alone are drawn and the
 * picture says so.
 */
final class TraceSvg {

    static final int WIDTH = 900;
    static final int HEIGHT = 380;
    private static final long LEAD_NS = 20_000_000L;
    private static final long TAIL_NS = 60_000_000L;

    private TraceSvg() {
    }

    /** The picture of {@code r}; {@code trace} may be null. */
    static String of(JointResult r, StoredTrace.Loaded trace) {
        return picture(r, trace, r.program(), null);
    }

    /**
     * A what-if's picture of {@code r} (the joint as the changed program judges it): the stored
     * program's window shaded as usual (none when {@code stored} is null) and the changed program's
     * window, target and shut-off as blue dashed lines.
     */
    static String compare(JointResult r, StoredTrace.Loaded trace, JointProgram stored, JointProgram changed) {
        return picture(r, trace, stored, changed);
    }

    private static String picture(JointResult r, StoredTrace.Loaded trace, JointProgram stored, JointProgram changed) {
        JointProgram p = stored != null ? stored : changed;
        long fromNs = r.startNs() - LEAD_NS;
        long toNs = Math.max(r.endNs(), r.startNs() + 1_000_000L) + TAIL_NS;
        double hi = Math.max(p.torque().maxNm(), p.hasShutoff() ? p.shutoffAtNm() : 0);
        if (changed != null) {
            hi = Math.max(hi, Math.max(changed.torque().maxNm(), changed.hasShutoff() ? changed.shutoffAtNm() : 0));
        }
        double lo = 0;
        for (double v : r.peaksNm()) {
            hi = Math.max(hi, v);
            lo = Math.min(lo, v);
        }
        double[][] env = null;
        if (trace != null) {
            env = envelope(trace, fromNs, toNs, r.startNs());
            for (double v : env[1]) {
                hi = Math.max(hi, v);
                lo = Math.min(lo, v);
            }
        }
        double startMs = -LEAD_NS * 1e-6;
        double endMs = (toNs - r.startNs()) * 1e-6;
        Svg s = new Svg(WIDTH, HEIGHT, startMs, endMs, lo, hi * 1.08, "torque over time of joint");
        if (stored != null) {
            s.band(p.torque().minNm(), p.torque().maxNm(), "window");
        }
        s.axes("time from rundown start, ms", "torque, N·m");
        if (stored != null) {
            s.hline(p.torque().minNm(), "limit", "min " + Html.num(p.torque().minNm(), 1))
                    .hline(p.torque().maxNm(), "limit", "max " + Html.num(p.torque().maxNm(), 1));
            if (Double.isFinite(p.torque().targetNm())) {
                s.hline(p.torque().targetNm(), "target", "target " + Html.num(p.torque().targetNm(), 1));
            }
            if (p.hasShutoff()) {
                s.hline(p.shutoffAtNm(), "shutoff", "shut-off " + Html.num(p.shutoffAtNm(), 1));
            }
        }
        if (changed != null) {
            s.hline(changed.torque().minNm(), "limit-new", "new min " + Html.num(changed.torque().minNm(), 1))
                    .hline(changed.torque().maxNm(), "limit-new", "new max " + Html.num(changed.torque().maxNm(), 1));
            if (changed.hasShutoff()) {
                s.hline(changed.shutoffAtNm(), "limit-new", "new shut-off " + Html.num(changed.shutoffAtNm(), 1));
            }
        }
        if (r.shutoffReached()) {
            s.vline((r.shutoffAtNs() - r.startNs()) * 1e-6, "shutoff", "tool off");
        }
        if (env != null) {
            s.line(env[0], env[1], env[0].length, "curve");
        } else {
            double[] xs = new double[r.peaksNm().length];
            for (int i = 0; i < xs.length; i++) {
                xs[i] = (r.peakTimesNs()[i] - r.startNs()) * 1e-6;
            }
            s.line(xs, r.peaksNm(), xs.length, "peakline");
        }
        for (int i = 0; i < r.peaksNm().length; i++) {
            double ms = (r.peakTimesNs()[i] - r.startNs()) * 1e-6;
            s.dot(ms, r.peaksNm()[i], "peak", String.format(Locale.ROOT, "blow %d: %.1f N·m at %.1f ms", i + 1,
                    r.peaksNm()[i], ms));
        }
        return s.end();
    }

    /**
     * The trace between the two times as pairs of points per column (max then min), x in ms from
     * {@code zeroNs}: [0] x, [1] torque.
     */
    static double[][] envelope(StoredTrace.Loaded t, long fromNs, long toNs, long zeroNs) {
        double rate = t.header().rateHz();
        long first = t.header().firstSampleNs();
        int a = (int) Math.max(0, Math.ceil((fromNs - first) * rate * 1e-9));
        int b = (int) Math.min(t.samples().length, Math.floor((toNs - first) * rate * 1e-9) + 1);
        if (b <= a) {
            return new double[][] {new double[0], new double[0]};
        }
        int columns = Math.min(b - a, WIDTH - Svg.LEFT - Svg.RIGHT);
        double per = (b - a) / (double) columns;
        double[] xs = new double[2 * columns];
        double[] ys = new double[2 * columns];
        for (int c = 0; c < columns; c++) {
            int from = a + (int) (c * per);
            int to = Math.max(from + 1, Math.min(b, a + (int) ((c + 1) * per)));
            float max = Float.NEGATIVE_INFINITY;
            float min = Float.POSITIVE_INFINITY;
            for (int i = from; i < to; i++) {
                max = Math.max(max, t.samples()[i]);
                min = Math.min(min, t.samples()[i]);
            }
            double ms = (t.timeOf(from) - zeroNs) * 1e-6;
            xs[2 * c] = ms;
            ys[2 * c] = max;
            xs[2 * c + 1] = ms;
            ys[2 * c + 1] = min;
        }
        return new double[][] {xs, ys};
    }
}
