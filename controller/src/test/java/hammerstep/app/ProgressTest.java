package hammerstep.app;

import hammerstep.station.VirtualClock;
import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;

/** The progress line of a long archive replay, in virtual time. */
class ProgressTest {

    private final VirtualClock clock = new VirtualClock(Instant.EPOCH);

    {
        clock.setNs(7_000_000_000L);
    }
    private final ByteArrayOutputStream bytes = new ByteArrayOutputStream();
    private final PrintStream err = new PrintStream(bytes, true, StandardCharsets.UTF_8);

    private String printed() {
        return bytes.toString(StandardCharsets.UTF_8);
    }

    @Test
    void quietForTheFirstSecondThenAtMostFourTimesASecondThenErased() {
        Progress p = new Progress(err, clock, true);
        clock.advanceNs(999_000_000L);
        p.update(10, 1000, 0, true);
        assertThat(printed()).isEmpty();

        clock.advanceNs(1_000_000L);
        p.update(11, 1000, 2, true);
        assertThat(printed()).isEqualTo("\rreplay: 11 of 1000 traces (1 %), 2 would change, 0:01");

        clock.advanceNs(100_000_000L);
        p.update(12, 1000, 2, true);
        assertThat(printed()).as("a quarter second has not passed").doesNotContain("12 of");

        clock.advanceNs(61_000_000_000L);
        p.update(500, 1000, 3, false);
        assertThat(printed()).endsWith("\rreplay: 500 of 1000 traces (50 %), 1:02" + " ".repeat(14));

        p.end();
        assertThat(printed()).endsWith("\r" + " ".repeat(39) + "\r");
    }

    @Test
    void nothingWhenStandardErrorIsNoTerminal() {
        Progress p = new Progress(err, clock, false);
        clock.advanceNs(5_000_000_000L);
        p.update(1, 2, 0, false);
        p.end();
        assertThat(printed()).isEmpty();
    }
}
