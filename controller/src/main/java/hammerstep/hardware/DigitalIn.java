package hammerstep.hardware;

/** One digital input with its active level applied, not debounced: true while the contact is made. */
public interface DigitalIn {

    boolean active();
}
