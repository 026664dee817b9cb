package hammerstep.sim.broker;

import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.MessageSchemas;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.station.SystemStationClock;
import org.agrona.concurrent.AgentRunner;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * The Last Will against Mosquitto 2.0: it carries no figures a subscriber could take for a reset;
 * a station whose network is gone shows "offline" once, after the will delay (5 s, MQTT 5.0
 * §3.1.3.2.2), not at once. Across a broker restart Mosquitto (2.0.11 here) sends the will that
 * the restored session held when the station takes its session back, although the station is back
 * within the delay: the test counts those copies and shows that the station's online status follows
 * them, so the retained status is right again.
 */
class LastWillIT {

    private static final Duration WAIT = Duration.ofSeconds(30);
    private static final String STATUS = "hammerstep/v1/plant-north/axle-2/hub-fit-1/status";

    @TempDir
    Path dir;

    @BeforeEach
    void needsMosquitto() {
        assumeTrue(Mosquitto.binary() != null, "mosquitto is not installed");
    }

    private static List<Received.Message> offline(Received got) {
        return got.on(STATUS).stream().filter(m -> m.json().get("state").asText().equals("offline")).toList();
    }

    @Test
    void aBrokerRestartSendsNoOfflineAndAStationGoneForLongerSendsOneWithoutCounters() throws Exception {
        Received got = new Received();
        try (Mosquitto broker = new Mosquitto(dir.resolve("broker"), "", true)) {
            broker.start();
            try (LoopbackProxy proxy = new LoopbackProxy(broker.port())) {
                BrokerSettings s = new BrokerSettings(proxy.url(), "hub-fit-1", null, null, null, null, null, 10, 5,
                        100, 500, 600, 300, 60, 32);
                FileOutbox outbox = FileOutbox.open(new StorageSettings(dir.resolve("state"), 1 << 20, 1 << 20,
                        1L << 30, 0, 0));
                OutboxResultSink sink = new OutboxResultSink(outbox, TestResults.STATION);
                ResultPublisher publisher = new ResultPublisher(outbox, TestResults.STATION, () -> new PahoLink(s),
                        StationCommands.NONE, s, new SystemStationClock(), 1, "test");
                AgentRunner runner = ResultPublisher.start(publisher);
                try (QualityClient qs = QualityClient.connect(broker.url(), "qs-will", got::add)) {
                    qs.subscribe(STATUS);
                    for (int i = 1; i <= 3; i++) {
                        sink.joint(TestResults.joint(i));
                    }
                    Received.await("delivered", WAIT, () -> outbox.backlog() == 0);

                    broker.stop();
                    broker.start();
                    Received.await("the station back after the restart", WAIT,
                            () -> publisher.figures().connects() >= 2);
                    Thread.sleep(7000); // longer than the will delay: a will, if any, has come by now
                    int afterRestart = offline(got).size();
                    System.out.println("offline statuses received across the broker restart: " + afterRestart);
                    for (Received.Message m : offline(got)) {
                        MessageSchemas.assertValid(m.payload());
                        assertThat(m.json().has("last_seq")).as("a will carries no last_seq").isFalse();
                    }
                    List<Received.Message> all = got.on(STATUS);
                    assertThat(all.get(all.size() - 1).json().get("state").asText())
                            .as("the last status after the restart").isEqualTo("online");

                    proxy.cut(); // the station's network is gone; the broker sees the connection drop
                    long cutNs = System.nanoTime();
                    Received.await("the will", WAIT, () -> offline(got).size() > afterRestart);
                    long willAfterMs = (System.nanoTime() - cutNs) / 1_000_000;
                    Thread.sleep(1000);
                    System.out.println("the will arrived " + willAfterMs + " ms after the station's network went");
                    assertThat(willAfterMs).as("the will waits for its delay").isGreaterThanOrEqualTo(4000);
                    assertThat(offline(got)).hasSize(afterRestart + 1);
                    Received.Message will = offline(got).get(afterRestart);
                    MessageSchemas.assertValid(will.payload());
                    assertThat(will.json().has("last_seq")).isFalse();
                    assertThat(will.json().has("backlog")).isFalse();
                    assertThat(will.json().get("last_seq_at_connect").get("joint").asLong()).isEqualTo(3);
                } finally {
                    runner.close();
                    outbox.close();
                }
            }
        }
    }
}
