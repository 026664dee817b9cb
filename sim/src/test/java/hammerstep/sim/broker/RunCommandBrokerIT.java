package hammerstep.sim.broker;

import hammerstep.app.Main;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.MessageSchemas;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code hammerstep run} on Pi4J's mock hardware with a {@code broker:} and a {@code storage:}
 * section, against the embedded MQTT 5 broker: the plant's commands reach the station loop and are
 * answered by request/response, the part ended by command arrives as a part message with its event,
 * and a command that expired while the station was stopped never acts. The station file has no
 * part-present sensor here, so a part named by command starts at once.
 */
class RunCommandBrokerIT {

    private static final Duration WAIT = Duration.ofSeconds(20);
    private static final String PREFIX = "hammerstep/v1/plant-07/axle-2/hub-torque-1/";
    @RegisterExtension
    static final LoopbackBroker BROKER = new LoopbackBroker();

    @TempDir
    Path dir;

    /** The example station file in {@code dir}, journal in {@code dir/outbox}, delivering to the embedded broker. */
    private Path station() throws IOException {
        return station(false);
    }

    /** @param ownPattern the pattern file copied beside the station file (a test may change it) */
    private Path station(boolean ownPattern) throws IOException {
        Path example = Path.of("../config/station.example.yaml").toAbsolutePath().normalize();
        Path pattern = example.getParent().resolve("patterns/hub-5.yaml");
        if (ownPattern) {
            Files.createDirectories(dir.resolve("patterns"));
            Files.copy(pattern, dir.resolve("patterns/hub-5.yaml"));
        }
        String text = Files.readString(example)
                .replace("patterns/hub-5.yaml", ownPattern ? "patterns/hub-5.yaml" : pattern.toString())
                .replace("dir: /var/lib/hammerstep/outbox", "dir: outbox")
                // no part-present sensor: the mock's input reads "no part", and a part named by command would wait
                .replace("    part_present: { pin: 3, debounce_ms: 50 }\n", "");
        assertThat(text).doesNotContain("part_present");
        Path file = dir.resolve("station.yaml");
        Files.writeString(file, text + "\nbroker:\n  url: " + BROKER.url() + "\n  reconnect: { min_ms: 50, max_ms: 500 }\n");
        return file;
    }

