package hammerstep.signal;

/**
 * Removes mains hum (the mains frequency and its harmonics up to the 5th) from a torque signal by
 * subtracting a learned copy of it: an adaptive canceller, not a filter. A notch or comb filter
 * rings on every strike and bends its crest; subtracting a model of the hum leaves a strike
 * exactly as it came.
 *
 * <p>The model is {@code h(θ) = Σ a_k cos kθ + b_k sin kθ} at the phase θ of an oscillator that
 * runs at the (tracked) mains frequency: a 32-bit phase accumulator, advanced by a fixed step per
 * sample, whose top bits index one period of the model held in a table ({@value #TABLE} entries,
 * taken at the middle of each step: the error of a 15 N·m fundamental is below 0.05 N·m). Per
 * sample that is an add, a shift and a subtraction; no sine is computed on the sample path.
 *
 * <p>Learning: over windows of {@value #WINDOW_S} s (5 periods at 50 Hz, 6 at 60 Hz) of samples
 * the caller calls idle, every {@code stride}-th residual (1000 per second) is projected onto the
 * harmonics; at the end of a window the projections are added to the coefficients, and the table
 * is rebuilt. A window the caller does not call idle from start to end (a rundown, or a block that
 * was not quiet) is dropped, so the coefficients stay frozen through a rundown while the
 * oscillator runs on: the model goes on being subtracted, at the right phase, and nothing of a
 * strike is learned. Two adjacent windows also measure how far the fundamental turned between
 * them, which is the error of the oscillator's frequency; half of it is corrected each window
 * (mains drifts by up to about ±1 % in a plant; the correction is limited to ±2 %). A rundown of a
 * few seconds then sees the phase off by a few degrees at most.
 *
 * <p>Watching only ({@code subtracting} false, where no mains frequency is named): the oscillator
 * runs and each idle window measures the fundamental afresh ({@link #amplitudeNm()}), nothing is
 * subtracted; the conditioner raises {@link SignalFaults#HUM} on it.
 *
 * <p>Allocates only when constructed. Single-threaded.
 */
public final class HumCanceller {

    /** Harmonics modelled: the mains frequency and its multiples up to this one (fewer below Nyquist). */
    public static final int MAX_HARMONIC = 5;
    /** Entries in one period of the model. */
    public static final int TABLE = 1024;
    /** The phase (a fraction of 2³²) shifted right by this many bits is the table entry. */
    static final int SHIFT = 32 - 10;
    /** A learning window, s. */
    public static final double WINDOW_S = 0.1;
    /** Learning samples per second (every {@code stride}-th sample). */
    public static final double LEARN_RATE_HZ = 1000;
    /** Frequency tracking needs a fundamental at least this large, N·m. */
    public static final double TRACK_ABOVE_NM = 1.0;
    /** Largest departure of the tracked frequency from the nominal one, as a fraction. */
    public static final double MAX_DEVIATION = 0.02;

    private final double rateHz;
    private final int harmonics;
    private final boolean subtracting;
    private final int stride;
    private final int windowCount;
    private final double windowS;
    private final int nominalStep;
    private final int maxStepDeviation;
    /**
     * cos(kθ_j) at [k−1][j], θ_j the middle of step j; shared, read only. One array per harmonic, so
     * that the table's rebuild reads each at the index it writes and the JIT can vectorise it.
     */
    private static final float[][] COSINES = new float[MAX_HARMONIC][TABLE];
    /** sin(kθ_j) likewise. */
    private static final float[][] SINES = new float[MAX_HARMONIC][TABLE];

