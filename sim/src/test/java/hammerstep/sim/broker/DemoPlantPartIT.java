package hammerstep.sim.broker;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.sim.demo.DemoOptions;
import hammerstep.sim.demo.DemoRunner;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * A plant's {@code cmd/part} during a demo run (issue: the summary once read "parts 3 of 2"): the part it
 * names is worked when the station is free (between two parts of the run's list), and the summary's parts
 * line adds up: the run's own parts never more than it asked for, plus the others named, equal to the
 * part records the station published. A run read "parts 3 of 3, and 1 more not in the run's list",
 * with 4 part records (the summary is kept in {@code target/demo-plant-part.txt}).
 */
class DemoPlantPartIT {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Duration WAIT = Duration.ofSeconds(120);
    private static final Path STATION = Path.of("../config/demo/station.yaml");
    private static final String PREFIX = "hammerstep/v1/harrow-bend/skid-1/flange-2/";
    private static final String PLANT_SERIAL = "PS40D-PLANT-1";
    private static final int PARTS = 3;
    private static final Pattern PARTS_LINE = Pattern.compile(
            "(?m)^  parts +(\\d+) of (\\d+)(?: \\(not finished\\))?(?:, and (\\d+) more not in the run's list.*)?$");

    @RegisterExtension
    static final LoopbackBroker BROKER = new LoopbackBroker();

    @TempDir
    Path dir;

    @Test
    void aPlantPartSentDuringTheRunIsWorkedAndTheSummaryCountsAddUp() throws Exception {
        Received got = new Received();
        AtomicInteger exit = new AtomicInteger(-1);
        ByteArrayOutputStream printed = new ByteArrayOutputStream();
        Path results = dir.resolve("r.jsonl");
        try (QualityClient qs = QualityClient.connect(BROKER.url(), "qs-plant-part", got::add)) {
            qs.subscribe("qs/plant/#");
            qs.subscribe(PREFIX + "status");
            Thread demo = new Thread(() -> {
                try (PrintStream out = new PrintStream(printed, true, StandardCharsets.UTF_8)) {
                    exit.set(new DemoRunner(new DemoOptions(STATION, PARTS, 11, true, true, 0, null, true,
                            BROKER.url(), results, null, dir.resolve("state")), out).run());
                } catch (Exception e) {
                    exit.set(99);
                }
            }, "demo-under-test");
            demo.start();
            Received.await("the demo station online", WAIT, () -> got.on("/status").stream()
                    .anyMatch(m -> m.json().get("state").asText().equals("online")));

            // the plant names a part; while a part is in work the station answers BUSY, so ask again
            String accepted = null;
            List<String> answers = new ArrayList<>();
            for (int k = 0; accepted == null && demo.isAlive(); k++) {
                String topic = "qs/plant/" + k;
                qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":\"" + PLANT_SERIAL + "\",\"model\":\"PS-40D\"}"),
                        30L, topic, utf8("c" + k));
                Received.await("an answer on " + topic, WAIT, () -> !got.on(topic).isEmpty() || !demo.isAlive());
                if (got.on(topic).isEmpty()) {
                    break;
                }
                JsonNode answer = got.on(topic).get(0).json();
                answers.add(answer.get("code").asText());
                if (answer.get("ok").asBoolean()) {
                    accepted = answer.get("message").asText();
                } else {
                    assertThat(answer.get("code").asText()).as("the only refusal a healthy station gives")
                            .isEqualTo("BUSY");
                    Thread.sleep(10);
                }
            }
            demo.join(WAIT.toMillis());
            assertThat(demo.isAlive()).isFalse();
            assertThat(accepted).as("the plant's part was taken (answers: %s)", answers).isNotNull();
        }
        String summary = printed.toString(StandardCharsets.UTF_8);
        Files.writeString(Path.of("target/demo-plant-part.txt"), summary); // for a reader of the build
        assertThat(exit.get()).as(summary).isZero();

        Matcher m = PARTS_LINE.matcher(summary);
        assertThat(m.find()).as("a parts line in:%n%s", summary).isTrue();
        int ofList = Integer.parseInt(m.group(1));
        int asked = Integer.parseInt(m.group(2));
        int others = m.group(3) == null ? 0 : Integer.parseInt(m.group(3));

        int partRecords = 0;
        int plantRecords = 0;
        for (String line : Files.readAllLines(results)) {
            JsonNode j = JSON.readTree(line);
            if (j.get("schema").asText().equals("hammerstep.part.v1")) {
                partRecords++;
                if (line.contains(PLANT_SERIAL)) {
                    plantRecords++;
                }
            }
        }
        assertThat(asked).isEqualTo(PARTS);
        assertThat(ofList).as("never more of the run's parts than it asked for").isLessThanOrEqualTo(asked);
        assertThat(plantRecords).as("the plant's part was worked and recorded once").isEqualTo(1);
        assertThat(others).as("the plant's part is counted apart from the run's list").isEqualTo(plantRecords);
        assertThat(ofList + others).as("the parts line adds up to the part records published")
                .isEqualTo(partRecords);
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
