package hammerstep.app;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.joint.ResidualEstimator;
import hammerstep.signal.BlowForms;
import hammerstep.testing.StandardStreams;
import hammerstep.trace.TraceWriter;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** Replay lines carry the residual estimate under the field the joint message has. */
class ReplayResidualTest {

    private static final Path GOOD = Path.of("src/test/resources/programs/good.yaml");
    private static final int RATE = 50_000;

    @TempDir
    Path dir;

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    /** Blows 27 ms apart: {@code turning} ones against friction torques rising to 180 N·m, then elastic ones. */
    private Path trace(int turning, int elastic) throws Exception {
        int every = RATE * 27 / 1000;
        float[] x = new float[(turning + elastic + 14) * every];
        int at = 2 * every;
        for (int i = 0; i < turning; i++) {
            double friction = 180 - 10 * (turning - 1 - i);
            float[] b = BlowForms.turning(1.2 * friction, friction, 12, 40, 15, 0);
            System.arraycopy(b, 0, x, at, b.length);
            at += every;
        }
        for (int i = 0; i < elastic; i++) {
            float[] b = BlowForms.elastic(200 + i, 60, 0);
            System.arraycopy(b, 0, x, at, b.length);
            at += every;
        }
        Path p = dir.resolve("t" + turning + "-" + elastic + ".csv");
        try (TraceWriter w = new TraceWriter(p, RATE, Map.of())) {
            w.write(x, 0, x.length);
        }
        return p;
    }

    @Test
    void aReplayLineCarriesTheEstimateAndItsBand() throws Exception {
        assertThat(Main.run("replay", trace(5, 2).toString(), "--program", GOOD.toString())).isZero();
        JsonNode line = new ObjectMapper().readTree(streams.out().strip());
        JsonNode e = line.get("residual_estimate");
        assertThat(e.get("blows_used").asInt()).isEqualTo(3);
        assertThat(e.get("turning_blows").asInt()).isEqualTo(5);
        // slides at 160, 170 and 180 N·m: 170 on average, within 2 %
        assertThat(e.get("slide_nm").asDouble()).isCloseTo(170, within(3.4));
        assertThat(e.get("torque_nm").asDouble()).isCloseTo(ResidualEstimator.DEFAULT_FACTOR
                * e.get("slide_nm").asDouble(), within(0.02));
        assertThat(e.get("low_nm").asDouble()).isLessThan(e.get("torque_nm").asDouble());
        assertThat(e.get("high_nm").asDouble()).isGreaterThan(e.get("torque_nm").asDouble());
    }

    @Test
    void aReplayLineWithoutATurningBlowSaysWhy() throws Exception {
        assertThat(Main.run("replay", trace(0, 6).toString(), "--program", GOOD.toString())).isZero();
        JsonNode line = new ObjectMapper().readTree(streams.out().strip());
        assertThat(line.at("/residual_estimate/reason").asText()).isEqualTo("NO_TURNING_BLOW");
        assertThat(line.at("/residual_estimate/torque_nm").isMissingNode()).isTrue();
    }
}
