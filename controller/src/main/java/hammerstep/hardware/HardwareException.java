package hammerstep.hardware;

/** A device that does not answer, answers wrongly or cannot be opened; the message is one line to act on. */
public final class HardwareException extends RuntimeException {

    public HardwareException(String message) {
        super(message);
    }

    public HardwareException(String message, Throwable cause) {
        super(message, cause);
    }
}