    /*
     * Made once: a replay over an archive makes a canceller (and two hum watchers) per trace, and
     * 2048 to 10 240 sines and cosines each cost more than judging a short trace.
     */
    static {
        for (int k = 1; k <= MAX_HARMONIC; k++) {
            for (int j = 0; j < TABLE; j++) {
                double theta = 2 * Math.PI * k * (j + 0.5) / TABLE;
                COSINES[k - 1][j] = (float) Math.cos(theta);
                SINES[k - 1][j] = (float) Math.sin(theta);
            }
        }
    }
    /** The model over one period, from {@link #coefficients}. */
    private final float[] table = new float[TABLE];
    /** The coefficients {@link #table} was built from. */
    private final double[] inTable;
    /** The coefficients changed since the table was built (within one {@link #learn}). */
    private boolean changed;
    /** Sum of the model's amplitudes, from {@link #coefficients}. */
    private float amplitudeNm;

    // carried state
    private int phase;
    private int step;
    /** a_1, b_1, a_2, b_2, ...: the learned hum, N·m. */
    private final double[] coefficients;
    /** Projections of the current window's residuals, in the same order. */
    private final double[] sums;
    private int counted;
    private int next;
    private boolean adjacent;
    private double lastAngle;

    /**
     * @param mainsHz the nominal mains frequency (50 or 60 Hz)
     * @param rateHz  the sample rate
     */
    public HumCanceller(double mainsHz, double rateHz) {
        this(mainsHz, rateHz, true);
    }

    /**
     * @param subtracting false to watch only: the fundamental alone is measured, window by window,
     *                    and {@link #subtract} only advances the oscillator
     */
    public HumCanceller(double mainsHz, double rateHz, boolean subtracting) {
        if (!(mainsHz > 0) || !(rateHz > 2 * mainsHz)) {
            throw new IllegalArgumentException("mains " + mainsHz + " Hz needs a sample rate above twice it");
        }
        this.rateHz = rateHz;
        this.stride = Math.max(1, (int) Math.floor(rateHz / LEARN_RATE_HZ));
        double learnRate = rateHz / stride;
        this.subtracting = subtracting;
        this.harmonics = subtracting
                ? Math.max(1, Math.min(MAX_HARMONIC, (int) Math.floor(0.4 * learnRate / mainsHz))) : 1;
        this.windowCount = Math.max(1, (int) Math.round(WINDOW_S * rateHz / stride));
        this.windowS = windowCount * stride / rateHz;
        this.nominalStep = toStep(mainsHz);
        this.maxStepDeviation = (int) Math.round(MAX_DEVIATION * Math.abs((double) toStep(mainsHz)));
        this.step = nominalStep;
        this.coefficients = new double[2 * harmonics];
        this.sums = new double[2 * harmonics];
        this.inTable = new double[2 * harmonics];
    }

    /** The phase step per sample for {@code hz}, as a fraction of 2³² (wrapping, as the phase does). */
    private int toStep(double hz) {
        return (int) (long) Math.round(hz / rateHz * 4294967296.0);
    }

    /**
     * Writes {@code in[from, from+length)} less the model to {@code out[0, length)} and advances
     * the oscillator.
     *
     * @return the phase of the first sample, for {@link #learn}
     */
    public int subtract(float[] in, int from, float[] out, int length) {
        int p0 = phase;
        if (!subtracting) {
            phase = p0 + length * step;
            return p0;
        }
        int p = p0;
        int s = step;
        float[] t = table;
        for (int i = 0; i < length; i++) {
            out[i] = in[from + i] - t[p >>> SHIFT];
            p += s;
        }
        phase = p;
        return p0;
    }

    /** The model over one period, indexed by {@code phase >>> SHIFT}: for a caller fusing the subtraction into its own pass. */
    float[] table() {
        return table;
    }

    /** The oscillator's phase at the next sample, as a fraction of 2³². */
    int phase() {
        return phase;
    }

    /** The oscillator's phase step per sample, as a fraction of 2³². */
    int step() {
        return step;
    }

    /** Advances the oscillator over {@code length} samples, as {@link #subtract} does. */
    void advance(int length) {
        phase += length * step;
    }

