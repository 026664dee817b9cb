package hammerstep.sim.app;

import java.io.PrintStream;
import java.util.Set;

/**
 * The demo's first words on a terminal, written before the command line is parsed: the station file,
 * the logging and the embedded broker take seconds to load on a Pi (and longer on a busy machine), and
 * a blank screen for that long reads as a hang. The live view's first frame clears the screen and
 * replaces this line. Nothing is written for other commands, for {@code --plain}, help or version, or
 * when standard output is not a terminal (a pipe or a file gets only what the command itself writes).
 * Uses no class of the command line or the simulator, so that it runs before they are loaded.
 */
final class StartingLine {

    static final String TEXT = "hammerstep demo: starting (station file, then the MQTT broker)...";

    private static final Set<String> QUIET = Set.of("--plain", "-h", "--help", "-V", "--version", "help");

    private StartingLine() {
    }

    /** Writes the line to {@code out} when {@code args} start the demo's live view on a terminal. */
    static boolean write(String[] args, boolean terminal, PrintStream out) {
        if (!terminal || args.length == 0 || !args[0].equals("demo")) {
            return false;
        }
        for (String a : args) {
            if (QUIET.contains(a)) {
                return false;
            }
        }
        out.print(TEXT + "\n");
        out.flush();
        return true;
    }
}
