package hammerstep.app;

/**
 * A failure the user can act on: bad input, a missing file, an invalid configuration. The command
 * line prints its message as one line and exits with {@link #exitCode()}, never with a stack trace.
 */
public final class UserError extends RuntimeException {

    private final int exitCode;

    public UserError(String message, int exitCode) {
        super(message, null, false, false);
        this.exitCode = exitCode;
    }

    public UserError(String message) {
        this(message, 2);
    }

    public int exitCode() {
        return exitCode;
    }
}
