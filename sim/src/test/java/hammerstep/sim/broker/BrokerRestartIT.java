package hammerstep.sim.broker;

import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.MessageSchemas;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.TreeSet;
import java.util.stream.LongStream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * Mosquitto restarted in the middle of a run, once with its persistence and once without, and what
 * the quality system ends with after de-duplication by id. The station only guarantees delivery to
 * the broker (a result leaves its outbox on the broker's PUBACK); from there on it is the broker's
 * session that carries a result to a subscriber. So:
 * <ul>
 * <li>with persistence, a subscriber with a persistent session (clean start off, session expiry)
 * gets everything even when it was away during the restart;</li>
 * <li>without persistence, a subscriber gets everything only if it is connected and subscribed
 * again before the station sends again (here the station is held back by a relay until then);</li>
 * <li>without persistence, what the broker held for an absent subscriber is gone: a gap in
 * {@code seq} that no redelivery fills.</li>
 * </ul>
 * Skipped when Mosquitto is not installed ({@code .ci/run} installs it).
 */
class BrokerRestartIT {

    private static final Duration WAIT = Duration.ofSeconds(30);
    private static final String JOINTS = "hammerstep/v1/+/+/+/joint";
    private static final String PROBE = "qs-probe/restart";

    @TempDir
    Path dir;

    @BeforeEach
    void needsMosquitto() {
        assumeTrue(Mosquitto.binary() != null, "mosquitto is not installed");
    }

    @Test
    void withPersistenceASubscriberAwayDuringTheRestartEndsWithEveryResultOnce() throws Exception {
        Received got = new Received();
        try (Mosquitto broker = new Mosquitto(dir.resolve("broker"), "", true)) {
            broker.start();
            try (StationHarness station = new StationHarness(broker.url(), dir.resolve("state"), StationCommands.NONE)) {
                try (QualityClient q = QualityClient.connect(broker.url(), "qs-persist", got::add)) {
                    q.subscribe(JOINTS);
                    Received.await("station connected", WAIT, () -> station.publisher.figures().connected());
                    joints(station, 1, 30);
                    Received.await("30 joints", WAIT, () -> got.uniqueJoints().size() >= 30);
                } // the quality system goes away; its session stays on the broker
                joints(station, 31, 60);
                Received.await("the broker took 31 to 60", WAIT, () -> station.outbox.backlog() == 0);
                broker.stop(); // SIGTERM: Mosquitto saves sessions and queued messages
                joints(station, 61, 75);
                broker.start();
                joints(station, 76, 90);
                Received.await("the broker took all", WAIT, () -> station.outbox.backlog() == 0);
                try (QualityClient back = QualityClient.connect(broker.url(), "qs-persist", got::add)) {
                    // no subscribe: the restored session still has the subscription and the queue
                    Received.await("ninety unique joints", WAIT, () -> got.uniqueJoints().size() >= 90);
                    assertEverySeqOnce(got, 90);
                }
            }
        }
    }

    @Test
    void withoutPersistenceASubscriberBackBeforeTheStationEndsWithEveryResultOnce() throws Exception {
        Received got = new Received();
        try (Mosquitto broker = new Mosquitto(dir.resolve("broker"), "", false);
             LoopbackProxy relay = startAnd(broker)) {
            try (StationHarness station = new StationHarness(relay.url(), dir.resolve("state"), StationCommands.NONE);
                 QualityClient q = QualityClient.connect(broker.url(), "qs-volatile", got::add)) {
                q.subscribe(JOINTS);
                q.subscribe(PROBE);
                Received.await("station connected", WAIT, () -> station.publisher.figures().connected());
                joints(station, 1, 30);
                Received.await("30 joints", WAIT, () -> got.uniqueJoints().size() >= 30);
                broker.stop(); // forgets every session
                relay.cut(); // the station comes back only after the quality system
                joints(station, 31, 60);
                broker.start();
                awaitSubscribedAgain(q, got);
                relay.restore();
                joints(station, 61, 90);
                Received.await("ninety unique joints", WAIT, () -> got.uniqueJoints().size() >= 90);
                Received.await("backlog drained", WAIT, () -> station.outbox.backlog() == 0);
                assertEverySeqOnce(got, 90);
            }
        }
    }

    @Test
    void withoutPersistenceWhatTheBrokerHeldForAnAbsentSubscriberIsLostAndShowsAsAGap() throws Exception {
        Received got = new Received();
        try (Mosquitto broker = new Mosquitto(dir.resolve("broker"), "", false)) {
            broker.start();
            try (StationHarness station = new StationHarness(broker.url(), dir.resolve("state"), StationCommands.NONE)) {
                try (QualityClient q = QualityClient.connect(broker.url(), "qs-away", got::add)) {
                    q.subscribe(JOINTS);
                    Received.await("station connected", WAIT, () -> station.publisher.figures().connected());
                    joints(station, 1, 30);
                    Received.await("30 joints", WAIT, () -> got.uniqueJoints().size() >= 30);
                }
                joints(station, 31, 60);
                Received.await("the broker took 31 to 60", WAIT, () -> station.outbox.backlog() == 0);
                broker.stop();
                broker.start();
                try (QualityClient back = QualityClient.connect(broker.url(), "qs-away", got::add)) {
                    back.subscribe(JOINTS); // the broker has no session any more: subscribe again
                    back.subscribe(PROBE);
                    awaitSubscribedAgain(back, got);
                    Received.await("station connected again", WAIT, () -> station.publisher.figures().connected());
                    joints(station, 61, 90);
                    Received.await("61 to 90", WAIT, () -> got.uniqueJoints().size() >= 60);
                    Received.await("backlog drained", WAIT, () -> station.outbox.backlog() == 0);
                    Thread.sleep(1000); // nothing more is on its way
                    TreeSet<Long> seqs = new TreeSet<>(got.uniqueJoints().values());
                    assertThat(seqs).containsExactlyElementsOf(
                            LongStream.concat(LongStream.rangeClosed(1, 30), LongStream.rangeClosed(61, 90)).boxed().toList());
                    assertThat(station.outbox.backlog()).as("the station did its part: the broker took all").isZero();
                }
            }
        }
    }

    private static LoopbackProxy startAnd(Mosquitto broker) throws IOException, InterruptedException {
        broker.start();
        return new LoopbackProxy(broker.port());
    }

    private static void joints(StationHarness station, int from, int to) throws Exception {
        for (int i = from; i <= to; i++) {
            station.joint(i);
        }
    }

    /** Publishes probes until one comes back: the client is connected and its subscriptions stand. */
    private static void awaitSubscribedAgain(QualityClient q, Received got) throws InterruptedException {
        long end = System.nanoTime() + WAIT.toNanos();
        int n = 0;
        while (got.on(PROBE).isEmpty()) {
            if (System.nanoTime() - end > 0) {
                throw new AssertionError("the quality client did not subscribe again");
            }
            try {
                q.publish(PROBE, ("probe " + n++).getBytes(StandardCharsets.UTF_8), null, null, null);
            } catch (IOException e) {
                // not connected yet
            }
            Thread.sleep(200);
        }
    }

    private static void assertEverySeqOnce(Received got, int n) {
        List<Long> seqs = List.copyOf(got.uniqueJoints().values());
        assertThat(seqs).as("each seq exactly once after de-duplication by id")
                .containsExactlyInAnyOrderElementsOf(LongStream.rangeClosed(1, n).boxed().toList());
        for (Received.Message m : got.on("/joint")) {
            MessageSchemas.assertValid(m.payload());
        }
    }
}
