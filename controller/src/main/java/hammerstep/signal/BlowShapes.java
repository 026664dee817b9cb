package hammerstep.signal;

/**
 * The shape of each blow's main lobe, for the residual-torque estimate: fed the same samples as the
 * {@link PulseDetector} (tightening sense positive), it keeps each lobe that rises from the floor
 * (the release level) through {@code countAbove} and falls back below the floor, and at the lobe's end
 * reads its figures once: peak, impulse ∫T dt above the floor, duration, and whether the blow turned
 * the nut, judged from the shape alone.
 *
 * <p>What the shape shows (the station's signal, no model state): a blow on a stuck nut is an elastic
 * lobe, close to a half-sine, whose fall steepens from the peak to the floor (mean ÷ peak about 2/π).
 * A blow that turns the nut breaks it free near the top: the torque drops fast after the peak, then
 * runs flat (the nut sliding against its running torque) until the nut sticks again, and only then
 * falls off elastically: a knee. So a blow {@linkplain Kind#TURNING turned} the nut when, walking back
 * from the floor along the final fall, the fall flattens out (the knee) before the peak and there is a
 * drop at least as steep as the final fall between the peak and the knee. The knee must lie before the
 * last {@link #FALL_SAMPLES} samples over which the final fall is read: a fall that only slows down as it
 * reaches the floor (a stiff strike snapping back) has no knee, and is {@linkplain Kind#ELASTIC elastic}. An oil-pulse (hydraulic)
 * pulse ends in a long decaying tail, its fall far gentler at the floor than after the peak:
 * {@linkplain Kind#HYDRAULIC hydraulic}. The sliding part is what carries the running torque: the nut
 * starts and ends it at rest, so over it the mean torque equals the friction the nut turned against
 * (impulse and momentum). It is read as the part of the lobe from where the rise first reaches the
 * mean of what follows it up to the knee ({@link #slipNm(int)}).
 *
 * <p>Allocation-free per sample and per blow; single-threaded. A lobe longer than {@link #MAX_LOBE}
 * samples keeps its peak and impulse but its shape is {@link Kind#UNKNOWN}.
 */
public final class BlowShapes {

    /** What a blow's shape says about the nut. */
    public enum Kind {
        /** Too short or too long a lobe to read a shape from. */
        UNKNOWN,
        /** An elastic lobe: the nut did not turn (or turned too little to show). */
        ELASTIC,
        /** Broke the nut free: a drop after the peak, a flat run, a knee. */
        TURNING,
        /** A hydraulic (oil-pulse) pulse: a long decaying tail. */
        HYDRAULIC
    }

    /** Samples of one lobe kept for its shape: 80 ms at 50 kHz. */
    public static final int MAX_LOBE = 4096;
    /** Fewer samples than this above the floor carry no readable shape. */
    public static final int MIN_SHAPE_SAMPLES = 8;
    /** Completed lobes remembered until the detector reports their blow. */
    static final int RING = 8;
    /** Samples over which the final fall's slope is read. */
    static final int FALL_SAMPLES = 3;
    /** The final fall runs back to where the slope is less than this fraction of it: the knee. */
    static final double KNEE_FRACTION = 0.5;
    /** A hydraulic tail: the steepest fall after the peak at least this many times the fall at the floor. */
    static final double HYDRAULIC_RATIO = 2.5;

    private final float countAbove;
    private final float floor;
    private final float sense;
    private final double periodNs;
    private final double periodS;

    private final float[] lobe = new float[MAX_LOBE];
    private boolean open;
    private boolean reached;
    private int length;
    private double sum;
    private float peak;
    private long crossNs;

    private final long[] ringNs = new long[RING];
    private final byte[] ringKind = new byte[RING];
    private final double[] ringPeak = new double[RING];
    private final double[] ringImpulse = new double[RING];
    private final double[] ringDurationMs = new double[RING];
    private final double[] ringSlip = new double[RING];
    private final double[] ringKnee = new double[RING];
    private int ringNext;
    private int ringFilled;

    /**
     * @param countAboveNm a lobe counts once it reaches this (the program's {@code blows.count_above})
     * @param floorNm      the lobe runs while the torque is at or above this (the release level)
     * @param sense        +1, or -1 for a left-hand program whose strikes read negative
     */
    public BlowShapes(double countAboveNm, double floorNm, float sense, double rateHz) {
        this.countAbove = (float) countAboveNm;
        this.floor = (float) floorNm;
        this.sense = sense;
        this.periodNs = 1e9 / rateHz;
        this.periodS = 1.0 / rateHz;
    }

    /**
     * Reads {@code x[offset, offset+length)}, the first sample taken at {@code firstNs}: the same block
     * and arguments as {@link PulseDetector#process}, so that a lobe's crossing time is the blow's start.
     */
    public void process(float[] x, int offset, int length, long firstNs) {
        int end = offset + length;
        float level = floor;
        float s = sense;
        for (int i = offset; i < end; i++) {
            float v = s * x[i];
            if (v >= level) {
                if (!open) {
                    open = true;
                    reached = false;
                    this.length = 0;
                    sum = 0;
                    peak = v;
                }
                if (!reached && v >= countAbove) {
                    reached = true;
                    crossNs = firstNs + (long) ((i - offset) * periodNs);
                }
                int n = this.length;
                if (n < MAX_LOBE) {
                    lobe[n] = v;
                }
                this.length = n + 1;
                sum += v;
                if (v > peak) {
                    peak = v;
                }
            } else if (open) {
                close();
            }
        }
    }

