package hammerstep.web;

import hammerstep.analysis.CapabilityStudy;

import java.util.List;
import java.util.Locale;

/** The capability page's two pictures of one group: a histogram with the limits, and a run chart. */
final class CapabilitySvg {

    static final int WIDTH = 440;
    static final int HEIGHT = 240;

    private CapabilitySvg() {
    }

    /** Final torque in bins, with the lower and upper limits and the mean. */
    static String histogram(CapabilityStudy.Entry e) {
        List<Double> v = e.finalTorquesNm();
        double lsl = e.limits().torqueMinNm();
        double usl = e.limits().torqueMaxNm();
        double lo = lsl;
        double hi = usl;
        for (double x : v) {
            lo = Math.min(lo, x);
            hi = Math.max(hi, x);
        }
        double margin = (hi - lo) * 0.08 + 1e-9;
        lo -= margin;
        hi += margin;
        int bins = Math.max(5, Math.min(30, (int) Math.ceil(Math.sqrt(v.size())) + 1));
        double width = (hi - lo) / bins;
        int[] count = new int[bins];
        int most = 1;
        for (double x : v) {
            int k = Math.min(bins - 1, Math.max(0, (int) ((x - lo) / width)));
            most = Math.max(most, ++count[k]);
        }
        Svg s = new Svg(WIDTH, HEIGHT, lo, hi, 0, most * 1.15, "histogram of final torque");
        s.axes("final torque, N·m", "joints");
        for (int k = 0; k < bins; k++) {
            if (count[k] > 0) {
                double a = lo + k * width;
                s.bar(a, a + width, count[k], "bin", String.format(Locale.ROOT, "%.1f to %.1f N·m: %d", a, a + width,
                        count[k]));
            }
        }
        s.vline(lsl, "limit", "min").vline(usl, "limit", "max");
        if (!Double.isNaN(e.torque().mean())) {
            s.vline(e.torque().mean(), "target", "mean");
        }
        return s.end();
    }

    /** Final torque joint by joint, in the order stored, with the limits. */
    static String runChart(CapabilityStudy.Entry e) {
        List<Double> v = e.finalTorquesNm();
        double lo = e.limits().torqueMinNm();
        double hi = e.limits().torqueMaxNm();
        for (double x : v) {
            lo = Math.min(lo, x);
            hi = Math.max(hi, x);
        }
        double margin = (hi - lo) * 0.08 + 1e-9;
        Svg s = new Svg(WIDTH, HEIGHT, 1, Math.max(2, v.size()), lo - margin, hi + margin, "run chart of final torque");
        s.axes("joint", "final torque, N·m")
                .hline(e.limits().torqueMinNm(), "limit", "min")
                .hline(e.limits().torqueMaxNm(), "limit", "max");
        double[] xs = new double[v.size()];
        double[] ys = new double[v.size()];
        for (int i = 0; i < xs.length; i++) {
            xs[i] = i + 1;
            ys[i] = v.get(i);
        }
        s.line(xs, ys, xs.length, "run");
        if (xs.length <= 200) {
            for (int i = 0; i < xs.length; i++) {
                s.dot(xs[i], ys[i], "runpoint", String.format(Locale.ROOT, "joint %d: %.2f N·m", i + 1, ys[i]));
            }
        }
        return s.end();
    }
}
