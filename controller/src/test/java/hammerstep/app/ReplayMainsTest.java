package hammerstep.app;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.signal.PulseTrain;
import hammerstep.testing.StandardStreams;
import hammerstep.trace.TraceWriter;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * {@code replay --mains 50} removes 8 N·m of 50 Hz hum (with 2 N·m at 150 Hz) from a rundown of
 * eight strikes; without it the same trace is a {@code HUM} sensor fault; a frequency other than
 * 50 or 60 is refused with one line and exit 2.
 */
class ReplayMainsTest {

    private static final String PROGRAM = "src/test/resources/programs/good.yaml";
    private static final double RATE = 50_000;

    @TempDir
    Path dir;

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    private Path humming() throws Exception {
        return trace("hum.csv", 1);
    }

    private Path trace(String name, double hum) throws Exception {
        List<PulseTrain.Strike> s = new ArrayList<>();
        for (int i = 0; i < 8; i++) {
            s.add(new PulseTrain.Strike(0.5 + i * 0.027, 0.002, 120 + i * 13, 0.3, 0.2, 0.1));
        }
        float[] x = PulseTrain.render(RATE, 1.1, s, 0.2, 0.3, 1);
        for (int i = 0; i < x.length; i++) {
            double t = i / RATE;
            x[i] += (float) hum * (float) (8 * Math.sin(2 * Math.PI * 50 * t + 0.7) + 2 * Math.sin(2 * Math.PI * 150 * t + 2.1));
        }
        Path p = dir.resolve(name);
        try (TraceWriter w = new TraceWriter(p, RATE, Map.of())) {
            w.write(x, 0, x.length);
        }
        return p;
    }

    private JsonNode replay(Path p, String... more) throws Exception {
        List<String> args = new ArrayList<>(List.of("replay", p.toString(), "--program", PROGRAM));
        args.addAll(List.of(more));
        List<String> lines = streams.linesOf(() -> assertThat(Main.run(args.toArray(String[]::new))).isZero());
        assertThat(lines).hasSize(1);
        return new ObjectMapper().readTree(lines.get(0));
    }

    @Test
    void namedMainsHumIsRemovedUnnamedItIsASensorFault() throws Exception {
        Path p = humming();
        JsonNode named = replay(p, "--mains", "50");
        assertThat(named.get("verdict").asText()).isEqualTo("GO");
        assertThat(named.get("blows").asInt()).isEqualTo(8);
        JsonNode clean = replay(trace("clean.csv", 0));
        for (int b = 0; b < 8; b++) {
            double truth = clean.get("peaks_nm").get(b).asDouble();
            assertThat(named.get("peaks_nm").get(b).asDouble()).as("peak %d", b)
                    .isCloseTo(truth, within(Math.max(10.0, 0.04 * truth)));
        }
        JsonNode unnamed = replay(p);
        assertThat(unnamed.get("verdict").asText()).isEqualTo("NO_GO");
        assertThat(unnamed.get("sensor_faults").toString()).contains("HUM");
    }

    @Test
    void aMainsFrequencyOtherThanFiftyOrSixtyIsRefusedWithOneLine() throws Exception {
        Path p = humming();
        assertThat(Main.run("replay", p.toString(), "--program", PROGRAM, "--mains", "55")).isEqualTo(2);
        assertThat(streams.err().lines().toList()).singleElement().asString().startsWith("--mains 55");
    }
}
