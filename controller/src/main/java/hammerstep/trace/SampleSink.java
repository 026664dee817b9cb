package hammerstep.trace;

/** Receives a trace's samples in blocks, in time order. */
@FunctionalInterface
public interface SampleSink {

    /** {@code samples[offset, offset+length)} in N·m, the first taken at {@code firstSampleNs}. */
    void onSamples(float[] samples, int offset, int length, long firstSampleNs);
}
