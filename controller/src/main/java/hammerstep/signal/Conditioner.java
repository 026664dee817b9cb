package hammerstep.signal;

/**
 * First stage of the signal chain: removes the zero offset, optionally low-pass filters, and
 * watches the signal for faults. Works on blocks of N·m samples into a caller's buffer; allocates
 * nothing after its first block (impulse rejection sizes its work buffer then, and again only for a
 * block longer than any before). Single-threaded: one owner feeds it.
 *
 * <p>Impulse rejection (when {@code impulseNm} is set): see {@link ImpulseRejector}; it makes the
 * output run {@link #delaySamples()} behind the input. The same level arms a flat-top check: a pulse
 * that stays exactly constant beyond that level is clipped at a rail ({@code OVER_RANGE}).
 *
 * <p>Auto-zero: while the caller says the joint is idle, a quiet block (no sample further than
 * {@code idleBandNm} from the block's mean) moves the zero toward its mean with the configured time constant (the
 * first quiet block sets it outright). The zero never passes {@code zeroLimitNm}:
 * an offset beyond it is held at the limit and reported as {@link SignalFaults#ZERO_DRIFT}, so a
 * stuck bridge or a loose connector is seen instead of absorbed.
 */
public final class Conditioner {

    private final Conditioning settings;
    private final double samplePeriodS;
    private final double rateHz;
    private final float overRange;
    /** Over-range level of the fault check: the range, or {@link #ABSURD_NM} where none is known. */
    private final float faultLevel;
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

    /** Null when no mains frequency is set. */
    private final HumCanceller hum;
    /** Where no mains frequency is named (and impulse rejection is on): watchers at 50 and 60 Hz; else null. */
    private final HumCanceller watch50;
    private final HumCanceller watch60;
    /** Null when impulse rejection is off. */
    private final ImpulseRejector rejector;
    /** The last {@code HISTORY + delay} input samples, impulses replaced; the next block's context. */
    private final float[] tail;
    private boolean primed;
    private float[] work = new float[0];
    /** Impulses replaced since construction: an observation, not carried state (output never depends on it). */
    private long rejected;
    private final float clipLevel;
    private final int clipRunSamples;
    private int clipRun;
    private float clipValue = Float.NaN;

    /** A flat top this long (and at least {@link #MIN_FLAT_TOP_SAMPLES}) at or beyond the impulse level is clipping, ms. */
    public static final double FLAT_TOP_MS = 0.08;
    /**
     * Fewest exactly equal samples that make a flat top. A strike's crest, even noise-free, shows
     * two equal samples at most; a hydraulic pulse of 10 ms stored as int16 (scale = its peak / 32767)
     * about five at 100 kHz and two at 20 kHz, below the 0.08 ms there; a strike clipped by 5 % of its
     * peak stays flat for a fifth of its width, 4 samples of a 1 ms strike at 20 kHz.
     */
    public static final int MIN_FLAT_TOP_SAMPLES = 3;
    /**
     * A fundamental of unnamed mains hum this large (N·m peak) is a fault: with its harmonics it can
     * move a peak by the 10 N·m of the tolerance.
     */
    public static final float HUM_FAULT_NM = 6f;
    /**
     * Hum the canceller allows for before its first window is learned (the first 0.1 s after start,
     * or after a trace without chain state begins): a fundamental of 15 N·m with its harmonics, which
     * reach about 23 N·m together. Until then the idle counts as idle for learning with this much
     * more spread, and a rundown starts only this much above its start level, so that the hum itself
     * never starts one (the canceller cannot learn during a rundown).
     */
    public static final float HUM_SETTLING_NM = 25f;

