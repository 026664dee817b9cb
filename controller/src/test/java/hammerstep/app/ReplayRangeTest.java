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

/**
 * {@code replay} takes the transducer's range from a CSV's {@code # range_nm=} line or from
 * {@code --over-range}: a rundown reaching it is a sensor fault; without a range the same trace is
 * judged on its torque. And a rundown with an electrical spike on it carries {@code rejected_impulses}.
 */
class ReplayRangeTest {

    private static final String PROGRAM = "src/test/resources/programs/good.yaml";
    private static final double RATE = 50_000;

    @TempDir
    Path dir;

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    private Path trace(String name, Map<String, String> meta, boolean spike) throws Exception {
        List<PulseTrain.Strike> s = new ArrayList<>();
        for (int i = 0; i < 8; i++) {
            s.add(new PulseTrain.Strike(0.3 + i * 0.027, 0.002, 120 + i * 13, 0.3, 0.2, 0.1));
        }
        float[] x = PulseTrain.render(RATE, 0.9, s, 0.2, 0.3, 1);
        if (spike) {
            // one sample of 300 N·m, 12 ms after the fourth strike began
            x[(int) Math.round((0.3 + 3 * 0.027 + 0.012) * RATE)] += 300;
        }
        Path p = dir.resolve(name);
        try (TraceWriter w = new TraceWriter(p, RATE, meta)) {
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
    void aRangeFromTheTraceOrTheCommandLineMakesReachingItASensorFault() throws Exception {
        JsonNode bare = replay(trace("bare.csv", Map.of(), false));
        assertThat(bare.get("verdict").asText()).isEqualTo("GO");
        assertThat(bare.has("sensor_faults")).isFalse();
        JsonNode ranged = replay(trace("ranged.csv", Map.of("range_nm", "200"), false));
        assertThat(ranged.get("verdict").asText()).isEqualTo("NO_GO");
        assertThat(ranged.get("sensor_faults").toString()).contains("OVER_RANGE");
        JsonNode option = replay(trace("bare2.csv", Map.of(), false), "--over-range", "200");
        assertThat(option.get("sensor_faults").toString()).contains("OVER_RANGE");
    }

    @Test
    void aSpikeBetweenBlowsIsRejectedAndCounted() throws Exception {
        JsonNode j = replay(trace("spiked.csv", Map.of(), true));
        assertThat(j.get("blows").asInt()).isEqualTo(8);
        assertThat(j.get("verdict").asText()).isEqualTo("GO");
        assertThat(j.get("rejected_impulses").asInt()).isEqualTo(1);
    }

    @Test
    void aRangeThatIsNotANumberIsRefusedWithOneLine() throws Exception {
        Path p = trace("junk.csv", Map.of("range_nm", "lots"), false);
        assertThat(Main.run("replay", p.toString(), "--program", PROGRAM)).isEqualTo(2);
        assertThat(streams.err().lines().toList()).singleElement().asString().startsWith(p + ": metadata range_nm");
    }
}
