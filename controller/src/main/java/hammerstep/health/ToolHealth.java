package hammerstep.health;

import hammerstep.joint.JointResult;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Watches each tool on each program for a loss of blow rate or blow energy, which is how low
 * supply pressure, a weak battery or a worn hammer shows. Per (tool, program) it learns a
 * baseline over the first {@code baselineJoints} qualifying joints (the median of each figure),
 * then compares the median of the last {@code window} joints with it: a figure whose median falls
 * by {@code dropFraction} or more below its baseline turns WEAK; it turns OK again once the median
 * is back within half that fraction. The median means one or two odd joints trip nothing.
 *
 * <p>Figures per joint: blow rate (blows per minute between the first and last peak), the mean
 * blow peak and the mean blow impulse (∫T dt per blow, N·m·s: the momentum the hammer hands over,
 * less dependent on the joint's stiffness than the peak). A joint counts when it has at least
 * {@code minBlows} blows and no sensor fault.
 *
 * <p>Pure and single-threaded: joints in, changes out; no clock, no I/O. Allocates a little per
 * joint (not on the sample path).
 */
public final class ToolHealth {

    /** What is watched. */
    public enum Figure {
        BLOW_RATE("blow rate", "/min"),
        BLOW_PEAK("blow peak", "N·m"),
        BLOW_IMPULSE("blow impulse", "N·m·s");

        private final String label;
        private final String unit;

        Figure(String label, String unit) {
            this.label = label;
            this.unit = unit;
        }

        public String label() {
            return label;
        }

        public String unit() {
            return unit;
        }
    }

    /**
     * @param baselineJoints joints learned before judging (at least 3)
     * @param window         joints whose median is compared with the baseline (odd, at least 3)
     * @param dropFraction   fall below the baseline that turns a figure WEAK, e.g. 0.15
     * @param minBlows       fewer blows than this and a joint says nothing of the tool
     */
    public record Settings(int baselineJoints, int window, double dropFraction, int minBlows) {

        public static final Settings DEFAULT = new Settings(10, 5, 0.15, 3);

        public Settings {
            if (baselineJoints < 3 || window < 3 || window % 2 == 0 || !(dropFraction > 0 && dropFraction < 1) || minBlows < 2) {
                throw new IllegalArgumentException("tool health: baseline_joints >= 3, window odd >= 3,"
                        + " 0 < drop < 1, min_blows >= 2; got " + baselineJoints + ", " + window + ", "
                        + dropFraction + ", " + minBlows);
            }
        }
    }

    /**
     * A figure of a tool on a program turned WEAK ({@code weak}) or OK again.
     *
     * @param baseline  the learned value
     * @param recent    the median of the last joints
     */
    public record Change(String tool, String program, Figure figure, boolean weak, double baseline, double recent) {

        /** Fall of the recent median below the baseline, as a fraction (0.2 = 20 % lower). */
        public double drop() {
            return 1 - recent / baseline;
        }

        /** One line for a person. */
        public String message() {
            return String.format(java.util.Locale.ROOT, "tool %s on program %s: %s %s %.0f %% below its baseline"
                            + " (%.4g → %.4g %s)%s", tool, program, figure.label(), weak ? "fell" : "is back,",
                    100 * drop(), baseline, recent, figure.unit(),
                    weak ? "; check supply pressure or battery, then the hammer" : "");
        }
    }

    private final Settings settings;
    private final Map<String, Track> tracks = new HashMap<>();

    public ToolHealth(Settings settings) {
        this.settings = settings;
    }

    /** Takes one judged joint; returns the figures that changed state (usually none). A loosening is not learnt. */
    public List<Change> observe(String tool, String program, JointResult r) {
        if (r.loosening() || r.blows() < settings.minBlows() || r.faults() != 0 || r.peaksNm().length == 0) {
            return List.of();
        }
        double peaks = 0;
        for (double v : r.peaksNm()) {
            peaks += v;
        }
        double impulses = 0;
        for (double v : r.impulsesNms()) {
            impulses += v;
        }
        int n = r.peaksNm().length;
        return observe(tool, program, r.blowRatePerMin(), peaks / n, r.impulsesNms().length == 0 ? 0 : impulses / n);
    }

    /** As {@link #observe(String, String, JointResult)} from the figures of a joint; a figure ≤ 0 is not known. */
    public List<Change> observe(String tool, String program, double ratePerMin, double meanPeakNm, double meanImpulseNms) {
        Track t = tracks.computeIfAbsent(tool + "\u0000" + program, k -> new Track(tool, program, settings));
        return t.add(ratePerMin, meanPeakNm, meanImpulseNms);
    }

    /** True while any figure of any tool is WEAK (the yellow lamp). */
    public boolean anyWeak() {
        for (Track t : tracks.values()) {
            if (t.anyWeak()) {
                return true;
            }
        }
        return false;
    }

    /** True while a figure of this tool on this program is WEAK. */
    public boolean weak(String tool, String program, Figure f) {
        Track t = tracks.get(tool + "\u0000" + program);
        return t != null && t.weak.get(f);
    }

    /** True once the baseline of this tool on this program is learned. */
    public boolean learned(String tool, String program) {
        Track t = tracks.get(tool + "\u0000" + program);
        return t != null && t.baseline != null;
    }

    /** The learned baseline of a figure, or NaN while learning. */
    public double baseline(String tool, String program, Figure f) {
        Track t = tracks.get(tool + "\u0000" + program);
        return t == null || t.baseline == null ? Double.NaN : t.baseline[f.ordinal()];
    }

    /** Forgets a tool's baselines (after a tool change or service): it learns again. */
    public void reset(String tool) {
        tracks.values().removeIf(t -> t.tool.equals(tool));
    }

    public Settings settings() {
        return settings;
    }

    private static final class Track {
        final String tool;
        final String program;
        final Settings s;
        final double[][] learning;
        int learned;
        double[] baseline;
        final double[][] recent;
        int seen;
        final EnumMap<Figure, Boolean> weak = new EnumMap<>(Figure.class);

        Track(String tool, String program, Settings s) {
            this.tool = tool;
            this.program = program;
            this.s = s;
            this.learning = new double[Figure.values().length][s.baselineJoints()];
            this.recent = new double[Figure.values().length][s.window()];
            for (Figure f : Figure.values()) {
                weak.put(f, false);
            }
        }

        List<Change> add(double rate, double peak, double impulse) {
            double[] v = {rate, peak, impulse};
            if (baseline == null) {
                for (int f = 0; f < v.length; f++) {
                    learning[f][learned] = v[f];
                }
                if (++learned == s.baselineJoints()) {
                    baseline = new double[v.length];
                    for (int f = 0; f < v.length; f++) {
                        baseline[f] = median(learning[f], learned);
                    }
                }
                return List.of();
            }
            int slot = seen++ % s.window();
            for (int f = 0; f < v.length; f++) {
                recent[f][slot] = v[f];
            }
            if (seen < s.window()) {
                return List.of();
            }
            List<Change> changes = new ArrayList<>(1);
            for (Figure f : Figure.values()) {
                double b = baseline[f.ordinal()];
                if (!(b > 0)) {
                    continue;
                }
                double m = median(recent[f.ordinal()], s.window());
                boolean was = weak.get(f);
                boolean now = was ? m < b * (1 - s.dropFraction() / 2) : m <= b * (1 - s.dropFraction());
                if (now != was) {
                    weak.put(f, now);
                    changes.add(new Change(tool, program, f, now, b, m));
                }
            }
            return changes;
        }

        boolean anyWeak() {
            return weak.containsValue(true);
        }

        static double median(double[] values, int n) {
            double[] c = Arrays.copyOf(values, n);
            Arrays.sort(c);
            return n % 2 == 1 ? c[n / 2] : 0.5 * (c[n / 2 - 1] + c[n / 2]);
        }
    }
}