    public Conditioner(Conditioning settings, double rateHz) {
        if (!(rateHz > 0)) {
            throw new IllegalArgumentException("rateHz must be positive");
        }
        this.settings = settings;
        this.rateHz = rateHz;
        this.samplePeriodS = 1.0 / rateHz;
        this.overRange = Double.isNaN(settings.overRangeNm()) || settings.overRangeNm() <= 0
                ? Float.POSITIVE_INFINITY : (float) settings.overRangeNm();
        this.faultLevel = Math.min(overRange, ABSURD_NM);
        this.flatLineSamples = settings.flatLineMs() > 0 ? (long) Math.ceil(settings.flatLineMs() * 1e-3 * rateHz) : 0;
        if (settings.impulseNm() > 0) {
            this.rejector = new ImpulseRejector(settings.impulseNm(), rateHz);
            this.tail = new float[ImpulseRejector.HISTORY + rejector.lookAhead()];
            // where the range is known, reaching it is the over-range check; the flat-top check is for
            // a rail below an unknown range (a bare CSV), where quantised crests of a known ADC can't
            // be mistaken for a rail
            this.clipLevel = Float.isInfinite(overRange) ? (float) settings.impulseNm() : 0f;
        } else {
            this.rejector = null;
            this.tail = new float[0];
            this.clipLevel = 0f;
        }
        this.hum = settings.mainsHz() > 0 ? new HumCanceller(settings.mainsHz(), rateHz) : null;
        boolean watch = hum == null && settings.impulseNm() > 0 && rateHz > 2 * 60;
        this.watch50 = watch ? new HumCanceller(50, rateHz, false) : null;
        this.watch60 = watch ? new HumCanceller(60, rateHz, false) : null;
        this.clipRunSamples = Math.max(MIN_FLAT_TOP_SAMPLES, (int) Math.ceil(FLAT_TOP_MS * 1e-3 * rateHz));
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
     * Conditions {@code in[offset, offset+length)} into {@code out[0, length)}. With impulse
     * rejection on, the output runs {@link #delaySamples()} behind the input: {@code out[i]} is the
     * input sample taken {@code delaySamples()} sample periods before {@code in[offset+i]}.
     *
     * @param trackZero true while no rundown is under way, so auto-zero may follow the signal
     * @return the fault bits active after this block
     */
    public int process(float[] in, int offset, int length, float[] out, boolean trackZero) {
        float[] src = in;
        int base = offset;
        int rawFaults = 0;
        if (rejector != null && length > 0) {
            base = carryIn(in, offset, length);
            src = work;
        }
        int humPhase = 0;
        if (hum != null) {
            // the allowance belongs to the block as it is cleaned now, before this block's learning
            settlingNm = hum.learned() ? 0f : HUM_SETTLING_NM;
            humPhase = hum.phase();
        }
        int watchPhase50 = 0, watchPhase60 = 0;
        if (watch50 != null) {
            watchPhase50 = watch50.subtract(src, base, out, length);
            watchPhase60 = watch60.subtract(src, base, out, length);
        }
        float zero = zeroNm;
        // one pass: hum subtracted, extremes and sum taken, zero subtracted; with impulse rejection on,
        // the same pass finds the largest bend, and only a block that bends as sharply as an impulse
        // (rare: a strike's crest bends far less) has its impulses replaced and is passed over again
        if (rejector != null && length > 0) {
            pass(src, base, length, out, zero, humPhase, true);
            if (largestBend >= rejector.level()) {
                // the rejector would replace a lone absurd or non-finite sample as an impulse: see it
                // first, wherever in the samples at hand a replacement could reach
                rawFaults = beyondRange(work, 0, tail.length + length);
                rejected += rejector.reject(work, ImpulseRejector.HISTORY + 1, base + length + 1);
                pass(src, base, length, out, zero, humPhase, false);
            }
            System.arraycopy(work, length, tail, 0, tail.length);
        } else {
            pass(src, base, length, out, zero, humPhase, false);
        }
        if (hum != null) {
            hum.advance(length);
        }
        float max = blockMax;
        float min = blockMin;
        float sum = blockSum;
        int now = faults & ~(OVER_RANGE_OR_NAN);
        if (sum != sum || max == Float.POSITIVE_INFINITY || min == Float.NEGATIVE_INFINITY) {
            now |= SignalFaults.NOT_FINITE;
            sum = repairNonFinite(out, length);
        }
        // rounding is monotone: the largest x − zero is the largest x less zero
        outHigh = filtered || (now & SignalFaults.NOT_FINITE) != 0 ? Float.NaN : max - zero;
        outLow = filtered || (now & SignalFaults.NOT_FINITE) != 0 ? Float.NaN : min - zero;
        if (max >= faultLevel || -min >= faultLevel) {
            now |= SignalFaults.OVER_RANGE;
        }
        now |= rawFaults;
        if (clipLevel > 0 && length > 0) {
            // the flat-top check looks at the samples as they came: a rail is flat, the rail less hum
            // is not; without hum subtraction the block's extremes are those of the samples as they came
            now = hum == null ? checkFlatTop(now, src, base, length, min, max, true)
                    : checkFlatTop(now, src, base, length, min - hum.amplitudeNm(), max + hum.amplitudeNm(), false);
        }
        now = checkFlatLine(now, min, max, length);
        boolean quiet = false;
        boolean idle = false;
        boolean humIdle = false;
        if (length > 0) {
            float mean = sum / length;
            // quiet: every sample within the idle band of the block's mean, a test that noise of a few
            // N·m rms passes over thousands of samples where a spread test would fail
            float band = (float) settings.idleBandNm();
            quiet = max - mean < band && mean - min < band;
            idle = trackZero && quiet;
            // hum that makes the idle not quiet must still be seen; a strike is far beyond twice the band
            humIdle = trackZero && max - mean < 2 * band && mean - min < 2 * band;
            if (settlingNm > 0) {
                // before the first window the hum is all there: learn from an idle that spreads by it,
                // and take no zero (a block shorter than a mains period has the hum's mean, not the offset's)
                float settling = band + settlingNm;
                idle = trackZero && max - mean < settling && mean - min < settling;
                quiet = false;
            }
            if (trackZero && quiet && !zeroSet) {
                // the first zero applies to the very block it comes from: the idle before the first
                // rundown, as the station takes it at start
                now = trackZero(now, mean, length);
                float shift = zeroNm - zero;
                for (int k = 0; k < length; k++) {
                    out[k] -= shift;
                }
                outHigh -= shift;
                outLow -= shift;
                quiet = false;
            }
        }
        if (hum != null) {
            // learns from what is left of the hum in a quiet idle block, before any filter shifts its phase
            hum.learn(out, 0, length, humPhase, 0f, idle);
        }
        if (watch50 != null) {
            boolean ended = watch50.learn(out, 0, length, watchPhase50, 0f, humIdle);
            // both watchers learn from the same samples and end their windows together
            if (watch60.learn(out, 0, length, watchPhase60, 0f, humIdle) || ended) {
                now = checkHum(now);
            }
        }
        if (filtered) {
            filter(out, length);
        }
        if (trackZero && quiet) {
            now = trackZero(now, sum / length, length);
        }
        faults = now;
        if (length > 0) {
            lastGood = out[length - 1] + zeroNm;
        }
        return faults;
    }

    /**
     * Copies the carried samples and the block into {@link #work}; {@link #process} replaces the
     * impulses that can be decided now and carries the last {@code HISTORY + delay} samples on.
     *
     * @return where in {@link #work} the block's output starts
     */
    private int carryIn(float[] in, int offset, int length) {
        int keep = tail.length;
        int end = keep + length;
        if (work.length < end) {
            work = new float[end]; // once, on the first block longer than any before
        }
        if (!primed) {
            java.util.Arrays.fill(tail, in[offset]);
            primed = true;
        }
        System.arraycopy(tail, 0, work, 0, keep);
        System.arraycopy(in, offset, work, keep, length);
        return ImpulseRejector.HISTORY;
    }

    /** The hum model where none is subtracted: the oscillator stands at its one entry, 0 (x − 0 is x). */
    private static final float[] NO_HUM = new float[1];

    // what the last pass found, read back by process (four fields rather than an allocated result)
    private float blockMax;
    private float blockMin;
    private float blockSum;
    /** The largest |second difference| of the samples as they came ({@link ImpulseRejector}'s test). */
    private float largestBend;

    /**
     * The block's one pass: {@code out[i] = s[b+i] − hum − zero}, with the extremes and the sum of
     * the samples less hum, and, with {@code bends} (over {@link #work}, which holds a sample before
     * the block and the look-ahead after it), the largest bend of the samples as they came at
     * {@code b .. b+length−1} (where {@link ImpulseRejector#reject} would look for impulses).
     *
     * <p>Shaped for the JIT: four independent accumulators of each kind keep the loop free of long
     * dependency chains; the extremes are taken as integers ({@link #key}) with branch-free integer
     * max and min, since a float compare-and-keep is a branch that a strike's flank or a hum's rising
     * half mispredicts on every other sample; a new largest bend is rare, so its compare-and-keep
     * stays a well-predicted branch. Only where the result could differ from comparing floats (a NaN,
     * or an extreme that is a zero of either sign) are the extremes taken again as before.
     */
    private void pass(float[] s, int b, int length, float[] out, float zero, int phase, boolean bends) {
        float[] t = hum == null ? NO_HUM : hum.table();
        int step = hum == null ? 0 : hum.step();
        int p = phase;
        int max0 = KEY_NEGATIVE_INFINITY, max1 = max0, max2 = max0, max3 = max0;
        int min0 = KEY_POSITIVE_INFINITY, min1 = min0, min2 = min0, min3 = min0;
        float sum0 = 0f, sum1 = 0f, sum2 = 0f, sum3 = 0f;
        float m0 = 0f, m1 = 0f, m2 = 0f, m3 = 0f;
        int i = 0;
        for (int last = length - 3; i < last; i += 4) {
            float r0 = s[b + i];
            float r1 = s[b + i + 1];
            float r2 = s[b + i + 2];
            float r3 = s[b + i + 3];
            if (bends) {
                float r4 = s[b + i + 4];
                float d0 = Math.abs(r1 - 2f * r0 + s[b + i - 1]);
                float d1 = Math.abs(r2 - 2f * r1 + r0);
                float d2 = Math.abs(r3 - 2f * r2 + r1);
                float d3 = Math.abs(r4 - 2f * r3 + r2);
                if (d0 > m0) {
                    m0 = d0;
                }
                if (d1 > m1) {
                    m1 = d1;
                }
                if (d2 > m2) {
                    m2 = d2;
                }
                if (d3 > m3) {
                    m3 = d3;
                }
            }
            float x0 = r0 - t[p >>> HumCanceller.SHIFT];
            float x1 = r1 - t[(p + step) >>> HumCanceller.SHIFT];
            float x2 = r2 - t[(p + 2 * step) >>> HumCanceller.SHIFT];
            float x3 = r3 - t[(p + 3 * step) >>> HumCanceller.SHIFT];
            p += 4 * step;
            int k0 = key(x0);
            int k1 = key(x1);
            int k2 = key(x2);
            int k3 = key(x3);
            max0 = Math.max(max0, k0);
            max1 = Math.max(max1, k1);
            max2 = Math.max(max2, k2);
            max3 = Math.max(max3, k3);
            min0 = Math.min(min0, k0);
            min1 = Math.min(min1, k1);
            min2 = Math.min(min2, k2);
            min3 = Math.min(min3, k3);
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
            float r = s[b + i];
            if (bends) {
                float d = Math.abs(s[b + i + 1] - 2f * r + s[b + i - 1]);
                if (d > m0) {
                    m0 = d;
                }
            }
            float x = r - t[p >>> HumCanceller.SHIFT];
            p += step;
            int k = key(x);
            max0 = Math.max(max0, k);
            min0 = Math.min(min0, k);
            sum0 += x;
            out[i] = x - zero;
        }
        blockMax = unkey(Math.max(Math.max(max0, max1), Math.max(max2, max3)));
        blockMin = unkey(Math.min(Math.min(min0, min1), Math.min(min2, min3)));
        blockSum = (sum0 + sum1) + (sum2 + sum3);
        largestBend = Math.max(Math.max(m0, m1), Math.max(m2, m3));
        boolean asFloats = blockMax == blockMax && blockMin == blockMin && blockMax != 0f && blockMin != 0f;
        if (!asFloats) {
            // a NaN (which the float compares pass over) or a zero (whose sign the first compare kept)
            floatExtremes(s, b, length, t, phase, step);
        }
    }

    /**
     * A float's bits as an int that orders as the float does (−0 just below +0; a NaN beyond the
     * infinities, of the sign its sign bit gives): the sign bit stays, the others flip for a
     * negative. Its own inverse.
     */
    private static int key(float v) {
        int bits = Float.floatToRawIntBits(v);
        return bits ^ ((bits >> 31) >>> 1);
    }

    private static float unkey(int key) {
        return Float.intBitsToFloat(key ^ ((key >> 31) >>> 1));
    }

    private static final int KEY_NEGATIVE_INFINITY = key(Float.NEGATIVE_INFINITY);
    private static final int KEY_POSITIVE_INFINITY = key(Float.POSITIVE_INFINITY);

    /**
     * The extremes of the samples less hum by float compares, four accumulators as in {@link #pass},
     * for the rare block where that differs from comparing keys: a NaN is passed over, and of equal
     * zeros each accumulator keeps the first.
     */
    private void floatExtremes(float[] s, int b, int length, float[] t, int phase, int step) {
        float max0 = Float.NEGATIVE_INFINITY, max1 = max0, max2 = max0, max3 = max0;
        float min0 = Float.POSITIVE_INFINITY, min1 = min0, min2 = min0, min3 = min0;
        int p = phase;
        int quads = length & ~3; // the samples pass takes four at a time; the rest go to the first
        for (int i = 0; i < length; i++) {
            float x = s[b + i] - t[p >>> HumCanceller.SHIFT];
            p += step;
            switch (i < quads ? i & 3 : 0) {
                case 0:
                    max0 = x > max0 ? x : max0;
                    min0 = x < min0 ? x : min0;
                    break;
                case 1:
                    max1 = x > max1 ? x : max1;
                    min1 = x < min1 ? x : min1;
                    break;
                case 2:
                    max2 = x > max2 ? x : max2;
                    min2 = x < min2 ? x : min2;
                    break;
                default:
                    max3 = x > max3 ? x : max3;
                    min3 = x < min3 ? x : min3;
                    break;
            }
        }
        blockMax = Math.max(Math.max(max0, max1), Math.max(max2, max3));
        blockMin = Math.min(Math.min(min0, min1), Math.min(min2, min3));
    }

    /**
     * A pulse flattened at a rail: {@code clipRunSamples} exactly equal samples at or beyond the
     * impulse level, and none larger in magnitude in the block. No strike holds its torque to the last
     * bit for that long; an amplifier or ADC at its limit does, and nothing passes its limit. A run of
     * equal samples below the block's largest magnitude (a slow rebound trough after a strike, stored
     * in fine int16 steps, where noise made three samples read the same count) is a coincidence, not a
     * rail. Reported as {@code OVER_RANGE}.
     */
    private int checkFlatTop(int now, float[] src, int base, int length, float min, float max, boolean exact) {
        float level = clipLevel;
        if (max < level && min > -level) {
            clipRun = 0;
            return now;
        }
        float high = max;
        float low = min;
        if (!exact) {
            // branch-free as in pass; a zero's sign cannot matter here (a rail is beyond the level)
            int highKey = KEY_NEGATIVE_INFINITY;
            int lowKey = KEY_POSITIVE_INFINITY;
            for (int i = 0; i < length; i++) {
                int k = key(src[base + i]);
                highKey = Math.max(highKey, k);
                lowKey = Math.min(lowKey, k);
            }
            high = unkey(highKey);
            low = unkey(lowKey);
            if (high != high || low != low) {
                // a NaN, which the float compares pass over
                high = Float.NEGATIVE_INFINITY;
                low = Float.POSITIVE_INFINITY;
                for (int i = 0; i < length; i++) {
                    float v = src[base + i];
                    high = v > high ? v : high;
                    low = v < low ? v : low;
                }
            }
        }
        // only the block's largest magnitude can be a rail: nothing passes a rail
        float extreme = high > -low ? high : -low;
        boolean flat = high >= level && high >= extreme && flatAt(src, base, length, high)
                || low <= -level && -low >= extreme && flatAt(src, base, length, low);
        // carried on: the run of equal samples the block ends with
        int end = base + length - 1;
        float last = src[end];
        int k = end - 1;
        while (k >= base && src[k] == last) {
            k--;
        }
        int trailing = end - k;
        clipRun = trailing == length && last == clipValue ? clipRun + length : trailing;
        clipValue = last;
        return flat ? now | SignalFaults.OVER_RANGE : now;
    }

    /**
     * Whether {@code value} stands {@code clipRunSamples} times in a row in the block, a run at its
     * start lengthened by the one the last block ended with.
     */
    private boolean flatAt(float[] src, int base, int length, float value) {
        int end = base + length;
        int i = base;
        while (i < end) {
            while (i < end && src[i] != value) {
                i++;
            }
            int start = i;
            while (i < end && src[i] == value) {
                i++;
            }
            int run = i - start + (start == base && value == clipValue ? clipRun : 0);
            if (run >= clipRunSamples) {
                return true;
            }
        }
        return false;
    }

    /**
     * Unnamed hum: {@code HUM} from the first idle window whose 50 or 60 Hz fundamental reaches
     * {@link #HUM_FAULT_NM}, until one shows less than half of it (the bit holds through rundowns,
     * where nothing is measured). Rundowns in between are sensor
     * faults: the hum would move their peaks by about as much.
     */
    private int checkHum(int now) {
        float worst = Math.max(watch50.amplitudeNm(), watch60.amplitudeNm());
        if (worst >= HUM_FAULT_NM) {
            return now | SignalFaults.HUM;
        }
        return worst < 0.5f * HUM_FAULT_NM ? now & ~SignalFaults.HUM : now;
    }

    /**
     * Beyond any rotary torque transducer's range (the largest are in the MN·m: transducer practice,
     * memory): a sample this large is a fault even where the range is not known (a bare trace).
     */
    public static final float ABSURD_NM = 1e6f;

    /**
     * {@code OVER_RANGE} for a sample beyond any transducer ({@link #ABSURD_NM}) and {@code NOT_FINITE},
     * in samples as they came, before impulse rejection replaces any (a spike beyond the transducer's
     * own range but not absurd stays the rejector's to judge).
     */
    private static int beyondRange(float[] in, int offset, int length) {
        float level = ABSURD_NM;
        int faults = 0;
        for (int i = offset, end = offset + length; i < end; i++) {
            float v = in[i];
            if (!(v < level && v > -level)) {
                faults |= v != v || Float.isInfinite(v) ? SignalFaults.NOT_FINITE : SignalFaults.OVER_RANGE;
            }
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
     * {@code tail} holds the input samples not yet given out (impulse rejection's look-ahead) and
     * the two before them; it is compared by content. {@code hum} is the hum canceller's state,
     * null when no mains frequency is set; {@code watch50} and {@code watch60} those of the hum
     * watchers, null unless no mains frequency is set and impulse rejection is on.
     */
    public record State(float zeroNm, boolean zeroSet, long flatSamples, float lastValue, float lastGood,
                        int faults, double z1, double z2, float[] tail, boolean primed, int clipRun,
                        float clipValue, HumCanceller.State hum, HumCanceller.State watch50,
                        HumCanceller.State watch60) {

        @Override
        public boolean equals(Object o) {
            return o instanceof State s && Float.compare(zeroNm, s.zeroNm) == 0 && zeroSet == s.zeroSet
                    && flatSamples == s.flatSamples && Float.compare(lastValue, s.lastValue) == 0
                    && Float.compare(lastGood, s.lastGood) == 0 && faults == s.faults
                    && Double.compare(z1, s.z1) == 0 && Double.compare(z2, s.z2) == 0
                    && java.util.Arrays.equals(tail, s.tail) && primed == s.primed && clipRun == s.clipRun
                    && Float.compare(clipValue, s.clipValue) == 0 && java.util.Objects.equals(hum, s.hum)
                    && java.util.Objects.equals(watch50, s.watch50) && java.util.Objects.equals(watch60, s.watch60);
        }

        @Override
        public int hashCode() {
            return java.util.Objects.hash(zeroNm, zeroSet, flatSamples, lastValue, lastGood, faults, z1, z2,
                    java.util.Arrays.hashCode(tail), primed, clipRun, clipValue, hum, watch50, watch60);
        }

        @Override
        public String toString() {
            return "State[zeroNm=" + zeroNm + ", zeroSet=" + zeroSet + ", flatSamples=" + flatSamples
                    + ", lastValue=" + lastValue + ", lastGood=" + lastGood + ", faults=" + faults + ", z1=" + z1
                    + ", z2=" + z2 + ", tail=" + java.util.Arrays.toString(tail) + ", primed=" + primed
                    + ", clipRun=" + clipRun + ", clipValue=" + clipValue + ", hum=" + hum
                    + ", watch50=" + watch50 + ", watch60=" + watch60 + "]";
        }
    }

    /** The carried state now; allocates (not for the sample path). */
    public State state() {
        return new State(zeroNm, zeroSet, flatSamples, lastValue, lastGood, faults, z1, z2, tail.clone(), primed,
                clipRun, clipValue, hum == null ? null : hum.state(), watch50 == null ? null : watch50.state(),
                watch60 == null ? null : watch60.state());
    }

    /**
     * How many sample periods the output runs behind the input: the look-ahead impulse rejection
     * needs (the widest impulse and two samples), 0 with rejection off. A caller stamping output
     * samples with times subtracts this many periods.
     */
    public int delaySamples() {
        return rejector == null ? 0 : rejector.lookAhead();
    }

    /** Impulses replaced since construction (in idle and in rundowns alike). */
    public long rejectedImpulses() {
        return rejected;
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
        System.arraycopy(state.tail(), 0, tail, 0, tail.length);
        primed = state.primed();
        clipRun = state.clipRun();
        clipValue = state.clipValue();
        if (hum != null && state.hum() != null) {
            hum.restore(state.hum());
        }
        if (watch50 != null && state.watch50() != null) {
            watch50.restore(state.watch50());
        }
        if (watch60 != null && state.watch60() != null) {
            watch60.restore(state.watch60());
        }
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
        System.arraycopy(tail, 0, into.tail, 0, tail.length);
        into.primed = primed;
        into.clipRun = clipRun;
        into.clipValue = clipValue;
        if (hum != null) {
            hum.copyTo(into.hum);
        }
        if (watch50 != null) {
            watch50.copyTo(into.watch50);
        }
        if (watch60 != null) {
            watch60.copyTo(into.watch60);
        }
    }

    /**
     * How much hum may still be in the block last conditioned, N·m: {@link #HUM_SETTLING_NM} when a
     * named mains frequency's canceller had learned nothing yet as it cleaned the block, else 0. The
     * joint monitor raises its start levels by it.
     */
    public float humSettlingNm() {
        return settlingNm;
    }

    /**
     * The largest sample of the block last conditioned, as {@link #process} wrote it out, N·m; NaN
     * when it is not known without looking (a low-pass filter ran over it, or a non-finite sample was
     * repaired). With {@link #conditionedLow()} it lets an idle block be passed over whole.
     */
    public float conditionedHigh() {
        return outHigh;
    }

    /** The smallest sample of the block last conditioned, as written out, N·m; NaN as for {@link #conditionedHigh()}. */
    public float conditionedLow() {
        return outLow;
    }

    private float outHigh = Float.NaN;
    private float outLow = Float.NaN;

    /** {@link #humSettlingNm()} of the block last conditioned. */
    private float settlingNm;

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
