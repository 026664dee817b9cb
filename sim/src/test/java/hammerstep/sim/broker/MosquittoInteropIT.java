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

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.util.Map;
import java.util.stream.LongStream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * Interoperability with Mosquitto, the broker plants commonly run (.ci/run installs it). Skipped
 * when it is not installed.
 */
class MosquittoInteropIT {

    private static final Duration WAIT = Duration.ofSeconds(30);

    @TempDir
    Path dir;

    @BeforeEach
    void needsMosquitto() {
        assumeTrue(Mosquitto.binary() != null, "mosquitto is not installed");
    }

    @Test
    void everySeqArrivesExactlyOnceAfterDedupAcrossABrokerRestartMidRun() throws Exception {
        Received got = new Received();
        try (Mosquitto broker = new Mosquitto(dir.resolve("broker"), "")) {
            Files.createDirectories(dir.resolve("broker"));
            broker.start();
            try (QualityClient q = QualityClient.connect(broker.url(), "qs-interop", got::add);
                 StationHarness station = new StationHarness(broker.url(), dir.resolve("state"), StationCommands.NONE)) {
                q.subscribe("hammerstep/v1/+/+/+/joint");
                Received.await("station connected", WAIT, () -> station.publisher.figures().connected());
                for (int i = 1; i <= 30; i++) {
                    station.joint(i);
                }
                broker.stop();
                for (int i = 31; i <= 60; i++) {
                    station.joint(i);
                }
                assertThat(station.outbox.backlog()).isGreaterThanOrEqualTo(30);
                broker.start();
                for (int i = 61; i <= 90; i++) {
                    station.joint(i);
                }
                Received.await("ninety unique joints", WAIT, () -> got.uniqueJoints().size() >= 90);
                Received.await("backlog drained", WAIT, () -> station.outbox.backlog() == 0);
                Map<String, Long> unique = got.uniqueJoints();
                assertThat(unique.values()).containsExactlyInAnyOrderElementsOf(
                        LongStream.rangeClosed(1, 90).boxed().toList());
                for (Received.Message m : got.all) {
                    MessageSchemas.assertValid(m.payload());
                }
            }
        }
    }

    @Test
    void connectsWithUsernameAndPasswordFileAndKeepsResultsWhenRefused() throws Exception {
        Path brokerDir = Files.createDirectories(dir.resolve("broker"));
        Path passwd = brokerDir.resolve("passwd");
        Process p = new ProcessBuilder("mosquitto_passwd", "-b", "-c", passwd.toString(), "hub-fit-1", "s3cret-Pw")
                .redirectErrorStream(true).start();
        assumeTrue(p.waitFor() == 0, "mosquitto_passwd is not available");
        Path good = dir.resolve("good.pass");
        Path bad = dir.resolve("bad.pass");
        Files.writeString(good, "s3cret-Pw\n");
        Files.writeString(bad, "wrong\n");
        Files.setPosixFilePermissions(good, PosixFilePermissions.fromString("rw-------"));
        Files.setPosixFilePermissions(bad, PosixFilePermissions.fromString("rw-------"));
        try (Mosquitto broker = new Mosquitto(brokerDir, "allow_anonymous false\npassword_file " + passwd + "\n")) {
            broker.start();
            assertThat(deliver(broker.url(), bad, dir.resolve("s1"))).as("refused: results kept").isEqualTo(1);
            assertThat(deliver(broker.url(), good, dir.resolve("s2"))).as("accepted: delivered").isZero();
        }
    }

    /** Stores one joint on a station with that password and returns the backlog after a few seconds. */
    private static long deliver(String url, Path passwordFile, Path state) throws Exception {
        BrokerSettings s = new BrokerSettings(url, "hub-fit-1", "hub-fit-1", passwordFile, null, null, null, 10, 5, 100, 500,
                600, 300, 60, 32);
        try (FileOutbox outbox = FileOutbox.open(new StorageSettings(state, 1 << 20, 1 << 20, 1L << 30, 0, 0))) {
            OutboxResultSink sink = new OutboxResultSink(outbox, TestResults.STATION);
            ResultPublisher publisher = new ResultPublisher(outbox, TestResults.STATION, () -> new PahoLink(s),
                    StationCommands.NONE, s, new SystemStationClock(), 1, "test");
            AgentRunner runner = ResultPublisher.start(publisher);
            try {
                sink.joint(TestResults.joint(1));
                long end = System.nanoTime() + Duration.ofSeconds(4).toNanos();
                while (outbox.backlog() > 0 && System.nanoTime() - end < 0) {
                    Thread.sleep(50);
                }
                return outbox.backlog();
            } finally {
                runner.close();
            }
        }
    }
}
