package hammerstep.app;

import hammerstep.station.StationClock;

import java.io.PrintStream;
import java.util.Locale;

/**
 * A progress line on standard error for a long run on a terminal: nothing during the first second
 * (a short run stays quiet), then the line rewritten in place at most four times a second, and
 * erased at the end so the output that follows starts clean. Off when standard error is not a
 * terminal (a pipe, a file, a CI log).
 */
final class Progress {

    private static final long QUIET_NS = 1_000_000_000L;
    private static final long EVERY_NS = 250_000_000L;

    private final PrintStream err;
    private final StationClock clock;
    private final boolean on;
    private final long startNs;
    private long nextNs;
    private int shownLength;

    /** @param terminal true when standard error is a terminal ({@code System.console() != null}) */
    Progress(PrintStream err, StationClock clock, boolean terminal) {
        this.err = err;
        this.clock = clock;
        this.on = terminal;
        this.startNs = terminal ? clock.nanoTime() : 0;
        this.nextNs = startNs + QUIET_NS;
    }

    /** Notes that {@code done} of {@code total} traces are replayed, {@code changed} of them with another verdict. */
    void update(int done, int total, int changed, boolean comparing) {
        if (!on) {
            return;
        }
        long now = clock.nanoTime();
        if (now - nextNs < 0) {
            return;
        }
        nextNs = now + EVERY_NS;
        long s = (now - startNs) / 1_000_000_000L;
        String line = String.format(Locale.ROOT, "replay: %d of %d traces (%d %%)%s, %d:%02d", done, total,
                total == 0 ? 100 : done * 100L / total, comparing ? ", " + changed + " would change" : "", s / 60, s % 60);
        err.print("\r" + line + " ".repeat(Math.max(0, shownLength - line.length())));
        err.flush();
        shownLength = line.length();
    }

    /** Erases the line, if one was shown. */
    void end() {
        if (shownLength > 0) {
            err.print("\r" + " ".repeat(shownLength) + "\r");
            err.flush();
            shownLength = 0;
        }
    }
}
