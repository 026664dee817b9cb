package hammerstep.app;

import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

/** The programs page's validation lines are the lines {@code hammerstep check} prints for the station file. */
class WebCheckLinesTest {

    @Test
    void theLinesAreCheckLines() {
        Path broken = Path.of("src/test/resources/broken/stations/web-port-out-of-range.yaml");
        PrintStream saved = System.err;
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        try (PrintStream capture = new PrintStream(err, true, StandardCharsets.UTF_8)) {
            System.setErr(capture);
            assertThat(Captured.run("check", broken.toString()).exit()).isEqualTo(2);
        } finally {
            System.setErr(saved);
        }
        assertThat(RunCommand.checkLines(broken)).isNotEmpty()
                .isEqualTo(err.toString(StandardCharsets.UTF_8).lines().filter(l -> !l.isBlank()).toList());
        assertThat(RunCommand.checkLines(Path.of("../config/station.example.yaml"))).isEmpty();
    }
}