    /**
     * Learns from a block already passed through {@link #subtract}, when {@code idle}; otherwise
     * drops the window under way.
     *
     * @param phase0 what {@link #subtract} returned for this block
     * @param zeroNm the offset to take off the residuals
     * @return whether a window ended in this block
     */
    public boolean learn(float[] x, int from, int length, int phase0, float zeroNm, boolean idle) {
        if (!idle) {
            if (counted > 0 || next != 0) {
                java.util.Arrays.fill(sums, 0.0);
                counted = 0;
                next = 0;
            }
            adjacent = false;
            if (!subtracting && (phase != 0 || amplitudeNm != 0f)) {
                // a watcher starts afresh after each rundown: two that saw the same rundown are then
                // in the same state, as the split replay needs
                phase = 0;
                java.util.Arrays.fill(coefficients, 0.0);
                java.util.Arrays.fill(inTable, 0.0);
                lastAngle = 0;
                amplitudeNm = 0f;
            }
            return false;
        }
        boolean ended = false;
        int h = harmonics;
        float[][] cos = COSINES;
        float[][] sin = SINES;
        double[] acc = sums;
        int i = next;
        for (; i < length; i += stride) {
            int j = (phase0 + i * step) >>> SHIFT;
            double r = x[from + i] - zeroNm;
            if (changed && subtracting) {
                // a window ended earlier in this block: the block was cleaned with the model before it
                for (int k = 0; k < h; k++) {
                    r -= (coefficients[2 * k] - inTable[2 * k]) * cos[k][j]
                            + (coefficients[2 * k + 1] - inTable[2 * k + 1]) * sin[k][j];
                }
            }
            for (int k = 0; k < h; k++) {
                acc[2 * k] += r * cos[k][j];
                acc[2 * k + 1] += r * sin[k][j];
            }
            if (++counted == windowCount) {
                endWindow();
                ended = true;
            }
        }
        next = i - length;
        if (changed) {
            rebuild();
        }
        return ended;
    }

    private void endWindow() {
        double scale = 2.0 / windowCount;
        for (int c = 0; c < coefficients.length; c++) {
            coefficients[c] = subtracting ? coefficients[c] + scale * sums[c] : scale * sums[c];
            sums[c] = 0.0;
        }
        counted = 0;
        double a = coefficients[0];
        double b = coefficients[1];
        double angle = Math.atan2(b, a);
        if (subtracting && Math.hypot(a, b) >= TRACK_ABOVE_NM) {
            if (adjacent) {
                // h = A cos(θ − φ): a hum running faster than the oscillator turns φ back
                double turned = Math.IEEEremainder(angle - lastAngle, 2 * Math.PI);
                double errorHz = -turned / (2 * Math.PI * windowS);
                int corrected = step + (int) Math.round(0.5 * errorHz / rateHz * 4294967296.0);
                step = Math.max(nominalStep - maxStepDeviation, Math.min(nominalStep + maxStepDeviation, corrected));
            }
            adjacent = true;
        } else {
            adjacent = false;
        }
        lastAngle = angle;
        changed = true;
    }

    private void rebuild() {
        int h = harmonics;
        double sum = 0;
        for (int k = 0; k < h; k++) {
            sum += Math.hypot(coefficients[2 * k], coefficients[2 * k + 1]);
        }
        amplitudeNm = (float) sum;
        System.arraycopy(coefficients, 0, inTable, 0, inTable.length);
        changed = false;
        if (!subtracting) {
            return;
        }
        float[] t = table;
        java.util.Arrays.fill(t, 0f);
        for (int k = 0; k < h; k++) {
            float a = (float) coefficients[2 * k];
            float b = (float) coefficients[2 * k + 1];
            float[] cos = COSINES[k];
            float[] sin = SINES[k];
            for (int j = 0; j < TABLE; j++) {
                t[j] += a * cos[j] + b * sin[j];
            }
        }
    }

