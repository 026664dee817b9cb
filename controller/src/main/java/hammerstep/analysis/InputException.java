package hammerstep.analysis;

/** An input file the analysis cannot use, with a one-line message naming the file and, where known, the line. */
public final class InputException extends Exception {

    public InputException(String message) {
        super(message, null, false, false);
    }
}