    /** Closes a lobe still open (the end of a rundown). */
    public void flush() {
        if (open) {
            close();
        }
    }

    /** Forgets an open lobe and the lobes remembered (the start of a rundown). */
    public void reset() {
        open = false;
        ringFilled = 0;
    }

    private void close() {
        open = false;
        if (!reached) {
            return;
        }
        int k = ringNext;
        ringNext = (k + 1) % RING;
        ringFilled = Math.min(RING, ringFilled + 1);
        ringNs[k] = crossNs;
        ringPeak[k] = peak;
        ringImpulse[k] = sum * periodS;
        ringDurationMs[k] = length * periodS * 1e3;
        ringSlip[k] = Double.NaN;
        ringKnee[k] = Double.NaN;
        ringKind[k] = (byte) (length > MAX_LOBE ? Kind.UNKNOWN.ordinal() : read(k, lobe, length));
    }

    /** Reads the shape of {@code b[0, n)} into slot {@code k}; returns the kind's ordinal. */
    private int read(int k, float[] b, int n) {
        if (n < MIN_SHAPE_SAMPLES) {
            return Kind.UNKNOWN.ordinal();
        }
        int p = 0;
        for (int j = 1; j < n; j++) {
            if (b[j] > b[p]) {
                p = j;
            }
        }
        if (p >= n - FALL_SAMPLES - 1) {
            return Kind.UNKNOWN.ordinal();
        }
        double fall = (b[n - 1 - FALL_SAMPLES] - b[n - 1]) / FALL_SAMPLES;
        if (!(fall > 0)) {
            return Kind.UNKNOWN.ordinal();
        }
        // walk back along the final fall while it stays steep: knee = first sample of the final fall
        double steep = KNEE_FRACTION * fall;
        int knee = n - 1;
        while (knee - 1 > p && b[knee - 1] - b[knee] >= steep) {
            knee--;
        }
        // the final fall of an elastic unloading is steepest near the floor; a hydraulic tail is not
        double steepest = 0;
        for (int j = knee; j < n - 1; j++) {
            steepest = Math.max(steepest, b[j] - b[j + 1]);
        }
        if (steepest >= HYDRAULIC_RATIO * fall) {
            return Kind.HYDRAULIC.ordinal();
        }
        double drop = 0;
        for (int j = p; j < knee; j++) {
            drop = Math.max(drop, b[j] - b[j + 1]);
        }
        // the final fall's slope was read over the last FALL_SAMPLES samples: a knee inside them is no knee but
        // a fall slowing down into the floor (no elastic unload after a slide was seen), and a "slide" from the
        // peak down to the floor would read the lobe's mean as a running torque
        if (knee - p >= 2 && knee <= n - 1 - FALL_SAMPLES && drop >= fall) {
            ringKnee[k] = b[knee];
            ringSlip[k] = slipMean(b, p, knee);
            return Kind.TURNING.ordinal();
        }
        return Kind.ELASTIC.ordinal();
    }

    /**
     * Mean torque over the slide: from the peak to the knee, extended back up the rise while the rise
     * stands at or above the mean of what follows it (where the nut broke free).
     */
    private static double slipMean(float[] b, int p, int knee) {
        double s = 0;
        for (int j = p; j <= knee; j++) {
            s += b[j];
        }
        int count = knee - p + 1;
        int from = p;
        while (from > 0 && b[from - 1] * (count + 1) >= s + b[from - 1]) {
            from--;
            s += b[from];
            count++;
        }
        return s / count;
    }

    /**
     * The slot of the lobe that crossed {@code countAbove} at {@code crossNs} (within one sample), or
     * -1 when none is remembered. Figures of the slot stay valid until {@link #RING} more lobes close.
     */
    public int find(long crossNs) {
        long tolerance = (long) Math.ceil(periodNs);
        for (int i = 0; i < ringFilled; i++) {
            int k = (ringNext - 1 - i + RING) % RING;
            if (Math.abs(ringNs[k] - crossNs) <= tolerance) {
                return k;
            }
        }
        return -1;
    }

    public Kind kind(int slot) {
        return KINDS[ringKind[slot]];
    }

    public double peakNm(int slot) {
        return ringPeak[slot];
    }

    /** ∫T dt of the main lobe above the floor, N·m·s. */
    public double impulseNms(int slot) {
        return ringImpulse[slot];
    }

    /** Time the main lobe stayed at or above the floor, ms. */
    public double durationMs(int slot) {
        return ringDurationMs[slot];
    }

    /** Impulse ÷ duration: the lobe's mean torque, N·m. */
    public double meanNm(int slot) {
        return ringImpulse[slot] / (ringDurationMs[slot] * 1e-3);
    }

    /** Mean torque over the slide of a turning blow, N·m; NaN for other kinds. */
    public double slipNm(int slot) {
        return ringSlip[slot];
    }

    /** Torque at the knee (where the nut stuck again) of a turning blow, N·m; NaN for other kinds. */
    public double kneeNm(int slot) {
        return ringKnee[slot];
    }

    private static final Kind[] KINDS = Kind.values();
}