    /**
     * True once a learning window has ended with something learned (a model is being subtracted).
     * Before that the hum is still in the signal: the caller allows for it (see
     * {@link Conditioner#humSettlingNm()}).
     */
    public boolean learned() {
        for (double c : coefficients) {
            if (c != 0.0) {
                return true;
            }
        }
        return false;
    }

    /** Peak of the learned fundamental and harmonics together (the sum of their amplitudes), N·m. */
    public float amplitudeNm() {
        return amplitudeNm;
    }

    /** The frequency the oscillator runs at now, Hz. */
    public double trackedHz() {
        return Integer.toUnsignedLong(step) * rateHz / 4294967296.0;
    }

    public int harmonics() {
        return harmonics;
    }

    /**
     * Everything carried from one block to the next (the table follows from the coefficients).
     *
     * @param phase        the oscillator's phase at the next sample, as a fraction of 2³²
     * @param step         its phase step per sample (the tracked frequency), as a fraction of 2³²
     * @param coefficients the learned hum, a_1, b_1, a_2, b_2, ... N·m
     * @param sums         the current window's projections
     * @param counted      learning samples in the current window
     * @param next         samples to skip in the next block before the next learning sample
     * @param adjacent     whether the last window ended right before the current one with a fundamental to track
     * @param lastAngle    phase of the fundamental at the end of the last window, rad
     */
    public record State(int phase, int step, double[] coefficients, double[] sums, int counted, int next,
                        boolean adjacent, double lastAngle) {

        @Override
        public boolean equals(Object o) {
            return o instanceof State s && phase == s.phase && step == s.step
                    && java.util.Arrays.equals(coefficients, s.coefficients) && java.util.Arrays.equals(sums, s.sums)
                    && counted == s.counted && next == s.next && adjacent == s.adjacent
                    && Double.compare(lastAngle, s.lastAngle) == 0;
        }

        @Override
        public int hashCode() {
            return java.util.Objects.hash(phase, step, java.util.Arrays.hashCode(coefficients),
                    java.util.Arrays.hashCode(sums), counted, next, adjacent, lastAngle);
        }

        @Override
        public String toString() {
            return "HumCanceller.State[phase=" + phase + ", step=" + step + ", coefficients="
                    + java.util.Arrays.toString(coefficients) + ", sums=" + java.util.Arrays.toString(sums)
                    + ", counted=" + counted + ", next=" + next + ", adjacent=" + adjacent + ", lastAngle="
                    + lastAngle + "]";
        }
    }

    /** The carried state now; allocates (not for the sample path). */
    public State state() {
        return new State(phase, step, coefficients.clone(), sums.clone(), counted, next, adjacent, lastAngle);
    }

    /** Takes over a state from {@link #state()} of a canceller with the same frequency and rate; allocates nothing. */
    public void restore(State s) {
        phase = s.phase();
        step = s.step();
        System.arraycopy(s.coefficients(), 0, coefficients, 0, coefficients.length);
        System.arraycopy(s.sums(), 0, sums, 0, sums.length);
        counted = s.counted();
        next = s.next();
        adjacent = s.adjacent();
        lastAngle = s.lastAngle();
        rebuild();
    }

    /**
     * Copies everything this canceller carries, and the table built from it, into {@code into} (same
     * frequency and rate), so that {@code into.state()} equals {@code state()}; allocates nothing.
     */
    public void copyTo(HumCanceller into) {
        into.phase = phase;
        into.step = step;
        System.arraycopy(coefficients, 0, into.coefficients, 0, coefficients.length);
        System.arraycopy(sums, 0, into.sums, 0, sums.length);
        into.counted = counted;
        into.next = next;
        into.adjacent = adjacent;
        into.lastAngle = lastAngle;
        System.arraycopy(table, 0, into.table, 0, table.length);
        System.arraycopy(inTable, 0, into.inTable, 0, inTable.length);
        into.changed = changed;
        into.amplitudeNm = amplitudeNm;
    }
}
