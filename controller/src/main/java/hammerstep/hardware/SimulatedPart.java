package hammerstep.hardware;

/** The serial side of a simulated ADC: answers the bytes clocked in, as the real part would. */
public interface SimulatedPart {

    /** Takes {@code length} bytes from {@code tx} (null: zeros) and writes the answer to {@code rx} (null: dropped). */
    void exchange(byte[] tx, int txOffset, byte[] rx, int rxOffset, int length);

    /** Chip select released: a part that frames on chip select starts a new request. */
    default void deselected() {
    }
}
