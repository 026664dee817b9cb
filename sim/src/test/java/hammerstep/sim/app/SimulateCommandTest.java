package hammerstep.sim.app;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class SimulateCommandTest {

    private static int run(String... args) {
        return SimMain.run(args);
    }

    @Test
    void sameSeedWritesTheSameTraceAndTruth(@TempDir Path dir) throws Exception {
        String[] common = {"simulate", "--tool", "air-twin-hammer", "--joint", "iso-soft", "--rate", "20000",
                "--rundowns", "2", "--hold-ms", "400", "--gap-ms", "300", "--seed", "5"};
        assertThat(run(concat(common, "--out", dir.resolve("a.csv").toString(), "--truth", dir.resolve("a.json").toString()))).isZero();
        assertThat(run(concat(common, "--out", dir.resolve("b.csv").toString(), "--truth", dir.resolve("b.json").toString()))).isZero();
        assertThat(Files.mismatch(dir.resolve("a.csv"), dir.resolve("b.csv"))).isEqualTo(-1L);
        assertThat(Files.mismatch(dir.resolve("a.json"), dir.resolve("b.json"))).isEqualTo(-1L);

        JsonNode truth = new ObjectMapper().readTree(dir.resolve("a.json").toFile());
        assertThat(truth.get("rundowns")).hasSize(2);
        JsonNode first = truth.get("rundowns").get(0);
        assertThat(first.get("blows").asInt()).isEqualTo(first.get("peaks_nm").size()).isPositive();
        assertThat(first.get("blow_times_s").size()).isEqualTo(first.get("blows").asInt());
        assertThat(first.get("residual_torque_nm").asDouble()).isPositive();
        assertThat(Files.readAllLines(dir.resolve("a.csv")).get(0)).isEqualTo("# rate_hz=20000");
    }

    @Test
    void theDogClutchPresetsRunByNameForwardAndInReverse(@TempDir Path dir) throws Exception {
        for (String tool : new String[] {"air-rocking-dog", "air-three-jaw", "air-twin-pin-oil-bath"}) {
            for (boolean reverse : new boolean[] {false, true}) {
                Path truthFile = dir.resolve(tool + reverse + ".json");
                String[] args = {"simulate", "--tool", tool, "--joint", "wheel-stud-m14", "--rate", "20000",
                        "--hold-ms", "500", "--gap-ms", "200", "--count-above", "100",
                        "--out", dir.resolve(tool + ".csv").toString(), "--truth", truthFile.toString()};
                assertThat(run(reverse ? concat(args, "--reverse") : args)).as(tool).isZero();
                JsonNode rundown = new ObjectMapper().readTree(truthFile.toFile()).get("rundowns").get(0);
                assertThat(rundown.get("blows").asInt()).as(tool).isGreaterThan(3);
                assertThat(rundown.get("direction").asText()).isEqualTo(reverse ? "loosen" : "tighten");
                double firstPeak = rundown.get("peaks_nm").get(0).asDouble();
                assertThat(reverse ? -firstPeak : firstPeak).as(tool).isGreaterThan(100);
            }
        }
    }

    /** Replay's JSON lines (the controller's own command) for a trace and a program. */
    private static java.util.List<JsonNode> replay(Path trace, Path program) throws Exception {
        PrintStream saved = System.out;
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        System.setOut(new PrintStream(out, true, StandardCharsets.UTF_8));
        try {
            assertThat(hammerstep.app.Main.run("replay", trace.toString(), "--program", program.toString())).isZero();
        } finally {
            System.setOut(saved);
        }
        java.util.List<JsonNode> lines = new java.util.ArrayList<>();
        for (String line : out.toString(StandardCharsets.UTF_8).split("\n")) {
            if (!line.isBlank()) {
                lines.add(new ObjectMapper().readTree(line));
            }
        }
        return lines;
    }

    /**
     * With a program the relay stops the tool at shutoff_at and the operator lets go 0.2 s later (mean
     * simple reaction time about 0.19 s to light, 0.16 s to sound: R. J. Kosinski, "A Literature Review
     * on Reaction Time", Clemson University, citing Galton 1899 and Welford 1980); the same rundowns
     * held the default 1.5 s run far past the window.
     */
    @Test
    void aProgramsShutoffStopsTheToolAndTheOperatorLetsGoAReactionTimeLater(@TempDir Path dir) throws Exception {
        Path program = dir.resolve("wheel.yaml");
        Files.writeString(program, """
                id: wheel-relay
                torque: { min: 380.0, target: 400.0, max: 450.0 }
                final_torque: max_peak
                blows: { count_above: 100.0, min: 2, max: 30 }
                rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 3000 }
                shutoff_at: 400.0
                """);
        String[] common = {"simulate", "--tool", "cordless-two-dog", "--joint", "wheel-stud-m14", "--rate", "20000",
                "--rundowns", "3", "--gap-ms", "400", "--seed", "4", "--count-above", "100"};
        Path held = dir.resolve("held.csv");
        Path relayed = dir.resolve("relayed.csv");
        assertThat(run(concat(common, "--out", held.toString(), "--truth", dir.resolve("held.json").toString()))).isZero();
        assertThat(run(concat(common, "--program", program.toString(), "--out", relayed.toString(),
                "--truth", dir.resolve("relayed.json").toString()))).isZero();

        JsonNode truth = new ObjectMapper().readTree(dir.resolve("relayed.json").toFile());
        assertThat(truth.get("program").asText()).isEqualTo("wheel-relay");
        assertThat(truth.get("reaction_ms").asDouble()).isEqualTo(200.0);
        for (JsonNode r : truth.get("rundowns")) {
            double shutoff = r.get("shutoff_s").asDouble();
            assertThat(r.get("trigger_released_s").asDouble() - shutoff).isCloseTo(0.2, org.assertj.core.api.Assertions.within(1.0 / 20000));
            assertThat(shutoff - r.get("start_s").asDouble()).isLessThan(1.3);
        }
        for (JsonNode line : replay(held, program)) {
            assertThat(line.get("reasons").toString()).contains("TORQUE_HIGH");
        }
        java.util.List<JsonNode> lines = replay(relayed, program);
        assertThat(lines).hasSize(3);
        for (JsonNode line : lines) {
            assertThat(line.get("verdict").asText()).as(line.toString()).isEqualTo("GO");
        }
    }

    @Test
    void aProgramDoesNotApplyToAReverseRun(@TempDir Path dir) throws Exception {
        Path program = dir.resolve("p.yaml");
        Files.writeString(program, "id: p\ntorque: { min: 1, target: 2, max: 3 }\nblows: { count_above: 1, min: 1, max: 3 }\n");
        PrintStream saved = System.err;
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        System.setErr(new PrintStream(err, true, StandardCharsets.UTF_8));
        int code;
        try {
            code = run("simulate", "--tool", "oil-pulse", "--joint", "iso-hard", "--reverse", "--program", program.toString(),
                    "--out", dir.resolve("t.csv").toString(), "--truth", dir.resolve("t.json").toString());
        } finally {
            System.setErr(saved);
        }
        assertThat(code).isEqualTo(2);
        assertThat(err.toString(StandardCharsets.UTF_8)).contains("--reverse").doesNotContain("Exception");
    }

    @Test
    void aBadPresetFileIsOneLineWithItsPlaceAndExitTwo(@TempDir Path dir) throws Exception {
        Path joint = dir.resolve("joint.yaml");
        Files.writeString(joint, "prevailing_torque_nm: -1\n");
        PrintStream saved = System.err;
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        System.setErr(new PrintStream(err, true, StandardCharsets.UTF_8));
        int code;
        try {
            code = run("simulate", "--tool", "oil-pulse", "--joint", joint.toString(),
                    "--out", dir.resolve("t.csv").toString(), "--truth", dir.resolve("t.json").toString());
        } finally {
            System.setErr(saved);
        }
        assertThat(code).isEqualTo(2);
        assertThat(err.toString(StandardCharsets.UTF_8)).contains(joint + ":1:23: 'prevailing_torque_nm' is -1")
                .doesNotContain("Exception");
        assertThat(dir.resolve("t.csv")).doesNotExist();
    }

    private static String[] concat(String[] a, String... b) {
        String[] r = java.util.Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, r, a.length, b.length);
        return r;
    }
}
