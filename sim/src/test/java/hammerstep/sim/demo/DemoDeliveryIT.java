package hammerstep.sim.demo;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.results.MessageSchemas;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.LongStream;

import static org.assertj.core.api.Assertions.assertThat;

/** The demo end to end through the embedded broker, as the acceptance check runs it. */
class DemoDeliveryIT {

    private static final Path STATION = Path.of("../config/demo/station.yaml");
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    private int demo(int parts, long seed, Path results, Path summary, Path state) throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        int exit = new DemoRunner(new DemoOptions(STATION, parts, seed, true, true, 0, null, true, null, results,
                summary, state), new PrintStream(bytes, true, StandardCharsets.UTF_8)).run();
        assertThat(bytes.toString(StandardCharsets.UTF_8)).contains("received by the quality system");
        return exit;
    }

    /** Joint messages after dropping repeats of an id, in arrival order. */
    private static List<Long> jointSeqs(Path results) throws Exception {
        Map<String, Long> byId = new LinkedHashMap<>();
        for (String line : Files.readAllLines(results)) {
            MessageSchemas.assertValid(line.getBytes(StandardCharsets.UTF_8));
            JsonNode m = JSON.readTree(line);
            if (m.get("schema").asText().equals("hammerstep.joint.v1")) {
                byId.putIfAbsent(m.get("id").asText(), m.get("seq").asLong());
            }
        }
        return new ArrayList<>(byId.values());
    }

    @Test
    void everyReceivedMessageValidatesAndJointSeqsAreGapFreeAndMatchTheSummary() throws Exception {
        Path results = dir.resolve("r.jsonl");
        Path summary = dir.resolve("s.json");
        assertThat(demo(3, 5, results, summary, null)).isZero();
        JsonNode s = JSON.readTree(summary.toFile());
        long joints = s.get("joints").asLong();
        assertThat(joints).isPositive();
        assertThat(s.get("last_seq").get("joint").asLong()).isEqualTo(joints);
        assertThat(s.get("parts").asLong()).isEqualTo(3);
        assertThat(jointSeqs(results)).containsExactlyElementsOf(LongStream.rangeClosed(1, joints).boxed().toList());
    }

    @Test
    void aRestartWithTheSameStateFolderResumesTheSequence() throws Exception {
        Path state = dir.resolve("state");
        Path s1 = dir.resolve("s1.json");
        Path s2 = dir.resolve("s2.json");
        Path r2 = dir.resolve("r2.jsonl");
        assertThat(demo(1, 3, null, s1, state)).isZero();
        assertThat(demo(1, 4, r2, s2, state)).isZero();
        long first = JSON.readTree(s1.toFile()).get("last_seq").get("joint").asLong();
        JsonNode second = JSON.readTree(s2.toFile());
        assertThat(second.get("last_seq").get("joint").asLong()).isEqualTo(first + second.get("joints").asLong());
        assertThat(jointSeqs(r2)).containsExactlyElementsOf(
                LongStream.rangeClosed(first + 1, first + second.get("joints").asLong()).boxed().toList());
    }

    @Test
    void aSegmentLostBetweenRunsIsAnAlarmAtTheStationsTimeAndItsSeqsAreNotGivenAgain() throws Exception {
        Path state = dir.resolve("state");
        Path s1 = dir.resolve("s1.json");
        Path r2 = dir.resolve("r2.jsonl");
        assertThat(demo(1, 3, null, s1, state)).isZero();
        long first = JSON.readTree(s1.toFile()).get("last_seq").get("joint").asLong();
        try (var segments = Files.newDirectoryStream(state, "seg-*")) {
            for (Path seg : segments) {
                Files.delete(seg);
            }
        }
        assertThat(demo(1, 4, r2, dir.resolve("s2.json"), state)).isZero();

        List<JsonNode> lost = new ArrayList<>();
        for (String line : Files.readAllLines(r2)) {
            JsonNode m = JSON.readTree(line);
            if (m.path("code").asText().equals("RESULTS_LOST")) {
                lost.add(m);
            }
        }
        assertThat(lost).isNotEmpty();
        assertThat(lost.get(0).get("message").asText()).contains("joint seq 1 to " + first);
        // stamped with the demo station's (virtual) time, as the results beside it: not 1970
        assertThat(lost).allSatisfy(m -> assertThat(m.get("time").asText()).doesNotStartWith("1970"));
        assertThat(jointSeqs(r2).get(0)).isEqualTo(first + 1);
    }
}
