package hammerstep.sim.broker;

import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.Link;
import hammerstep.mqtt.RecordingStation;
import hammerstep.mqtt.Topics;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.MessageSchemas;
import hammerstep.results.ResultSink;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Collectors;
import java.util.stream.LongStream;

import static org.assertj.core.api.Assertions.assertThat;

/** Results, status and commands through a real MQTT 5 broker (HiveMQ CE embedded) on loopback. */
class EmbeddedBrokerDeliveryIT {

    private static final Duration WAIT = Duration.ofSeconds(20);
    @RegisterExtension
    static final LoopbackBroker BROKER = new LoopbackBroker();

    @TempDir
    Path state;

    /**
     * Every test starts a new station (a new store) under the same identity on the one broker: the
     * retained status an earlier test left would make the station's seq cross check (rightly) give
     * seqs above it. Each test here is a first start of its station, so that status is cleared.
     */
    @BeforeEach
    void noStatusLeftByAnEarlierTest() throws Exception {
        PahoLink l = new PahoLink(BrokerSettings.plain(BROKER.url(), "clear-status"));
        try {
            l.connect(new Link.Will("test/clear-status", new byte[0]), new Link.Events() {
                @Override
                public void connectionLost(String cause) {
                }

                @Override
                public void acknowledged(long tag, boolean ok, String detail) {
                }

                @Override
                public void message(String topic, byte[] payload, Long expiryS, String responseTopic,
                                    byte[] correlation) {
                }
            });
            l.publishAndWait(new Topics(TestResults.STATION).status(), new byte[0], true, 10_000);
        } finally {
            l.disconnect();
        }
    }

    private static QualityClient subscriber(Received got, String name) throws Exception {
        QualityClient q = QualityClient.connect(BROKER.url(), name, got::add);
        q.subscribe("hammerstep/v1/+/+/+/#");
        return q;
    }

    @Test
    void deliversEveryResultInSeqOrderValidAgainstItsSchemaAndMarksItDelivered() throws Exception {
        Received got = new Received();
        try (QualityClient q = subscriber(got, "qs-order");
             StationHarness station = new StationHarness(BROKER.url(), state.resolve("a"), StationCommands.NONE)) {
            List<String> ids = new ArrayList<>();
            for (int i = 1; i <= 40; i++) {
                ids.add(station.joint(i).id());
            }
            ResultSink.Receipt part = station.sink.part(TestResults.part("WH-1000", ids.subList(0, 5)));
            Received.await("40 joints and a part", WAIT, () -> got.on("/joint").size() >= 40 && got.on("/part").size() >= 1);
            Received.await("backlog drained", WAIT, () -> station.outbox.backlog() == 0);
            // QoS 1 is at least once: a result sent again after a reconnect may arrive twice. A repeat
            // carries the same id and the same bytes; dropping repeats leaves seq 1..40 in arrival order.
            Map<String, byte[]> firstById = new java.util.LinkedHashMap<>();
            for (Received.Message m : got.on("/joint")) {
                byte[] earlier = firstById.putIfAbsent(m.json().get("id").asText(), m.payload());
                if (earlier != null) {
                    assertThat(m.payload()).as("a repeat of %s", m.json().get("id").asText()).isEqualTo(earlier);
                }
            }
            List<Long> seqs = got.uniqueJoints().values().stream().toList();
            assertThat(seqs).containsExactlyElementsOf(LongStream.rangeClosed(1, 40).boxed().toList());
            assertThat(firstById.keySet()).containsExactlyElementsOf(ids);
            assertThat(got.on("/part").get(0).json().get("id").asText()).isEqualTo(part.id());
            for (Received.Message m : got.all) {
                MessageSchemas.assertValid(m.payload());
            }
        }
    }

