package hammerstep.signal;

/**
 * Finds blows in a conditioned torque signal, of either sign. A blow starts when |torque| reaches
 * {@code countAbove}; its sign is that of the crossing, and from then on the detector follows the
 * signal in that sense: the blow closes once torque (in its sense) is below {@code releaseBelow}
 * (hysteresis) and the dead time since its start has passed. Everything within the dead time — rebound lobes, ringing, re-contact humps of
 * the same strike — belongs to that one blow, so no strike counts twice. The dead time follows from
 * the fastest plausible blow rate (half the shortest interval between blows). A reverse strike
 * (the tool loosening) is a negative blow whose positive rebound lobes belong to it in the same way;
 * its peak and impulse are reported negative.
 *
 * <p>Allocation-free; single-threaded. State carries across blocks, so a blow may span blocks.
 */
public final class PulseDetector {

    private final float countAbove;
    private final float releaseBelow;
    private final long deadSamples;
    private final double periodNs;
    private final double periodS;
    private final PulseSink sink;

    private boolean inPulse;
    /** +1 for a blow that crossed {@code countAbove}, -1 for one that crossed {@code -countAbove}. */
    private float sign = 1f;
    private boolean lobeOpen;
    private long sampleIndex;
    private long startIndex;
    private long startNs;
    private float peak;
    private long peakNs;
    private long mainLobeSamples;
    private double impulseSum;

    public PulseDetector(double countAboveNm, double releaseBelowNm, double deadTimeMs, double rateHz, PulseSink sink) {
        if (!(releaseBelowNm <= countAboveNm)) {
            throw new IllegalArgumentException("release level " + releaseBelowNm + " must not be above " + countAboveNm);
        }
        this.countAbove = (float) countAboveNm;
        this.releaseBelow = (float) releaseBelowNm;
        this.deadSamples = Math.max(1, Math.round(deadTimeMs * 1e-3 * rateHz));
        this.periodNs = 1e9 / rateHz;
        this.periodS = 1.0 / rateHz;
        this.sink = sink;
    }

    /** Processes {@code x[offset, offset+length)}, the first sample taken at {@code firstNs}. */
    public void process(float[] x, int offset, int length, long firstNs) {
        int end = offset + length;
        int i = offset;
        while (i < end) {
            if (!inPulse) {
                // idle: find the next crossing
                float level = countAbove;
                float low = -countAbove;
                while (i < end && x[i] < level && x[i] > low) {
                    i++;
                }
                if (i == end) {
                    break;
                }
                long k = sampleIndex + (i - offset);
                inPulse = true;
                lobeOpen = true;
                sign = x[i] >= level ? 1f : -1f;
                startIndex = k;
                startNs = firstNs + (long) ((i - offset) * periodNs);
                peak = sign * x[i];
                peakNs = startNs;
                mainLobeSamples = -1;
                impulseSum = peak;
                i++;
                continue;
            }
            float v = sign * x[i];
            if (v > peak) {
                peak = v;
                peakNs = firstNs + (long) ((i - offset) * periodNs);
            }
            if (v >= releaseBelow) {
                impulseSum += v;
                if (!lobeOpen) {
                    lobeOpen = true;
                }
            } else {
                if (lobeOpen) {
                    lobeOpen = false;
                    if (mainLobeSamples < 0) {
                        mainLobeSamples = sampleIndex + (i - offset) - startIndex;
                    }
                }
                if (sampleIndex + (i - offset) - startIndex >= deadSamples) {
                    close();
                }
            }
            i++;
        }
        sampleIndex += length;
    }

    private void close() {
        inPulse = false;
        lobeOpen = false;
        long width = mainLobeSamples < 0 ? 0 : mainLobeSamples;
        sink.onPulse(startNs, sign * peak, peakNs, width * periodS * 1e3, sign * impulseSum * periodS);
    }

    /** Closes a blow still open (end of a rundown or of the stream). */
    public void flush() {
        if (inPulse) {
            if (mainLobeSamples < 0) {
                mainLobeSamples = sampleIndex - startIndex;
            }
            close();
        }
    }

    /** Forgets any open blow without reporting it. */
    public void reset() {
        inPulse = false;
        lobeOpen = false;
    }

    public boolean inPulse() {
        return inPulse;
    }

    /** Samples seen so far. */
    public long sampleIndex() {
        return sampleIndex;
    }
}
