package hammerstep.sim.demo;

import java.io.File;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.TimeUnit;

/**
 * The size of the terminal the live view draws on, in columns and rows. Java cannot ask the
 * terminal itself, so this asks {@code stty size} on {@code /dev/tty} (as picocli does for its
 * help width), then the {@code COLUMNS} and {@code LINES} variables, and falls back to 80×24.
 */
record TerminalSize(int columns, int rows) {

    static final TerminalSize STANDARD = new TerminalSize(80, 24);

    /** The terminal's size now; never blocks more than about half a second. */
    static TerminalSize detect() {
        TerminalSize s = fromStty();
        if (s != null) {
            return s;
        }
        int c = parse(System.getenv("COLUMNS"));
        int r = parse(System.getenv("LINES"));
        return c > 0 && r > 0 ? new TerminalSize(c, r) : STANDARD;
    }

    private static TerminalSize fromStty() {
        File tty = new File("/dev/tty");
        if (!tty.exists()) {
            return null;
        }
        try {
            Process p = new ProcessBuilder("stty", "size").redirectInput(tty)
                    .redirectError(ProcessBuilder.Redirect.DISCARD).start();
            if (!p.waitFor(500, TimeUnit.MILLISECONDS)) {
                p.destroyForcibly();
                return null;
            }
            String[] parts = new String(p.getInputStream().readAllBytes(), StandardCharsets.US_ASCII).trim().split("\\s+");
            if (p.exitValue() == 0 && parts.length == 2) {
                int r = parse(parts[0]);
                int c = parse(parts[1]);
                return c > 0 && r > 0 ? new TerminalSize(c, r) : null;
            }
            return null;
        } catch (IOException e) {
            return null;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return null;
        }
    }

    private static int parse(String s) {
        if (s == null) {
            return -1;
        }
        try {
            return Integer.parseInt(s.trim());
        } catch (NumberFormatException e) {
            return -1;
        }
    }
}
