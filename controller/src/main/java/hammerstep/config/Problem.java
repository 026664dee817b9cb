package hammerstep.config;

/**
 * One thing wrong with a configuration file, located so a line engineer can go straight to it.
 * {@link #toString()} gives the {@code file:line:column: message} form that {@code hammerstep check}
 * prints. Line and column are 1-based; 0 means the location is unknown (for example an unreadable file).
 */
public record Problem(String file, int line, int column, String message) {

    @Override
    public String toString() {
        return file + ":" + line + ":" + column + ": " + message;
    }
}
