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

    private double zeroNm;
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
        float zero = (float) zeroNm;
        float max = Float.NEGATIVE_INFINITY;
        float min = Float.POSITIVE_INFINITY;
        float sum = 0f;
        for (int i = 0; i < length; i++) {
            float x = in[offset + i];
            max = x > max ? x : max;
            min = x < min ? x : min;
            sum += x;
            out[i] = x - zero;
        }
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
        float hold = lastGood - (float) zeroNm;
        for (int i = 0; i < length; i++) {
            float v = out[i];
            if (Float.isFinite(v)) {
                hold = v;
            } else {
                out[i] = hold;
            }
            sum += out[i] + (float) zeroNm;
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
            zeroNm = Math.copySign(limit, target);
            return now | SignalFaults.ZERO_DRIFT;
        }
        zeroNm = target;
        return now & ~SignalFaults.ZERO_DRIFT;
    }

    /** Sets the zero to a measured offset (the {@code zero} command); a value past the limit is refused. */
    public boolean setZero(double offsetNm) {
        if (settings.zeroLimitNm() > 0 && Math.abs(offsetNm) > settings.zeroLimitNm()) {
            return false;
        }
        zeroNm = offsetNm;
        zeroSet = true;
        faults &= ~SignalFaults.ZERO_DRIFT;
        return true;
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
