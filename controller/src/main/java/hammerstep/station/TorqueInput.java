package hammerstep.station;

/**
 * The torque transducer as the station thread sees it: blocks of samples in N·m (already
 * converted from counts with the transducer's calibration), in time order, with the station-clock
 * time of each block's first sample.
 *
 * <p>Threading: {@link #poll} is called by the station thread only. The acquisition side (an SPI
 * reader thread, or the simulator) writes on its own thread, usually into a {@link SampleRing}; a
 * block it cannot place because the ring is full is dropped and counted, never waited for, and the
 * handler hears of it ({@link SampleBlockHandler#onGap()}) before the block that follows.
 */
public interface TorqueInput {

    /** Sample rate in Hz; constant for the input's life. */
    double rateHz();

    /** The longest block {@link #poll} hands out, in samples. */
    int maxBlockLength();

    /**
     * Hands up to {@code maxBlocks} waiting blocks to {@code handler}, oldest first.
     *
     * @return the number of blocks handed out (0 when none was waiting)
     */
    int poll(SampleBlockHandler handler, int maxBlocks);

    /** Blocks lost because the station thread fell behind; a rising count is a fault. */
    long droppedBlocks();
}
