package hammerstep.bench;

import hammerstep.trace.SampleSink;

/**
 * The bare work a replay floor does over its samples: a hysteresis loop that counts a pulse from
 * 100 N·m, releases it below 50 N·m and keeps its peak, nothing else.
 */
final class FloorLoop implements SampleSink {
    long samples;
    long pulses;
    boolean inPulse;
    float peak;

    @Override
    public void onSamples(float[] x, int offset, int length, long firstSampleNs) {
        for (int i = offset; i < offset + length; i++) {
            float v = x[i];
            if (!inPulse) {
                if (v >= 100f) {
                    inPulse = true;
                    pulses++;
                    peak = v;
                }
            } else {
                if (v > peak) {
                    peak = v;
                }
                if (v < 50f) {
                    inPulse = false;
                }
            }
        }
        samples += length;
    }
}
