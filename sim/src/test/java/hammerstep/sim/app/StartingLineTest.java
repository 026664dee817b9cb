package hammerstep.sim.app;

import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;

import static org.assertj.core.api.Assertions.assertThat;

/** The demo's line before anything heavy loads: only for the live view on a terminal. */
class StartingLineTest {

    private final ByteArrayOutputStream bytes = new ByteArrayOutputStream();
    private final PrintStream out = new PrintStream(bytes, true, StandardCharsets.UTF_8);

    private String written(boolean terminal, String... args) {
        bytes.reset();
        StartingLine.write(args, terminal, out);
        return bytes.toString(StandardCharsets.UTF_8);
    }

    @Test
    void theLiveDemoOnATerminalSaysAtOnceThatItIsStarting() {
        assertThat(written(true, "demo", "--fast", "--parts", "1")).isEqualTo(StartingLine.TEXT + "\n");
        assertThat(StartingLine.TEXT).as("plain ASCII: any locale shows it").matches("\\p{ASCII}+");
    }

    @Test
    void nothingForAPipeThePlainViewHelpVersionOrAnotherCommand() {
        assertThat(written(false, "demo", "--fast")).isEmpty();
        assertThat(written(true, "demo", "--plain")).isEmpty();
        assertThat(written(true, "demo", "--help")).isEmpty();
        assertThat(written(true, "--version")).isEmpty();
        assertThat(written(true, "simulate", "--parts", "1")).isEmpty();
        assertThat(written(true)).isEmpty();
    }
}
