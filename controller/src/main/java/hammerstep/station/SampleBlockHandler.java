package hammerstep.station;

/**
 * Receives one block of torque samples in N·m, taken at the input's rate; the first at
 * {@code firstSampleNs} on the station clock. The array belongs to the ring: read it during the
 * call only, never keep it.
 */
@FunctionalInterface
public interface SampleBlockHandler {
    void onBlock(float[] samples, int offset, int length, long firstSampleNs);

    /**
     * Samples were lost between the block handed out before and the next one (a block dropped
     * because the ring was full, conversions the acquisition missed): called just before that next
     * block. Ignored by default.
     */
    default void onGap() {
    }
}
