package hammerstep.sim.app;

import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;

import static org.assertj.core.api.Assertions.assertThat;

/** The progress line of {@code simulate}, on a fake clock. */
class ProgressTest {

    private final ByteArrayOutputStream bytes = new ByteArrayOutputStream();
    private final PrintStream out = new PrintStream(bytes, true, StandardCharsets.UTF_8);
    private long nowNs;

    private String text() {
        return bytes.toString(StandardCharsets.UTF_8);
    }

    @Test
    void aRunShorterThanASecondPrintsNothing() {
        Progress p = new Progress(out, true, () -> nowNs, 10);
        for (int i = 1; i <= 10; i++) {
            nowNs += 90_000_000L;
            p.update(i);
        }
        p.finish(10);
        assertThat(text()).isEmpty();
    }

    @Test
    void aLongRunShowsOneLineRewrittenInPlaceAtMostFourTimesASecondAndEndsIt() {
        Progress p = new Progress(out, true, () -> nowNs, 500);
        for (int i = 1; i <= 500; i++) {
            nowNs += 10_000_000L;
            p.update(i);
        }
        p.finish(500);
        String t = text();
        assertThat(t).startsWith("\rsimulate: rundown 100 of 500 (20 %), 1 s").endsWith("rundown 500 of 500 (100 %), 5 s\n");
        long updates = t.chars().filter(c -> c == '\r').count();
        assertThat(updates).isBetween(16L, 18L);
        assertThat(t.chars().filter(c -> c == '\n').count()).isEqualTo(1);
    }

    @Test
    void notATerminalNoLine() {
        Progress p = new Progress(out, false, () -> nowNs, 500);
        for (int i = 1; i <= 500; i++) {
            nowNs += 10_000_000L;
            p.update(i);
        }
        p.finish(500);
        assertThat(text()).isEmpty();
    }
}
