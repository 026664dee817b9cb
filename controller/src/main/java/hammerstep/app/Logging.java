package hammerstep.app;

import ch.qos.logback.classic.Level;
import ch.qos.logback.classic.Logger;
import org.slf4j.LoggerFactory;

/** Sets the log level at start: commands that print results keep logs quiet unless asked. */
public final class Logging {

    private Logging() {
    }

    public static void configure(boolean verbose, Level normal) {
        Logger root = (Logger) LoggerFactory.getLogger(org.slf4j.Logger.ROOT_LOGGER_NAME);
        root.setLevel(verbose ? Level.DEBUG : normal);
    }
}
