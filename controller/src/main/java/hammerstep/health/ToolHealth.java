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
 * then compares the median of the last {@code window} joints with it. One state per tool and
 * program, with hysteresis: a figure whose median falls by {@code dropFraction} or more below its
 * baseline turns the tool WEAK (a further figure that falls while it is WEAK is named in a change of
 * its own); it turns OK again only once every figure's median is back within half that fraction of
 * its baseline, above or below (a blow rate far above its baseline, as when a weak hammer strikes
 * twice per jaw, clears nothing). The median means one or two odd joints trip nothing.
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
        BLOW_RATE("blow rate", "/min", "%.0f"),
        BLOW_PEAK("blow peak", "N·m", "%.1f"),
        BLOW_IMPULSE("blow impulse", "N·m·s", "%.4g");

        private final String label;
        private final String unit;
        private final String format;

        Figure(String label, String unit, String format) {
            this.label = label;
            this.unit = unit;
            this.format = format;
        }

        /** The value as events print it, without its unit. */
        public String format(double value) {
            return String.format(java.util.Locale.ROOT, format, value);
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
     * Where one figure stands: its learned baseline and the median of the last joints.
     *
     * @param baseline the learned value
     * @param recent   the median of the last joints
     */
    public record Reading(Figure figure, double baseline, double recent) {

        /** Change of the recent median against the baseline, as a fraction (−0.2 = 20 % lower, +0.1 = 10 % higher). */
        public double change() {
            return recent / baseline - 1;
        }

        /** Fall of the recent median below the baseline, as a fraction (0.2 = 20 % lower; negative when higher). */
        public double drop() {
            return -change();
        }

        /** "blow rate fell 17 % below its baseline (2524 → 2101 /min)", or "rose 39 % above", or "is within 2 % of". */
        String text(double band) {
            double pct = 100 * Math.abs(change());
            String how = Math.abs(change()) < band ? String.format(java.util.Locale.ROOT, "is within %.0f %% of", Math.max(pct, 1))
                    : change() < 0 ? String.format(java.util.Locale.ROOT, "fell %.0f %% below", pct)
                    : String.format(java.util.Locale.ROOT, "rose %.0f %% above", pct);
            return figure.label() + " " + how + " its baseline (" + figure.format(baseline) + " → "
                    + figure.format(recent) + " " + figure.unit() + ")";
        }
    }

    /**
     * The state of a tool on a program changed, or a further figure fell while it was WEAK.
     *
     * @param weak     WEAK (a {@code TOOL_WEAK} event) or OK again ({@code TOOL_OK})
     * @param moved    WEAK: the figures that fell by the drop fraction or more (new ones only, when the
     *                 tool was already WEAK); OK: every figure, each back within half the fraction
     * @param band     half the drop fraction: how near its baseline a figure must be to count as back
     * @param escalation true when the tool was already WEAK and a further figure fell
     */
    public record Change(String tool, String program, boolean weak, List<Reading> moved, double band,
                         boolean escalation) {

        public Change {
            moved = List.copyOf(moved);
        }

        /** The first figure named (the one that moved most, for a WEAK change). */
        public Figure figure() {
            return moved.get(0).figure();
        }

        /** One line for a person, naming each figure with its baseline and its recent median. */
        public String message() {
            StringBuilder b = new StringBuilder("tool ").append(tool).append(" on program ").append(program).append(": ");
            if (!weak) {
                b.append("every figure back within ").append(String.format(java.util.Locale.ROOT, "%.1f", 100 * band))
                        .append(" % of its baseline: ");
            }
            for (int i = 0; i < moved.size(); i++) {
                b.append(i == 0 ? "" : ", ").append(moved.get(i).text(band));
            }
            if (weak) {
                b.append(escalation ? " as well" : "").append("; check supply pressure or battery, then the hammer");
            }
            return b.toString();
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

    /** True while this tool on this program is WEAK and this figure is one of those that fell. */
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
            Reading[] now = new Reading[v.length];
            for (Figure f : Figure.values()) {
                double b = baseline[f.ordinal()];
                now[f.ordinal()] = b > 0 ? new Reading(f, b, median(recent[f.ordinal()], s.window())) : null;
            }
            // one state per tool and program: a figure that fell by the fraction raises it (or, when it is
            // already raised, is named as well); only every figure back within half the fraction, on either
            // side of its baseline, clears it, so a figure out of band the other way clears nothing
            List<Reading> fell = new ArrayList<>(v.length);
            for (Reading r : now) {
                if (r != null && !weak.get(r.figure()) && r.drop() >= s.dropFraction()) {
                    fell.add(r);
                }
            }
            if (!fell.isEmpty()) {
                boolean escalation = anyWeak();
                fell.sort((a, b) -> Double.compare(b.drop(), a.drop()));
                for (Reading r : fell) {
                    weak.put(r.figure(), true);
                }
                return List.of(new Change(tool, program, true, fell, s.dropFraction() / 2, escalation));
            }
            if (!anyWeak()) {
                return List.of();
            }
            List<Reading> all = new ArrayList<>(v.length);
            for (Reading r : now) {
                if (r != null) {
                    if (Math.abs(r.change()) >= s.dropFraction() / 2) {
                        return List.of();
                    }
                    all.add(r);
                }
            }
            for (Figure f : Figure.values()) {
                weak.put(f, false);
            }
            return List.of(new Change(tool, program, false, all, s.dropFraction() / 2, false));
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
