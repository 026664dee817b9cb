package hammerstep.sim.demo;

import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;

import static org.assertj.core.api.Assertions.assertThat;

class DemoTextTest {

    @Test
    void anAsciiTerminalGetsNDotMNotAQuestionMark() {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        PrintStream ascii = new PrintStream(bytes, true, StandardCharsets.US_ASCII);
        PrintStream out = DemoText.forCharset(ascii, StandardCharsets.US_ASCII);

        out.println("peak 290.5 N·m, 2524 → 2101 /min, ±0.5 %");
        out.print(new StringBuilder("blows 3: 290 N·m"));
        out.flush();

        assertThat(bytes.toString(StandardCharsets.US_ASCII))
                .isEqualTo("peak 290.5 N.m, 2524 -> 2101 /min, +/-0.5 %" + System.lineSeparator() + "blows 3: 290 N.m");
    }

    @Test
    void aUtf8TerminalKeepsTheUnits() {
        PrintStream utf8 = new PrintStream(new ByteArrayOutputStream(), true, StandardCharsets.UTF_8);

        assertThat(DemoText.forCharset(utf8, StandardCharsets.UTF_8)).isSameAs(utf8);
        assertThat(DemoText.canShowUnits(StandardCharsets.ISO_8859_1)).as("no arrow in Latin-1").isFalse();
    }

    @Test
    void countsSayOneBlowAndTwoBlows() {
        assertThat(DemoText.count(1, "blow")).isEqualTo("1 blow");
        assertThat(DemoText.count(0, "blow")).isEqualTo("0 blows");
        assertThat(DemoText.count(2, "part")).isEqualTo("2 parts");
        assertThat(DemoText.cut("abcdefgh", 6)).isEqualTo("abc...");
    }
}
