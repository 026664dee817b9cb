package hammerstep.app;

import ch.qos.logback.classic.Logger;
import ch.qos.logback.classic.spi.ILoggingEvent;
import ch.qos.logback.core.read.ListAppender;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code run} on mock hardware with the station file's storage and broker sections: the journal
 * lives in the storage folder, an unreachable broker does not stop the station, and the run ends
 * cleanly. The broker side proper is in the simulator's RunCommandBrokerIT (embedded broker).
 */
class RunDeliveryTest {

    private static final String SECRET = "run-secret-Pw-8812";

    @TempDir
    Path dir;

    private final ListAppender<ILoggingEvent> logged = new ListAppender<>();
    private Logger root;

    @BeforeEach
    void capture() {
        root = (Logger) LoggerFactory.getLogger(org.slf4j.Logger.ROOT_LOGGER_NAME);
        logged.start();
        root.addAppender(logged);
    }

    @AfterEach
    void release() {
        root.detachAppender(logged);
    }

    /**
     * The example station file, moved into {@code dir}: its pattern found where it is, the journal
     * in {@code dir/outbox}, and {@code broker} (YAML lines, or "") appended.
     */
    static Path station(Path dir, String broker) throws IOException {
        Path example = Path.of("../config/station.example.yaml").toAbsolutePath().normalize();
        String text = Files.readString(example)
                .replace("patterns/hub-5.yaml", example.getParent().resolve("patterns/hub-5.yaml").toString())
                .replace("dir: /var/lib/hammerstep/outbox", "dir: outbox");
        assertThat(text).contains("dir: outbox");
        Path file = dir.resolve("station.yaml");
        Files.writeString(file, text + "\n" + broker);
        return file;
    }

    private String logText() {
        StringBuilder b = new StringBuilder();
        for (ILoggingEvent e : logged.list) {
            b.append(e.getFormattedMessage()).append('\n');
        }
        return b.toString();
    }

    @Test
    void keepsTheJournalInTheStorageFolderAndSaysThatNothingIsDeliveredWithoutABroker() throws Exception {
        Path file = station(dir, "");

        Captured run = Captured.run("run", "--config", file.toString(), "--hardware", "mock", "--exit-after", "0.5");

        assertThat(run.exit()).as(run.err()).isZero();
        try (Stream<Path> s = Files.list(dir.resolve("outbox"))) {
            assertThat(s.toList()).as("journal files").isNotEmpty();
        }
        assertThat(logText()).contains("results are stored and not delivered");
    }

    @Test
    void anUnreachableBrokerLeavesTheStationRunningAndThePasswordOutOfTheLog() throws Exception {
        int closedPort;
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            closedPort = s.getLocalPort();
        }
        Path pass = dir.resolve("mqtt.pass");
        Files.writeString(pass, SECRET + "\n");
        Files.setPosixFilePermissions(pass, PosixFilePermissions.fromString("rw-------"));
        Path file = station(dir, "broker:\n  url: tcp://127.0.0.1:" + closedPort + "\n  username: hub-torque-1\n"
                + "  password_file: mqtt.pass\n  reconnect: { min_ms: 50, max_ms: 200 }\n");

        Captured run = Captured.run("run", "--config", file.toString(), "--hardware", "mock", "--exit-after", "1");

        assertThat(run.exit()).as(run.err()).isZero();
        String log = logText();
        assertThat(log).contains("delivering results to tcp://127.0.0.1:" + closedPort + " as plant-07-axle-2-hub-torque-1")
                .contains("cannot reach broker").contains("broker not connected");
        assertThat(log + run.out() + run.err()).doesNotContain(SECRET);
        assertThat(threadsNamed(List.of("results-delivery", "MQTT", "program-reload"))).isEmpty();
    }

    @Test
    void aStoreFullAtStartIsLoggedAndItsAlarmStoredToGoOutWhenTheBrokerIsReached() throws Exception {
        // more free room asked for (1 TB) than the test machine has: the store is FULL from the start
        org.junit.jupiter.api.Assumptions.assumeTrue(Files.getFileStore(dir).getUsableSpace() < (1L << 40),
                "this machine has a terabyte free");
        Path file = station(dir, "");
        Files.writeString(file, Files.readString(file).replace("dir: outbox",
                "dir: outbox\n  low_free_mb: 1000000\n  min_free_mb: 1000000"));

        Captured run = Captured.run("run", "--config", file.toString(), "--hardware", "mock", "--exit-after", "0.5");

        assertThat(run.exit()).as(run.err()).isZero();
        assertThat(logText()).contains("STORAGE_FULL at start").contains("no new part starts");
        try (hammerstep.results.journal.FileOutbox box = hammerstep.results.journal.FileOutbox.open(
                new hammerstep.results.StorageSettings(dir.resolve("outbox"), 1 << 20, 1 << 20, 1L << 30, 0, 0))) {
            List<String> pending = box.pending(0, 100).stream()
                    .map(e -> new String(e.payload(), java.nio.charset.StandardCharsets.UTF_8)).toList();
            assertThat(pending).anySatisfy(p -> assertThat(p).contains("\"code\":\"STORAGE_FULL\"")
                    .contains("\"severity\":\"ALARM\"").contains("full at start"));
        }
    }

    @Test
    void aStorageFolderThatIsAFileIsRefusedAtStartWithItsLineAndExitTwo() throws Exception {
        // as check refuses it (StartRefusalTest has every such fault)
        Files.writeString(dir.resolve("outbox"), "a file where the folder should be");
        Path file = station(dir, "");

        Captured run = Captured.run("run", "--config", file.toString(), "--hardware", "mock", "--exit-after", "0.5");

        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err().strip()).doesNotContain("\n").startsWith(file + ":")
                .contains("'storage.dir' cannot hold the result journal: " + dir.resolve("outbox") + " is a file");
    }

    private static List<String> threadsNamed(List<String> prefixes) {
        return Thread.getAllStackTraces().keySet().stream().filter(Thread::isAlive).map(Thread::getName)
                .filter(n -> prefixes.stream().anyMatch(n::startsWith)).toList();
    }
}
