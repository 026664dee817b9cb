package hammerstep.signal;

/**
 * First stage of the signal chain: removes the zero offset, optionally low-pass filters, and
 * watches the signal for faults. Works on blocks of N·m samples into a caller's buffer; allocates
 * nothing after construction. Single-threaded: one owner feeds it.
 *
 * <p>Auto-zero: while the caller says the joint is idle, a quiet block (its samples spread less
 * than {@code idleBandNm}) moves the zero toward its mean with the configured time constant (the
 * first quiet block sets it outright). The zero never passes {@code zeroLimitNm}:
 * an offset beyond it is held at the limit and reported as {@link SignalFaults#ZERO_DRIFT}, so a
 * stuck bridge or a loose connector is seen instead of absorbed.
 */
public final class Conditioner {

    private final Conditioning settings;
    private final double samplePeriodS;
    private final double rateHz;
    private final float overRange;
    private final long flatLineSamples;
    private final boolean filtered;
    private final double b0, b1, b2, a1, a2;

    /**
     * The zero, held in single precision like the samples it is taken from: its resolution (below
     * 10⁻⁷ of its value) lies far under any transducer's noise, and two trackers that followed the
     * same quiet signal from different starts come to hold exactly the same zero within some dozens
     * of quiet blocks rather than hundreds, which the split replay relies on.
     */
    private float zeroNm;
    private boolean zeroSet;
    private long flatSamples;
    private float lastValue = Float.NaN;
    private float lastGood;
    private int faults;
    private double z1, z2;

    public Conditioner(Conditioning settings, double rateHz) {
        if (!(rateHz > 0)) {
            throw new IllegalArgumentException("rateHz must be positive");
        }
        this.settings = settings;
        this.rateHz = rateHz;
        this.samplePeriodS = 1.0 / rateHz;
        this.overRange = Double.isNaN(settings.overRangeNm()) || settings.overRangeNm() <= 0
                ? Float.POSITIVE_INFINITY : (float) settings.overRangeNm();
        this.flatLineSamples = settings.flatLineMs() > 0 ? (long) Math.ceil(settings.flatLineMs() * 1e-3 * rateHz) : 0;
        double fc = settings.lowPassHz();
        this.filtered = fc > 0;
        if (filtered) {
            if (fc >= 0.5 * rateHz) {
                throw new IllegalArgumentException("low-pass cut-off " + fc + " Hz must be below half the sample rate");
            }
            // Bilinear-transform Butterworth, Q = 1/√2, pre-warped to fc.
            double k = Math.tan(Math.PI * fc / rateHz);
            double q = Math.sqrt(0.5);
            double norm = 1.0 / (1.0 + k / q + k * k);
            b0 = k * k * norm;
            b1 = 2.0 * b0;
            b2 = b0;
            a1 = 2.0 * (k * k - 1.0) * norm;
            a2 = (1.0 - k / q + k * k) * norm;
        } else {
            b0 = 1; b1 = 0; b2 = 0; a1 = 0; a2 = 0;
        }
    }

    /**
     * Conditions {@code in[offset, offset+length)} into {@code out[0, length)}.
     *
     * @param trackZero true while no rundown is under way, so auto-zero may follow the signal
     * @return the fault bits active after this block
     */
    public int process(float[] in, int offset, int length, float[] out, boolean trackZero) {
        float zero = zeroNm;
        // four independent accumulators keep the loop free of long dependency chains
        float max0 = Float.NEGATIVE_INFINITY, max1 = max0, max2 = max0, max3 = max0;
        float min0 = Float.POSITIVE_INFINITY, min1 = min0, min2 = min0, min3 = min0;
        float sum0 = 0f, sum1 = 0f, sum2 = 0f, sum3 = 0f;
        int i = 0;
        for (int last = length - 3; i < last; i += 4) {
            float x0 = in[offset + i];
            float x1 = in[offset + i + 1];
            float x2 = in[offset + i + 2];
            float x3 = in[offset + i + 3];
            max0 = x0 > max0 ? x0 : max0;
            max1 = x1 > max1 ? x1 : max1;
            max2 = x2 > max2 ? x2 : max2;
            max3 = x3 > max3 ? x3 : max3;
            min0 = x0 < min0 ? x0 : min0;
            min1 = x1 < min1 ? x1 : min1;
            min2 = x2 < min2 ? x2 : min2;
            min3 = x3 < min3 ? x3 : min3;
            sum0 += x0;
            sum1 += x1;
            sum2 += x2;
            sum3 += x3;
            out[i] = x0 - zero;
            out[i + 1] = x1 - zero;
            out[i + 2] = x2 - zero;
            out[i + 3] = x3 - zero;
        }
        for (; i < length; i++) {
            float x = in[offset + i];
            max0 = x > max0 ? x : max0;
            min0 = x < min0 ? x : min0;
            sum0 += x;
            out[i] = x - zero;
        }
        float max = Math.max(Math.max(max0, max1), Math.max(max2, max3));
        float min = Math.min(Math.min(min0, min1), Math.min(min2, min3));
        float sum = (sum0 + sum1) + (sum2 + sum3);
        int now = faults & ~(OVER_RANGE_OR_NAN);
        if (sum != sum || max == Float.POSITIVE_INFINITY || min == Float.NEGATIVE_INFINITY) {
            now |= SignalFaults.NOT_FINITE;
            sum = repairNonFinite(out, length);
        }
        if (max >= overRange || -min >= overRange) {
            now |= SignalFaults.OVER_RANGE;
        }
        now = checkFlatLine(now, min, max, length);
        if (filtered) {
            filter(out, length);
        }
        if (trackZero && length > 0 && max - min < settings.idleBandNm()) {
            now = trackZero(now, sum / length, length);
        }
        faults = now;
        if (length > 0) {
            lastGood = out[length - 1] + zero;
        }
        return faults;
    }

