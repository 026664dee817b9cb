package hammerstep.trace;

/** A trace file that cannot be read, with a one-line message naming the file and, where known, the line. */
public final class TraceException extends Exception {

    public TraceException(String message) {
        super(message);
    }
}