    @Test
    void aNetworkOutageLosesNothingAndTheBacklogDrainsOnReconnect() throws Exception {
        Received got = new Received();
        try (LoopbackProxy proxy = new LoopbackProxy(BROKER.port());
             QualityClient q = subscriber(got, "qs-outage");
             StationHarness station = new StationHarness(proxy.url(), state.resolve("b"), StationCommands.NONE)) {
            for (int i = 1; i <= 10; i++) {
                station.joint(i);
            }
            Received.await("first ten", WAIT, () -> station.outbox.backlog() == 0);
            proxy.cut();
            Received.await("the Will: status offline", WAIT, () -> got.on("/status").stream()
                    .anyMatch(m -> m.json().get("state").asText().equals("offline")));
            for (int i = 11; i <= 60; i++) {
                station.joint(i);
            }
            assertThat(station.outbox.backlog()).isEqualTo(50);
            proxy.restore();
            Received.await("all sixty after reconnect", WAIT, () -> got.uniqueJoints().size() >= 60);
            Received.await("backlog drained", WAIT, () -> station.outbox.backlog() == 0);
            Map<String, Long> unique = got.uniqueJoints();
            assertThat(unique.values()).containsExactlyInAnyOrderElementsOf(
                    LongStream.rangeClosed(1, 60).boxed().toList());
            Received.Message lastStatus = got.on("/status").get(got.on("/status").size() - 1);
            assertThat(lastStatus.json().get("state").asText()).isEqualTo("online");
            for (Received.Message m : got.all) {
                MessageSchemas.assertValid(m.payload());
            }
        }
    }

    @Test
    void drainsABacklogStoredWhileTheBrokerWasUnreachable() throws Exception {
        Received got = new Received();
        try (LoopbackProxy proxy = new LoopbackProxy(BROKER.port());
             QualityClient q = subscriber(got, "qs-drain");
             StationHarness station = new StationHarness(proxy.url(), state.resolve("g"), StationCommands.NONE)) {
            proxy.cut();
            for (int i = 1; i <= 600; i++) {
                station.joint(i);
            }
            proxy.restore();
            Received.await("600 joints", Duration.ofSeconds(60), () -> got.uniqueJoints().size() >= 600);
            Received.await("backlog drained", Duration.ofSeconds(60), () -> station.outbox.backlog() == 0);
            assertThat(got.uniqueJoints().values()).containsExactlyInAnyOrderElementsOf(
                    LongStream.rangeClosed(1, 600).boxed().toList());
        }
    }

    @Test
    void aLateSubscriberFindsTheRetainedStatus() throws Exception {
        try (StationHarness station = new StationHarness(BROKER.url(), state.resolve("c"), StationCommands.NONE)) {
            station.joint(1);
            Received.await("delivered", WAIT, () -> station.outbox.backlog() == 0);
            Received late = new Received();
            try (QualityClient q = QualityClient.connect(BROKER.url(), "qs-late", late::add)) {
                q.subscribe("hammerstep/v1/plant-north/axle-2/hub-fit-1/status");
                Received.await("retained status", WAIT, () -> !late.on("/status").isEmpty());
                Received.Message s = late.on("/status").get(0);
                assertThat(s.retained()).isTrue();
                assertThat(s.json().get("state").asText()).isEqualTo("online");
                MessageSchemas.assertValid(s.payload());
            }
        }
    }

