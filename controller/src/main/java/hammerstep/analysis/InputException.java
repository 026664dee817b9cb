package hammerstep.analysis;

/** An input file the analysis cannot use, with a one-line message naming the file and, where known, the line. */
public final class InputException extends Exception {

    public InputException(String message) {
        super(message, null, false, false);
    }

    /** Why a text file could not be read, in one line: missing, not UTF-8 text, or the system's reason. */
    static InputException reading(java.nio.file.Path file, java.io.IOException e) {
        return new InputException(hammerstep.config.InputFiles.describe(file, e));
    }
}
