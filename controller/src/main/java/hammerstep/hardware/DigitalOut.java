package hammerstep.hardware;

/** One digital output with its active level applied: {@code set(true)} switches the load on. */
public interface DigitalOut {

    void set(boolean active);

    /** The level the pin is driven to now, read back, with the active level applied. */
    boolean isActive();
}
