package hammerstep.app;

import ch.qos.logback.classic.Level;
import ch.qos.logback.classic.Logger;
import org.slf4j.LoggerFactory;

/**
 * Sets the log level at start. Commands that print results (replay, check) do not log and leave
 * logging uninitialised unless {@code --verbose} asks for it: that keeps their start fast.
 */
public final class Logging {

    private Logging() {
    }

    public static void configure(boolean verbose, Level normal) {
        Logger root = (Logger) LoggerFactory.getLogger(org.slf4j.Logger.ROOT_LOGGER_NAME);
        root.setLevel(verbose ? Level.DEBUG : normal);
    }
}
