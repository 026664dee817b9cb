package hammerstep.trace;

/**
 * Keeps the most recent samples of the torque signal in a preallocated ring, so that a joint's
 * trace (with a little of the signal before its rundown started) can be cut out when the joint
 * is judged. Fed on the station thread with every block; allocation-free. Sample times follow
 * from the first block's time and the fixed rate.
 */
public final class TraceRecorder implements SampleSink {

    private final float[] ring;
    private final double rateHz;
    private final double periodNs;
    private long written;
    private long firstNs;
    private boolean started;

    /** @param capacitySamples samples kept; a joint longer than this keeps only its last part */
    public TraceRecorder(double rateHz, int capacitySamples) {
        if (!(rateHz > 0) || capacitySamples < 1) {
            throw new IllegalArgumentException("rate " + rateHz + " Hz, capacity " + capacitySamples);
        }
        this.ring = new float[capacitySamples];
        this.rateHz = rateHz;
        this.periodNs = 1e9 / rateHz;
    }

    /** A recorder holding {@code seconds} of signal at {@code rateHz}. */
    public static TraceRecorder forSeconds(double rateHz, double seconds) {
        return new TraceRecorder(rateHz, (int) Math.min(Integer.MAX_VALUE - 8, Math.ceil(rateHz * seconds)));
    }

    @Override
    public void onSamples(float[] samples, int offset, int length, long firstSampleNs) {
        if (!started) {
            firstNs = firstSampleNs;
            started = true;
        }
        int n = ring.length;
        int from = offset;
        int len = length;
        if (len > n) {
            from += len - n;
            written += len - n;
            len = n;
        }
        int at = (int) (written % n);
        int first = Math.min(len, n - at);
        System.arraycopy(samples, from, ring, at, first);
        if (first < len) {
            System.arraycopy(samples, from + first, ring, 0, len - first);
        }
        written += len;
    }

    /** Index of the sample taken at (or just after) {@code ns}. */
    long indexAt(long ns) {
        return (long) Math.ceil((ns - firstNs) / periodNs - 1e-6);
    }

    /** Time of sample {@code index}. */
    public long timeOf(long index) {
        return firstNs + Math.round(index * periodNs);
    }

    /**
     * Copies the samples from {@code fromNs} to {@code toNs} (both inclusive, clipped to what the
     * ring still holds) into {@code dst}, at most {@code dst.length}. Returns the span copied.
     */
    public Span copy(long fromNs, long toNs, float[] dst) {
        return copyIndices(indexAt(fromNs), (long) Math.floor((toNs - firstNs) / periodNs + 1e-6) + 1, dst);
    }

    /**
     * Copies samples {@code [from, toExclusive)}, counted from the first sample ever recorded (see
     * {@link #written()}) and clipped to what the ring still holds and to {@code dst.length} (the
     * latest kept), into {@code dst}. Returns the span copied; {@code from} is the index of its first
     * sample when the ring still held it.
     */
    public Span copyIndices(long from, long toExclusive, float[] dst) {
        long a = Math.max(oldest(), from);
        long b = Math.min(written, toExclusive) - 1;
        if (!started || b < a) {
            return new Span(timeOf(Math.max(a, 0)), 0);
        }
        if (b - a + 1 > dst.length) {
            a = b - dst.length + 1;
        }
        int count = (int) (b - a + 1);
        int n = ring.length;
        int at = (int) (a % n);
        int first = Math.min(count, n - at);
        System.arraycopy(ring, at, dst, 0, first);
        if (first < count) {
            System.arraycopy(ring, 0, dst, first, count - first);
        }
        return new Span(timeOf(a), count);
    }

    /** Samples recorded so far: the index the next sample will have. */
    public long written() {
        return written;
    }

    /** Index of the oldest sample the ring still holds. */
    public long oldest() {
        return Math.max(0, written - ring.length);
    }

    /** Samples copied by {@link #copy}, the first taken at {@code firstSampleNs}. */
    public record Span(long firstSampleNs, int samples) { }

    public double rateHz() {
        return rateHz;
    }

    public int capacity() {
        return ring.length;
    }
}
