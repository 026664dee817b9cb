package hammerstep.app;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.signal.PulseTrain;
import hammerstep.testing.StandardStreams;
import hammerstep.trace.TraceWriter;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/** The commands as a user runs them: output, exit codes, one-line errors. */
class CommandLineTest {

    private static final Path GOOD = Path.of("src/test/resources/programs/good.yaml");

    @TempDir
    Path dir;

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    private Path twoRundowns() throws Exception {
        List<PulseTrain.Strike> s = new ArrayList<>();
        for (int i = 0; i < 8; i++) {
            s.add(new PulseTrain.Strike(0.1 + i * 0.027, 0.002, 80 + i * 18, 0.3, 0.2, 0));
        }
        for (int i = 0; i < 3; i++) {
            s.add(new PulseTrain.Strike(0.8 + i * 0.027, 0.002, 100 + i * 10, 0.3, 0.2, 0));
        }
        float[] x = PulseTrain.render(20_000, 1.4, s, 0.2, 0.1, 1);
        Path p = dir.resolve("t.csv");
        try (TraceWriter w = new TraceWriter(p, 20_000, Map.of())) {
            w.write(x, 0, x.length);
        }
        return p;
    }

    @Test
    void replayPrintsOneJsonLinePerRundownWithTheSharedFields() throws Exception {
        int code = Main.run("replay", twoRundowns().toString(), "--program", GOOD.toString());
        assertThat(code).isZero();
        String[] lines = streams.out().strip().split("\n");
        assertThat(lines).hasSize(2);
        ObjectMapper json = new ObjectMapper();
        JsonNode first = json.readTree(lines[0]);
        assertThat(first.fieldNames()).toIterable().contains("blows", "peaks_nm", "final_torque_nm", "duration_ms",
                "verdict", "reasons", "limits");
        assertThat(first.get("blows").asInt()).isEqualTo(8);
        assertThat(first.get("peaks_nm")).hasSize(8);
        assertThat(first.get("verdict").asText()).isEqualTo("GO");
        assertThat(first.at("/limits/torque_nm/min").asDouble()).isEqualTo(180.0);
        assertThat(first.at("/limits/blows/max").asInt()).isEqualTo(30);
        JsonNode second = json.readTree(lines[1]);
        assertThat(second.get("verdict").asText()).isEqualTo("NO_GO");
        assertThat(second.get("reasons")).extracting(JsonNode::asText).containsExactly("TORQUE_LOW", "BLOWS_FEW");
    }

    @Test
    void summaryPrintsATable() throws Exception {
        assertThat(Main.run("replay", twoRundowns().toString(), "--program", GOOD.toString(), "--summary")).isZero();
        assertThat(streams.out()).contains("2 rundowns, 1 GO, 1 NO_GO");
    }

    @Test
    void checkOfABrokenFileExitsTwoWithItsLocation() {
        Path bad = Path.of("src/test/resources/programs/broken/not-a-number.yaml");
        assertThat(Main.run("check", bad.toString(), GOOD.toString())).isEqualTo(2);
        assertThat(streams.err().strip()).isEqualTo(bad + ":3:16: 'torque.min': expected a number, got \"lots\"");
    }

    @Test
    void checkOfValidFilesExitsZero() {
        assertThat(Main.run("check", GOOD.toString())).isZero();
        assertThat(streams.out()).contains("1 file valid");
    }

    @Test
    void badInputIsOneLineWithoutAStackTrace() throws Exception {
        Path rows = dir.resolve("bad.csv");
        Files.writeString(rows, "# rate_hz=1000\ntime_s,torque_nm\n0.0,1\n0.001,x\n");
        assertThat(Main.run("replay", rows.toString(), "--program", GOOD.toString())).isEqualTo(2);
        assertThat(streams.err().strip()).isEqualTo(rows + ":4: torque_nm 'x' is not a finite number");

        streams.clearErr();
        assertThat(Main.run("replay", dir.resolve("none.csv").toString(), "--program", GOOD.toString())).isEqualTo(2);
        assertThat(streams.err().strip()).isEqualTo(dir.resolve("none.csv") + ": no such file");

        streams.clearErr();
        assertThat(Main.run("replay", rows.toString(), "--program", "missing.yaml")).isEqualTo(2);
        assertThat(streams.err().strip()).isEqualTo("missing.yaml:0:0: no such file");

        streams.clearErr();
        Path f32 = dir.resolve("x.f32");
        Files.write(f32, new byte[8]);
        assertThat(Main.run("replay", f32.toString(), "--program", GOOD.toString())).isEqualTo(2);
        assertThat(streams.err().strip()).isEqualTo(f32 + ": a .f32 trace needs --rate HZ");
        assertThat(streams.err()).doesNotContain("Exception").doesNotContain("\tat ");
    }

    @Test
    void unknownOptionIsAUsageError() {
        assertThat(Main.run("replay", "t.csv", "--program", "p.yaml", "--bogus")).isEqualTo(2);
        assertThat(streams.err()).contains("Unknown option: '--bogus'");
    }
}