    @Test
    void answersCommandsByRequestResponseAndRefusesBadOnesWithoutActing() throws Exception {
        RecordingStation commands = new RecordingStation();
        Received got = new Received();
        String cmd = "hammerstep/v1/plant-north/axle-2/hub-fit-1/cmd/";
        try (StationHarness station = new StationHarness(BROKER.url(), state.resolve("d"), commands);
             QualityClient q = QualityClient.connect(BROKER.url(), "qs-cmd", got::add)) {
            q.subscribe("qs/replies/#");
            Received.await("station connected", WAIT, () -> station.publisher.figures().connected());
            q.publish(cmd + "part", "{\"serial\":\"WH-2001\",\"model\":\"hub-5\"}".getBytes(StandardCharsets.UTF_8),
                    30L, "qs/replies/a", "corr-a".getBytes(StandardCharsets.UTF_8));
            q.publish(cmd + "part", "{\"serial\":42}".getBytes(StandardCharsets.UTF_8), 30L, "qs/replies/b",
                    "corr-b".getBytes(StandardCharsets.UTF_8));
            q.publish(cmd + "launch", "{}".getBytes(StandardCharsets.UTF_8), 30L, "qs/replies/c", null);
            q.publish(cmd + "status", new byte[0], null, "qs/replies/d", "corr-d".getBytes(StandardCharsets.UTF_8));
            Received.await("four responses", WAIT, () -> got.on("/replies/a").size() + got.on("/replies/b").size()
                    + got.on("/replies/c").size() + got.on("/replies/d").size() >= 4);
            Received.Message a = got.on("/replies/a").get(0);
            assertThat(new String(a.correlation(), StandardCharsets.UTF_8)).isEqualTo("corr-a");
            assertThat(a.json().get("ok").asBoolean()).isTrue();
            assertThat(got.on("/replies/b").get(0).json().get("code").asText()).isEqualTo("INVALID");
            assertThat(got.on("/replies/c").get(0).json().get("code").asText()).isEqualTo("UNKNOWN_COMMAND");
            assertThat(got.on("/replies/d").get(0).json().get("status").get("state").asText()).isEqualTo("online");
            assertThat(commands.started).containsExactly("WH-2001/hub-5");
            for (Received.Message m : got.all) {
                MessageSchemas.assertValid(m.payload());
            }
        }
    }

    @Test
    void aCommandThatExpiredWhileTheStationWasOfflineNeverActs() throws Exception {
        RecordingStation commands = new RecordingStation();
        String cmd = "hammerstep/v1/plant-north/axle-2/hub-fit-1/cmd/";
        try (LoopbackProxy proxy = new LoopbackProxy(BROKER.port());
             StationHarness station = new StationHarness(proxy.url(), state.resolve("e"), commands);
             QualityClient q = QualityClient.connect(BROKER.url(), "qs-expiry", (t, p, r, c) -> { })) {
            Received.await("station connected", WAIT, () -> station.publisher.figures().connected());
            proxy.cut();
            Received.await("station offline", WAIT, () -> !station.publisher.figures().connected());
            q.publish(cmd + "part", "{\"serial\":\"WH-LATE\",\"model\":\"hub-5\"}".getBytes(StandardCharsets.UTF_8),
                    1L, null, null);
            q.publish(cmd + "part", "{\"serial\":\"WH-KEPT\",\"model\":\"hub-5\"}".getBytes(StandardCharsets.UTF_8),
                    120L, null, null);
            Thread.sleep(2500);
            proxy.restore();
            Received.await("the command with time left", WAIT, () -> !commands.started.isEmpty());
            Thread.sleep(500);
            assertThat(commands.started).containsExactly("WH-KEPT/hub-5");
        }
    }

    @Test
    void leavesNoClientThreadBehind() throws Exception {
        try (StationHarness station = new StationHarness(BROKER.url(), state.resolve("f"), StationCommands.NONE)) {
            station.joint(1);
            Received.await("delivered", WAIT, () -> station.outbox.backlog() == 0);
        }
        try {
            Received.await("client threads gone", Duration.ofSeconds(5), () -> clientThreads().isEmpty());
        } finally {
            Thread.getAllStackTraces().forEach((t, st) -> {
                if (clientThreads().contains(t.getName())) {
                    System.out.println("LEFT " + t.getName() + " daemon=" + t.isDaemon() + " "
                            + java.util.Arrays.toString(st).replace(", ", "\n  "));
                }
            });
            assertThat(clientThreads()).isEmpty();
        }
    }

    private static Set<String> clientThreads() {
        return Thread.getAllStackTraces().keySet().stream().filter(Thread::isAlive)
                .map(Thread::getName)
                .filter(n -> n.startsWith("MQTT") || n.startsWith("mqtt-hub-fit-1") || n.startsWith("results-delivery"))
                .collect(Collectors.toSet());
    }
}
