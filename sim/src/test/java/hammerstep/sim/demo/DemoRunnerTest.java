package hammerstep.sim.demo;

import hammerstep.app.UserError;
import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class DemoRunnerTest {

    private static final Path STATION = Path.of("../config/demo/station.yaml");

    private static String run(DemoOptions options, int expectedExit) throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        int exit = new DemoRunner(options, new PrintStream(bytes, true, StandardCharsets.UTF_8)).run();
        String out = bytes.toString(StandardCharsets.UTF_8);
        assertThat(exit).as(out).isEqualTo(expectedExit);
        return out;
    }

    @Test
    void runsThreePartsOfTheDemoStationToASummary() throws Exception {
        String out = run(new DemoOptions(STATION, 3, 5, true, true), 0);
        assertThat(out).contains("parts            3 of 3");
        assertThat(out).contains("blows after shut-off  0 measured, 0 in the model");
        assertThat(out.lines().filter(l -> l.contains(" part  ")).count()).isEqualTo(3);
        assertThat(out).contains("joint PS40D-2611-0301 snug   pos  1 (D1)");
    }

    @Test
    void namesTheOperatorsMistakesByKindAndOneVerdictSpelling() throws Exception {
        String out = run(new DemoOptions(STATION, 6, 1, true, true), 0);

        java.util.regex.Matcher m = java.util.regex.Pattern.compile("operator +(\\d+) mistakes: (.*)").matcher(out);
        assertThat(m.find()).as(out).isTrue();
        int sum = 0;
        for (String kind : m.group(2).split(", ")) {
            assertThat(kind).matches("(skip|rehit|release_early|hold_too_long|forget_ack|loosen) \\d+");
            sum += Integer.parseInt(kind.substring(kind.indexOf(' ') + 1));
        }
        assertThat(sum).isEqualTo(Integer.parseInt(m.group(1)));
        assertThat(out).doesNotContain("NO-GO").contains("NO_GO").doesNotContain(" 1 blows").contains("  1 blow      -/min");
    }

    @Test
    void aSecondRunOnTheSameStateContinuesThePartSerialsAndTheTime(@org.junit.jupiter.api.io.TempDir Path state)
            throws Exception {
        DemoOptions once = new DemoOptions(STATION, 1, 1, true, true, 0, null, false, null, null, null, state);
        String first = run(once, 0);
        java.util.Properties p1 = new java.util.Properties();
        p1.load(java.nio.file.Files.newBufferedReader(state.resolve(DemoState.FILE)));
        String second = run(once, 0);
        java.util.Properties p2 = new java.util.Properties();
        p2.load(java.nio.file.Files.newBufferedReader(state.resolve(DemoState.FILE)));

        assertThat(first).contains("part  PS40D-2611-0301");
        assertThat(second).contains("continuing the runs on " + state + ": 1 part before")
                .contains("part  PS40S-2611-0088").doesNotContain("PS40D-2611-0301");
        assertThat(p2.getProperty("parts_run")).isEqualTo("2");
        assertThat(java.time.Instant.parse(p2.getProperty("virtual_end")))
                .isAfter(java.time.Instant.parse(p1.getProperty("virtual_end")).plusSeconds(60));
    }

    @Test
    void theSameSeedGivesTheSameRun() throws Exception {
        String a = run(new DemoOptions(STATION, 1, 9, true, true), 0);
        String b = run(new DemoOptions(STATION, 1, 9, true, true), 0);
        assertThat(strip(a)).isEqualTo(strip(b));
    }

    /** Drops the wall-clock figure, the only line that may differ. */
    private static String strip(String out) {
        return out.replaceAll("simulated in [0-9.]+ s", "");
    }

    @Test
    void theLiveViewDrawsLampsAndEndsWithTheSummary() throws Exception {
        String out = run(new DemoOptions(STATION, 1, 2, true, false), 0);
        assertThat(out).contains("positions ").contains("tower ").contains("summary");
    }

    @Test
    void aMissingStationFileIsOneClearError() {
        assertThatThrownBy(() -> new DemoRunner(new DemoOptions(Path.of("nowhere.yaml"), 1, 1, true, true),
                System.out).run()).isInstanceOf(UserError.class).hasMessageContaining("nowhere.yaml: no such file");
    }
}