    private static final int OVER_RANGE_OR_NAN = SignalFaults.OVER_RANGE | SignalFaults.NOT_FINITE;

    private float repairNonFinite(float[] out, int length) {
        float sum = 0f;
        float hold = lastGood - zeroNm;
        for (int i = 0; i < length; i++) {
            float v = out[i];
            if (Float.isFinite(v)) {
                hold = v;
            } else {
                out[i] = hold;
            }
            sum += out[i] + zeroNm;
        }
        return sum;
    }

    private int checkFlatLine(int now, float min, float max, int length) {
        if (flatLineSamples == 0 || length == 0) {
            return now;
        }
        if (min == max && (min == lastValue || flatSamples == 0)) {
            flatSamples += length;
        } else {
            flatSamples = min == max ? length : 0;
        }
        lastValue = max;
        if (flatSamples >= flatLineSamples) {
            return now | SignalFaults.FLAT_LINE;
        }
        return now & ~SignalFaults.FLAT_LINE;
    }

    private void filter(float[] x, int length) {
        double s1 = z1, s2 = z2;
        for (int i = 0; i < length; i++) {
            double in = x[i];
            double y = b0 * in + s1;
            s1 = b1 * in - a1 * y + s2;
            s2 = b2 * in - a2 * y;
            x[i] = (float) y;
        }
        z1 = s1;
        z2 = s2;
    }

    private int trackZero(int now, double mean, int length) {
        double limit = settings.zeroLimitNm();
        double target = mean;
        if (!zeroSet) {
            zeroSet = true;
        } else {
            double tau = settings.zeroTimeConstantMs() * 1e-3;
            double k = tau > 0 ? 1.0 - Math.exp(-length * samplePeriodS / tau) : 1.0;
            target = zeroNm + k * (mean - zeroNm);
        }
        if (limit > 0 && Math.abs(target) > limit) {
            zeroNm = (float) Math.copySign(limit, target);
            return now | SignalFaults.ZERO_DRIFT;
        }
        zeroNm = (float) target;
        return now & ~SignalFaults.ZERO_DRIFT;
    }

    /** Sets the zero to a measured offset (the {@code zero} command); a value past the limit is refused. */
    public boolean setZero(double offsetNm) {
        if (settings.zeroLimitNm() > 0 && Math.abs(offsetNm) > settings.zeroLimitNm()) {
            return false;
        }
        zeroNm = (float) offsetNm;
        zeroSet = true;
        faults &= ~SignalFaults.ZERO_DRIFT;
        return true;
    }

    /**
     * Everything this conditioner carries from one block to the next. Two conditioners with the
     * same settings and equal states turn the same samples into the same output and faults.
     */
    public record State(float zeroNm, boolean zeroSet, long flatSamples, float lastValue, float lastGood,
                        int faults, double z1, double z2) {
    }

    /** The carried state now; allocates (not for the sample path). */
    public State state() {
        return new State(zeroNm, zeroSet, flatSamples, lastValue, lastGood, faults, z1, z2);
    }

    /**
     * Puts this conditioner in {@code state} (taken from one with the same settings and rate), so that
     * it turns the samples that follow into what that one did: a stored trace's replay starts here.
     * Every component of {@link State} is set ({@code ConditionerStateTest} checks the round trip).
     */
    public void restore(State state) {
        zeroNm = state.zeroNm();
        zeroSet = state.zeroSet();
        flatSamples = state.flatSamples();
        lastValue = state.lastValue();
        lastGood = state.lastGood();
        faults = state.faults();
        z1 = state.z1();
        z2 = state.z2();
    }

    /**
     * Copies everything this conditioner carries from one block to the next into {@code into}, so that
     * {@code into.state()} equals {@code state()}. Allocation-free: the station calls it before every
     * block to keep the state a rundown starts from.
     */
    public void copyStateTo(Conditioner into) {
        into.zeroNm = zeroNm;
        into.zeroSet = zeroSet;
        into.flatSamples = flatSamples;
        into.lastValue = lastValue;
        into.lastGood = lastGood;
        into.faults = faults;
        into.z1 = z1;
        into.z2 = z2;
    }

    /** The offset currently subtracted, N·m. */
    public double zeroNm() {
        return zeroNm;
    }

    public int faults() {
        return faults;
    }

    public double rateHz() {
        return rateHz;
    }

    public Conditioning settings() {
        return settings;
    }
}
