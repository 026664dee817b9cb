package hammerstep.hardware;

/**
 * One SPI device as its driver sees it: full-duplex exchanges, a chip select the driver may hold
 * across several exchanges (for parts that need a pause between a command and its answer), and a
 * short busy pause. Implemented by the Pi4J adapter and by test fakes; called from one thread.
 */
public interface SpiLink {

    /** Asserts chip select until {@link #release()}; exchanges made meanwhile form one frame. */
    void select();

    /** Releases chip select. */
    void release();

    /** Sends {@code length} bytes of {@code tx} and stores the bytes clocked in meanwhile in {@code rx}. */
    void exchange(byte[] tx, byte[] rx, int length);

    /** Waits at least {@code ns} nanoseconds without giving up the processor (timings of microseconds). */
    void pauseNs(long ns);
}
