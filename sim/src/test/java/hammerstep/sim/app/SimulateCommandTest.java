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
