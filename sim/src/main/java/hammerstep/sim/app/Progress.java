package hammerstep.sim.app;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.function.LongSupplier;

/**
 * A progress line on stderr for a long {@code simulate} run: only when stderr is a terminal, and only
 * once the run has taken more than a second (a short run prints nothing). The line is rewritten in
 * place (carriage return) at most every {@link #PERIOD_NS}, and closed with a newline at the end.
 */
final class Progress {

    static final long QUIET_NS = 1_000_000_000L;
    static final long PERIOD_NS = 250_000_000L;

    private final PrintStream out;
    private final boolean terminal;
    private final LongSupplier nanoClock;
    private final int total;
    private final long startNs;
    private long lastNs;
    private boolean shown;

    Progress(PrintStream out, boolean terminal, LongSupplier nanoClock, int total) {
        this.out = out;
        this.terminal = terminal;
        this.nanoClock = nanoClock;
        this.total = total;
        this.startNs = nanoClock.getAsLong();
        this.lastNs = startNs;
    }

    /** For the command line: stderr, the system clock, and whether stderr is a terminal. */
    static Progress onStderr(int total) {
        return new Progress(System.err, stderrIsTerminal(), System::nanoTime, total);
    }

    /** {@code done} of the rundowns are written. */
    void update(int done) {
        if (!terminal) {
            return;
        }
        long now = nanoClock.getAsLong();
        if (now - startNs < QUIET_NS || (shown && now - lastNs < PERIOD_NS)) {
            return;
        }
        lastNs = now;
        shown = true;
        out.print("\rsimulate: rundown " + done + " of " + total + " (" + (100L * done / total) + " %), "
                + (now - startNs) / 1_000_000_000L + " s");
        out.flush();
    }

    /** The run is over: the line, if one was shown, gets its final count and a newline. */
    void finish(int done) {
        if (shown) {
            long now = nanoClock.getAsLong();
            out.print("\rsimulate: rundown " + done + " of " + total + " (" + (100L * done / total) + " %), "
                    + (now - startNs) / 1_000_000_000L + " s\n");
            out.flush();
        }
    }

    /**
     * Whether stderr is a terminal. Java 17 has no isatty; on Linux (the station and the development
     * machines) descriptor 2 links to a {@code /dev/pts/N} or {@code /dev/ttyN} device when it is one.
     * Elsewhere, or when that cannot be read: no progress line.
     */
    static boolean stderrIsTerminal() {
        try {
            String target = Files.readSymbolicLink(Path.of("/proc/self/fd/2")).toString();
            return target.startsWith("/dev/pts/") || target.startsWith("/dev/tty");
        } catch (IOException | UnsupportedOperationException | SecurityException e) {
            return false;
        }
    }
}