    /** Runs the service on its own thread for {@code seconds}, standard input empty. */
    private static Thread run(Path station, double seconds, AtomicInteger exit) {
        Thread t = new Thread(() -> {
            InputStream saved = System.in;
            System.setIn(new ByteArrayInputStream(new byte[0]));
            try {
                exit.set(Main.run("run", "--config", station.toString(), "--hardware", "mock", "--exit-after",
                        Double.toString(seconds)));
            } finally {
                System.setIn(saved);
            }
        }, "run-under-test");
        t.start();
        return t;
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    /** Messages on the station's own topic {@code kind} (not on cmd/..., which the subscriber hears too). */
    private static java.util.List<Received.Message> on(Received got, String kind) {
        return got.all.stream().filter(m -> m.topic().equals(PREFIX + kind)).toList();
    }

    private static Received.Message reply(Received got, String topic) throws InterruptedException {
        Received.await("a reply on " + topic, WAIT, () -> !got.on(topic).isEmpty());
        Received.Message m = got.on(topic).get(0);
        MessageSchemas.assertValid(m.payload());
        return m;
    }

    @Test
    void answersThePlantsCommandsAndDeliversThePartTheyEnded() throws Exception {
        Received got = new Received();
        AtomicInteger exit = new AtomicInteger(-1);
        try (QualityClient qs = QualityClient.connect(BROKER.url(), "qs-run", got::add)) {
            qs.subscribe(PREFIX + "#");
            qs.subscribe("qs/replies/#");
            Thread service = run(station(), 6, exit);
            Received.await("the station online", WAIT, () -> on(got, "status").stream()
                    .anyMatch(m -> m.json().get("state").asText().equals("online")));

            qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":\"HX-0042\",\"model\":\"HX-220\"}"), 30L,
                    "qs/replies/start", utf8("req-1"));
            Received.Message part = reply(got, "/replies/start");
            assertThat(new String(part.correlation(), StandardCharsets.UTF_8)).isEqualTo("req-1");
            assertThat(part.json().get("ok").asBoolean()).as(part.json().toString()).isTrue();

            qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":\"HX-0043\",\"model\":\"HX-999\"}"), 30L,
                    "qs/replies/unknown", utf8("req-2"));
            assertThat(reply(got, "/replies/unknown").json().get("code").asText()).isEqualTo("UNKNOWN_MODEL");

            qs.publish(PREFIX + "cmd/status", new byte[0], null, "qs/replies/status", utf8("req-3"));
            Received.Message status = reply(got, "/replies/status");
            assertThat(status.json().get("status").get("activity").get("part_serial").asText()).isEqualTo("HX-0042");

            qs.publish(PREFIX + "cmd/end-part", utf8("{\"reason\":\"label misprinted\"}"), 30L,
                    "qs/replies/end", utf8("req-4"));
            Received.Message end = reply(got, "/replies/end");
            assertThat(end.json().get("ok").asBoolean()).as(end.json().toString()).isTrue();
            Received.await("the part message", WAIT, () -> !on(got, "part").isEmpty());
            assertThat(on(got, "part").get(0).json().get("ended").asText()).isEqualTo("ABANDONED");
            assertThat(on(got, "part").get(0).json().get("part_serial").asText()).isEqualTo("HX-0042");
            assertThat(on(got, "event")).anySatisfy(e -> assertThat(e.json().get("code").asText()).isEqualTo("PART_ENDED"));

            service.join(WAIT.toMillis());
            assertThat(exit.get()).isZero();
            Received.await("offline status on a clean stop", WAIT, () -> {
                var all = on(got, "status");
                return all.get(all.size() - 1).json().get("state").asText().equals("offline");
            });
            for (Received.Message m : got.all) {
                if (!m.topic().contains("/cmd/")) {
                    MessageSchemas.assertValid(m.payload());
                }
            }
        }
    }

    @Test
    void aCommandThatExpiredWhileTheServiceWasStoppedNeverActs() throws Exception {
        Path station = station();
        AtomicInteger exit = new AtomicInteger(-1);
        Received got = new Received();
        try (QualityClient qs = QualityClient.connect(BROKER.url(), "qs-run-expiry", got::add)) {
            qs.subscribe("qs/expiry/#");
            qs.subscribe(PREFIX + "status");
            // a first run leaves its session (and so its command subscription) with the broker
            Thread first = run(station, 1.5, exit);
            first.join(WAIT.toMillis());
            assertThat(exit.get()).isZero();

            qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":\"HX-LATE\",\"model\":\"HX-220\"}"), 1L,
                    "qs/expiry/late", utf8("late"));
            qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":\"HX-KEPT\",\"model\":\"HX-220\"}"), 120L,
                    "qs/expiry/kept", utf8("kept"));
            Thread.sleep(2500); // the first command's one-second expiry runs out while nobody takes it

            got.all.clear();
            Thread second = run(station, 4, exit);
            Received.Message kept = reply(got, "/expiry/kept");
            assertThat(kept.json().get("ok").asBoolean()).as(kept.json().toString()).isTrue();
            qs.publish(PREFIX + "cmd/status", new byte[0], null, "qs/expiry/status", null);
            assertThat(reply(got, "/expiry/status").json().get("status").get("activity").get("part_serial").asText())
                    .isEqualTo("HX-KEPT");
            second.join(WAIT.toMillis());
            assertThat(got.on("/expiry/late")).as("the expired command got no answer: it never reached the station")
                    .isEmpty();
        }
    }
    @Test
    void reloadReadsTheFilesAgainAndABrokenFileChangesNothing() throws Exception {
        Path station = station(true);
        Path pattern = dir.resolve("patterns/hub-5.yaml");
        Received got = new Received();
        AtomicInteger exit = new AtomicInteger(-1);
        try (QualityClient qs = QualityClient.connect(BROKER.url(), "qs-run-reload", got::add)) {
            qs.subscribe("qs/reload/#");
            qs.subscribe(PREFIX + "status");
            Thread service = run(station, 6, exit);
            Received.await("the station online", WAIT, () -> on(got, "status").stream()
                    .anyMatch(m -> m.json().get("state").asText().equals("online")));

            Files.writeString(pattern, Files.readString(pattern).replace("target: 300.0", "target: 305.0"));
            qs.publish(PREFIX + "cmd/reload", utf8("{}"), 30L, "qs/reload/good", utf8("g"));
            assertThat(reply(got, "/reload/good").json().get("message").asText())
                    .isEqualTo("programs reloaded: 1 part model");

            Files.writeString(pattern, "id: hub-5\npositions: five\n");
            qs.publish(PREFIX + "cmd/reload", utf8("{}"), 30L, "qs/reload/bad", utf8("b"));
            Received.Message bad = reply(got, "/reload/bad");
            assertThat(bad.json().get("code").asText()).isEqualTo("RELOAD_FAILED");
            assertThat(bad.json().get("message").asText()).contains("station.yaml:").contains("hub-5.yaml:2:");

            qs.publish(PREFIX + "cmd/part", utf8("{\"serial\":\"HX-0050\",\"model\":\"HX-220\"}"), 30L,
                    "qs/reload/part", utf8("p"));
            assertThat(reply(got, "/reload/part").json().get("message").asText())
                    .as("the programs loaded before still work").isEqualTo("part HX-0050 started: pattern hub-5");
            service.join(WAIT.toMillis());
            assertThat(exit.get()).isZero();
        }
    }
}
