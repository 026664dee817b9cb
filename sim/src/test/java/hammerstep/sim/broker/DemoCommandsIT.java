package hammerstep.sim.broker;

import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.MessageSchemas;
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
import java.util.Set;
import java.util.TreeSet;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The demo station answers the plant's commands while it runs: MQTT 5 requests with response topic
 * and correlation data through a broker of the test's (the demo's {@code --broker}), and a command
 * whose message expiry ran out while the demo was not running never acts.
 */
class DemoCommandsIT {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Duration WAIT = Duration.ofSeconds(30);
    private static final Path STATION = Path.of("../config/demo/station.yaml");
    private static final String PREFIX = "hammerstep/v1/harrow-bend/skid-1/flange-2/";
    @RegisterExtension
    static final LoopbackBroker BROKER = new LoopbackBroker();

    @TempDir
    Path dir;

    private Thread demo(int parts, long seed, Path results, AtomicInteger exit) {
        Thread t = new Thread(() -> {
            try {
                exit.set(new DemoRunner(new DemoOptions(STATION, parts, seed, true, true, 0, null, true, BROKER.url(),
                        results, null, dir.resolve("state")), new PrintStream(new ByteArrayOutputStream(), true,
                        StandardCharsets.UTF_8)).run());
            } catch (Exception e) {
                exit.set(99);
            }
        }, "demo-under-test");
        t.start();
        return t;
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    private static Received.Message reply(Received got, String topic) throws InterruptedException {
        Received.await("a reply on " + topic, WAIT, () -> !got.on(topic).isEmpty());
        Received.Message m = got.on(topic).get(0);
        MessageSchemas.assertValid(m.payload());
        return m;
    }

    @Test
    void theRunningDemoStationAnswersRequestsWithTheirCorrelationData() throws Exception {
        Received got = new Received();
        AtomicInteger exit = new AtomicInteger(-1);
        try (QualityClient qs = QualityClient.connect(BROKER.url(), "qs-demo", got::add)) {
            qs.subscribe("qs/demo/#");
            qs.subscribe(PREFIX + "status");
            Path results = dir.resolve("r.jsonl");
            Thread demo = demo(3, 5, results, exit);
            Received.await("the demo station online", WAIT, () -> got.on("/status").stream()
                    .anyMatch(m -> m.json().get("state").asText().equals("online")));

            qs.publish(PREFIX + "cmd/status", new byte[0], null, "qs/demo/status", utf8("corr-status"));
            qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":\"PS99X-1\",\"model\":\"PS-99X\"}"), 30L,
                    "qs/demo/part", utf8("corr-part"));
            // what a careless client leaves on the station's topics: an empty and a cut command
            qs.publish(PREFIX + "cmd/part", new byte[0], 30L, "qs/demo/empty", utf8("corr-empty"));
            qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":"), 30L, "qs/demo/cut", utf8("corr-cut"));

            Received.Message status = reply(got, "/demo/status");
            assertThat(new String(status.correlation(), StandardCharsets.UTF_8)).isEqualTo("corr-status");
            assertThat(status.json().get("ok").asBoolean()).isTrue();
            assertThat(status.json().get("status").get("activity").get("mode").asText()).isNotEqualTo("UNKNOWN");
            Received.Message part = reply(got, "/demo/part");
            assertThat(new String(part.correlation(), StandardCharsets.UTF_8)).isEqualTo("corr-part");
            assertThat(part.json().get("code").asText()).as("the station's own answer, not UNAVAILABLE")
                    .isEqualTo("UNKNOWN_MODEL");
            assertThat(part.json().get("message").asText()).contains("PS-40D", "PS-40S");

            assertThat(reply(got, "/demo/empty").json().get("ok").asBoolean()).isFalse();
            assertThat(reply(got, "/demo/cut").json().get("code").asText()).isEqualTo("MALFORMED");

            demo.join(WAIT.toMillis());
            assertThat(exit.get()).isZero();
            assertHoldsOnlyWhatTheStationPublished(results);
        }
    }

    /**
     * {@code --results-out} holds the station's own messages, each valid against its schema, and of every
     * kind a demo run of three parts produces; none of the commands or replies seen on the broker.
     */
    private static void assertHoldsOnlyWhatTheStationPublished(Path results) throws Exception {
        Set<String> kinds = new TreeSet<>();
        for (String line : Files.readAllLines(results)) {
            assertThat(line).as("a line of --results-out").startsWith("{\"schema\":\"hammerstep.");
            MessageSchemas.assertValid(utf8(line));
            kinds.add(JSON.readTree(line).get("schema").asText());
        }
        assertThat(kinds).containsExactlyInAnyOrder("hammerstep.joint.v1", "hammerstep.part.v1",
                "hammerstep.event.v1", "hammerstep.status.v1");
        assertThat(Files.readString(results)).doesNotContain("PS99X-1").doesNotContain("hammerstep.response.v1");
    }

    @Test
    void aCommandThatExpiredBeforeTheDemoRanNeverActs() throws Exception {
        AtomicInteger exit = new AtomicInteger(-1);
        Received got = new Received();
        try (QualityClient qs = QualityClient.connect(BROKER.url(), "qs-demo-expiry", got::add)) {
            qs.subscribe("qs/late/#");
            // a first run leaves the station's session, and so its command subscription, with the broker
            Thread first = demo(1, 3, null, exit);
            first.join(WAIT.toMillis());
            assertThat(exit.get()).isZero();

            qs.publish(PREFIX + "cmd/end-part", utf8("{\"reason\":\"too late\"}"), 1L, "qs/late/expired", utf8("e"));
            // the control has time left; a model the station does not know, so its answer does not depend
            // on how far the demo got when it arrives
            qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":\"X-1\",\"model\":\"PS-00\"}"), 120L,
                    "qs/late/kept", utf8("k"));
            Thread.sleep(2500); // the first command's one-second expiry runs out while no station takes it

            Path results = dir.resolve("r2.jsonl");
            Thread second = demo(1, 4, results, exit);
            Received.Message kept = reply(got, "/late/kept");
            assertThat(kept.json().get("code").asText()).as("queued while away, answered on connect")
                    .isEqualTo("UNKNOWN_MODEL");
            second.join(WAIT.toMillis());
            assertThat(exit.get()).isZero();
            assertThat(got.on("/late/expired")).as("the expired command never reached the station").isEmpty();
            assertThat(Files.readString(results)).doesNotContain("PART_ENDED").doesNotContain("too late");
        }
    }
}
