package hammerstep.results;

/** The store could not keep a result (disk error, or full). The station treats it as a fault, never as done. */
public final class ResultStoreException extends Exception {

    public ResultStoreException(String message, Throwable cause) {
        super(message, cause);
    }

    public ResultStoreException(String message) {
        super(message);
    }
}
