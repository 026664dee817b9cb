package hammerstep.sim.broker;

import ch.qos.logback.classic.Logger;
import ch.qos.logback.classic.spi.ILoggingEvent;
import ch.qos.logback.core.read.ListAppender;
import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.MessageSchemas;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.StationId;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.station.SystemStationClock;
import org.agrona.concurrent.AgentRunner;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * The plant setup of docs/security.md against Mosquitto: a TLS listener that wants a client
 * certificate, user names with passwords, and the ACL copied from the document itself. Certificates
 * (a test CA, the broker's with 127.0.0.1 in its subject alternative names, one per client) are
 * made by openssl at test time. Skipped when mosquitto, mosquitto_passwd or openssl is missing.
 */
class MosquittoTlsIT {

    private static final Duration WAIT = Duration.ofSeconds(30);
    /** The site and line of the documented ACL; the station's user name is its station name (%u). */
    private static final StationId STATION = new StationId("harrow-bend", "skid-1", "flange-2");
    private static final String PREFIX = "hammerstep/v1/harrow-bend/skid-1/flange-2/";
    private static final String STATION_PW = "Fl2-station-Pw-5521";
    private static final String QS_PW = "qs-Pw-7730";
    private static final String VIEWER_PW = "viewer-Pw-0815";
    private static final String OTHER_STATION_PW = "Fl3-station-Pw-3141";
    private static final String QS2_PW = "qs2-Pw-2718";
    /** Where the quality system {@code qs} asks flange-2 to reply (docs/security.md). */
    private static final String QS_REPLIES = "qs/replies/qs/flange-2";
    private static final String WRONG_PW = "not-the-Pw-9999";

    @TempDir
    Path dir;

    private Path pki;
    private Mosquitto broker;
    private final ListAppender<ILoggingEvent> logged = new ListAppender<>();
    private Logger root;

    @BeforeEach
    void brokerWithTlsPasswordsAndTheDocumentedAcl() throws Exception {
        assumeTrue(Mosquitto.binary() != null, "mosquitto is not installed");
        assumeTrue(Files.isExecutable(Path.of("/usr/bin/openssl")), "openssl is not installed");
        pki = Files.createDirectories(dir.resolve("pki"));
        sh("openssl", "req", "-x509", "-newkey", "ec", "-pkeyopt", "ec_paramgen_curve:prime256v1", "-nodes",
                "-keyout", "ca.key", "-out", "ca.pem", "-days", "2", "-subj", "/CN=hammerstep test plant CA");
        Files.writeString(pki.resolve("broker.ext"), "subjectAltName=IP:127.0.0.1,DNS:localhost\n");
        issue("broker", "localhost", "broker.ext");
        for (String client : List.of("flange-2", "flange-3", "qs", "qs-2", "viewer")) {
            issue(client, client, null);
        }
        Path brokerDir = Files.createDirectories(dir.resolve("broker"));
        Path passwd = brokerDir.resolve("passwd");
        assumeTrue(run("mosquitto_passwd", "-b", "-c", passwd.toString(), "flange-2", STATION_PW) == 0,
                "mosquitto_passwd is not available");
        sh("mosquitto_passwd", "-b", passwd.toString(), "qs", QS_PW);
        sh("mosquitto_passwd", "-b", passwd.toString(), "qs-2", QS2_PW);
        sh("mosquitto_passwd", "-b", passwd.toString(), "viewer", VIEWER_PW);
        sh("mosquitto_passwd", "-b", passwd.toString(), "flange-3", OTHER_STATION_PW);
        Path acl = brokerDir.resolve("hammerstep.acl");
        Files.writeString(acl, documentedAcl());
        broker = new Mosquitto(brokerDir, "cafile " + pki.resolve("ca.pem") + "\ncertfile " + pki.resolve("broker.pem")
                + "\nkeyfile " + pki.resolve("broker.key") + "\nrequire_certificate true\ntls_version tlsv1.2\n"
                + documentedListenerBinding() + "allow_anonymous false\npassword_file " + passwd + "\nacl_file " + acl
                + "\n");
        broker.start();
        root = (Logger) LoggerFactory.getLogger(org.slf4j.Logger.ROOT_LOGGER_NAME);
        logged.start();
        root.addAppender(logged);
    }

    @AfterEach
    void stop() throws Exception {
        if (root != null) {
            root.detachAppender(logged);
        }
        if (broker != null) {
            broker.close();
        }
    }

    /**
     * The ACL block of docs/security.md, as a plant would copy it. {@code -Dhammerstep.security.doc=FILE}
     * reads another version of the page instead, to show that these tests fail with a weaker ACL.
     */
    static String documentedAcl() throws IOException {
        String doc = Files.readString(securityDoc());
        int at = doc.indexOf("# /etc/mosquitto/hammerstep.acl");
        assertThat(at).as("docs/security.md shows the ACL file").isPositive();
        int end = doc.indexOf("```", at);
        return doc.substring(doc.indexOf('\n', at) + 1, end);
    }

    /** The line of docs/security.md's listener that binds client ids to accounts. */
    static String documentedListenerBinding() throws IOException {
        String doc = Files.readString(securityDoc());
        int at = doc.indexOf("# /etc/mosquitto/conf.d/hammerstep.conf");
        String conf = doc.substring(at, doc.indexOf("```", at));
        String line = "use_username_as_clientid true";
        return conf.contains(line) ? line + "\n" : "";
    }

    private static Path securityDoc() {
        return Path.of(System.getProperty("hammerstep.security.doc", "../docs/security.md"));
    }

    private void issue(String name, String cn, String ext) throws Exception {
        sh("openssl", "req", "-newkey", "ec", "-pkeyopt", "ec_paramgen_curve:prime256v1", "-nodes",
                "-keyout", name + ".key", "-out", name + ".csr", "-subj", "/CN=" + cn);
        if (ext == null) {
            sh("openssl", "x509", "-req", "-in", name + ".csr", "-CA", "ca.pem", "-CAkey", "ca.key",
                    "-CAcreateserial", "-out", name + ".pem", "-days", "2");
        } else {
            sh("openssl", "x509", "-req", "-in", name + ".csr", "-CA", "ca.pem", "-CAkey", "ca.key",
                    "-CAcreateserial", "-out", name + ".pem", "-days", "2", "-extfile", ext);
        }
        Files.setPosixFilePermissions(pki.resolve(name + ".key"), PosixFilePermissions.fromString("rw-------"));
    }

    private int run(String... cmd) throws Exception {
        Process p = new ProcessBuilder(cmd).directory(pki.toFile()).redirectErrorStream(true)
                .redirectOutput(pki.resolve("commands.log").toFile()).start();
        return p.waitFor();
    }

    private void sh(String... cmd) throws Exception {
        if (run(cmd) != 0) {
            throw new IOException(String.join(" ", cmd) + " failed: " + Files.readString(pki.resolve("commands.log")));
        }
    }

    private Path secret(String name, String text) throws IOException {
        Path p = dir.resolve(name + ".pass");
        Files.writeString(p, text + "\n");
        Files.setPosixFilePermissions(p, PosixFilePermissions.fromString("rw-------"));
        return p;
    }

    /** TLS settings for {@code user} with its own client certificate; {@code ca} is the trusted CA file. */
    private BrokerSettings account(String clientId, String user, String password, Path ca) throws IOException {
        return new BrokerSettings(broker.sslUrl(), clientId, user, secret(user + "-as-" + clientId, password), ca,
                pki.resolve(user + ".pem"), pki.resolve(user + ".key"), 10, 5, 100, 500, 600, 300, 60, 32);
    }

    /** A station delivering to the broker: file outbox, sink, publisher on its own thread. */
    private final class Station implements AutoCloseable {
        final FileOutbox outbox;
        final OutboxResultSink sink;
        final ResultPublisher publisher;
        final AgentRunner runner;

        Station(BrokerSettings s, StationCommands commands) throws Exception {
            outbox = FileOutbox.open(new StorageSettings(dir.resolve("state-" + System.nanoTime()), 1 << 20, 1 << 20,
                    1L << 30, 0, 0));
            sink = new OutboxResultSink(outbox, STATION);
            publisher = new ResultPublisher(outbox, STATION, () -> new PahoLink(s), commands, s,
                    new SystemStationClock(), 1, "test");
            runner = ResultPublisher.start(publisher);
        }

        @Override
        public void close() {
            runner.close();
            outbox.close();
        }
    }

    private String logText() {
        StringBuilder b = new StringBuilder();
        for (ILoggingEvent e : logged.list) {
            b.append(e.getFormattedMessage()).append('\n');
            if (e.getThrowableProxy() != null) {
                b.append(e.getThrowableProxy().getMessage()).append('\n');
            }
        }
        return b.toString();
    }

    @Test
    void resultsArriveOverTlsWithUserPasswordAndClientCertificate() throws Exception {
        Received got = new Received();
        try (QualityClient qs = QualityClient.connect(account("qs-tls", "qs", QS_PW, pki.resolve("ca.pem")), got::add);
             Station station = new Station(account("flange-2", "flange-2", STATION_PW, pki.resolve("ca.pem")),
                     StationCommands.NONE)) {
            for (String kind : List.of("joint", "status")) {
                qs.subscribe("hammerstep/v1/+/+/+/" + kind);
            }
            for (int i = 1; i <= 5; i++) {
                station.sink.joint(TestResults.joint(i));
            }
            Received.await("five joints over TLS", WAIT, () -> got.uniqueJoints().size() >= 5);
            Received.await("backlog drained", WAIT, () -> station.outbox.backlog() == 0);
            assertThat(got.uniqueJoints().values()).containsExactly(1L, 2L, 3L, 4L, 5L);
            assertThat(got.on(PREFIX + "status")).isNotEmpty();
            for (Received.Message m : got.all) {
                MessageSchemas.assertValid(m.payload());
            }
        }
    }

    @Test
    void aWrongPasswordOrAnUntrustedBrokerIsRefusedAndNoPasswordReachesTheLog() throws Exception {
        try (Station wrong = new Station(account("flange-2", "flange-2", WRONG_PW, pki.resolve("ca.pem")),
                StationCommands.NONE)) {
            wrong.sink.joint(TestResults.joint(1));
            Received.await("a refused connect logged", WAIT, () -> logText().contains("cannot reach broker"));
            assertThat(wrong.publisher.figures().connected()).isFalse();
            assertThat(wrong.outbox.backlog()).as("the result is kept").isEqualTo(1);
        }
        // a CA that did not sign the broker's certificate: the station does not talk to that broker
        Files.createDirectories(dir.resolve("other"));
        Process p = new ProcessBuilder("openssl", "req", "-x509", "-newkey", "ec", "-pkeyopt",
                "ec_paramgen_curve:prime256v1", "-nodes", "-keyout", "other.key", "-out", "other-ca.pem", "-days", "2",
                "-subj", "/CN=some other CA").directory(dir.resolve("other").toFile()).redirectErrorStream(true).start();
        p.getInputStream().readAllBytes();
        assertThat(p.waitFor()).isZero();
        logged.list.clear();
        try (Station untrusting = new Station(account("flange-2", "flange-2", STATION_PW,
                dir.resolve("other/other-ca.pem")), StationCommands.NONE)) {
            untrusting.sink.joint(TestResults.joint(1));
            Received.await("a refused TLS handshake logged", WAIT, () -> logText().contains("cannot reach broker"));
            assertThat(untrusting.publisher.figures().connected()).isFalse();
        }
        String everything = logText() + broker.log();
        assertThat(everything).doesNotContain(WRONG_PW).doesNotContain(STATION_PW);
    }

    @Test
    void theStationAndTheQualitySystemWorkAndNoOtherAccountSpeaksInTheStationsName() throws Exception {
        hammerstep.mqtt.RecordingStation commands = new hammerstep.mqtt.RecordingStation();
        Received got = new Received();
        Path ca = pki.resolve("ca.pem");
        try (QualityClient qs = QualityClient.connect(account("qs-acl", "qs", QS_PW, ca), got::add);
             Station station = new Station(account("flange-2", "flange-2", STATION_PW, ca), commands);
             QualityClient viewer = QualityClient.connect(account("dash-1", "viewer", VIEWER_PW, ca),
                     (t, pl, r, c) -> { });
             QualityClient otherStation = QualityClient.connect(account("flange-3", "flange-3", OTHER_STATION_PW, ca),
                     (t, pl, r, c) -> { })) {
            for (String kind : List.of("joint", "part", "event", "status")) {
                qs.subscribe("hammerstep/v1/+/+/+/" + kind);
            }
            qs.subscribe("qs/replies/qs/#");
            Received.await("station connected", WAIT, () -> station.publisher.figures().connected());

            for (QualityClient forger : List.of(viewer, otherStation)) {
                publishQuietly(forger, PREFIX + "cmd/part", "{\"serial\":\"EVIL-1\",\"model\":\"PS-40D\"}",
                        "qs/replies/viewer/flange-2");
                for (String kind : List.of("joint", "part", "event", "status")) {
                    publishQuietly(forger, PREFIX + kind, "{\"schema\":\"hammerstep." + kind
                            + ".v1\",\"id\":\"forged\",\"state\":\"offline\"}", null);
                }
                publishQuietly(forger, QS_REPLIES, "{\"ok\":true,\"code\":\"OK\",\"message\":\"forged\"}", null);
            }
            publishQuietly(otherStation, "hammerstep/v1/harrow-bend/skid-1/flange-3/joint",
                    "{\"schema\":\"hammerstep.joint.v1\",\"id\":\"own-name\"}", null);
            qs.publish(PREFIX + "cmd/part", "{\"serial\":\"PS40D-1\",\"model\":\"PS-40D\"}".getBytes(StandardCharsets.UTF_8),
                    30L, QS_REPLIES, "c".getBytes(StandardCharsets.UTF_8));
            station.sink.joint(TestResults.joint(1));

            Received.await("the quality system's command answered", WAIT, () -> !got.on(QS_REPLIES).isEmpty());
            Received.await("the station's joint", WAIT, () -> !got.on(PREFIX + "joint").isEmpty());
            Received.await("flange-3's joint under its own name (the broker passed everything before it)", WAIT,
                    () -> !got.on("flange-3/joint").isEmpty());
            Thread.sleep(300); // stragglers, if the broker let any forgery through
            assertThat(got.on(QS_REPLIES)).hasSize(1);
            assertThat(got.on(QS_REPLIES).get(0).json().get("ok").asBoolean()).isTrue();
            assertThat(new String(got.on(QS_REPLIES).get(0).correlation(), StandardCharsets.UTF_8)).isEqualTo("c");
            assertThat(commands.started).containsExactly("PS40D-1/PS-40D");
            assertThat(got.on(PREFIX + "joint")).hasSize(1);
            assertThat(got.all).noneSatisfy(m -> assertThat(new String(m.payload(), StandardCharsets.UTF_8))
                    .containsAnyOf("forged", "EVIL"));
        }
    }

    @Test
    void anotherAccountConnectingWithTheStationsClientIdDoesNotKnockTheStationOff() throws Exception {
        Received got = new Received();
        Path ca = pki.resolve("ca.pem");
        try (QualityClient qs = QualityClient.connect(account("qs-watch", "qs", QS_PW, ca), got::add);
             Station station = new Station(account("flange-2", "flange-2", STATION_PW, ca), StationCommands.NONE)) {
            qs.subscribe(PREFIX + "status");
            Received.await("the station online", WAIT, () -> got.on(PREFIX + "status").stream()
                    .anyMatch(m -> m.json().get("state").asText().equals("online")));
            for (int i = 0; i < 5; i++) {
                try (QualityClient thief = QualityClient.connect(account("flange-2", "viewer", VIEWER_PW, ca),
                        (t, pl, r, c) -> { })) {
                    thief.subscribe(PREFIX + "status");
                    Thread.sleep(400);
                }
            }
            station.sink.joint(TestResults.joint(1));
            Received.await("backlog drained", WAIT, () -> station.outbox.backlog() == 0);
            assertThat(station.publisher.figures().connects()).as("station connections").isEqualTo(1);
            assertThat(got.on(PREFIX + "status")).noneSatisfy(m -> assertThat(m.json().get("state").asText())
                    .isEqualTo("offline"));
        }
    }

    @Test
    void aQualitySystemReadsNoRepliesMeantForAnother() throws Exception {
        Received mine = new Received();
        Received theirs = new Received();
        Path ca = pki.resolve("ca.pem");
        try (QualityClient qs = QualityClient.connect(account("qs-a", "qs", QS_PW, ca), mine::add);
             QualityClient qs2 = QualityClient.connect(account("qs-b", "qs-2", QS2_PW, ca), theirs::add);
             Station station = new Station(account("flange-2", "flange-2", STATION_PW, ca), StationCommands.NONE)) {
            qs.subscribe("qs/replies/qs/#");
            for (String filter : List.of("#", "qs/replies/#", QS_REPLIES)) {
                try {
                    qs2.subscribe(filter);
                } catch (IOException refused) {
                    // a refused subscription is as good as an empty one
                }
            }
            Received.await("station connected", WAIT, () -> station.publisher.figures().connected());
            qs.publish(PREFIX + "cmd/status", new byte[0], null, QS_REPLIES, "mine".getBytes(StandardCharsets.UTF_8));
            Received.await("the reply for qs", WAIT, () -> !mine.on(QS_REPLIES).isEmpty());
            qs2.publish(PREFIX + "cmd/status", new byte[0], null, "qs/replies/qs-2/flange-2",
                    "theirs".getBytes(StandardCharsets.UTF_8));
            Received.await("qs-2's own reply (after the one for qs)", WAIT,
                    () -> !theirs.on("qs/replies/qs-2/flange-2").isEmpty());
            assertThat(theirs.all).noneSatisfy(m -> assertThat(m.topic()).startsWith("qs/replies/qs/"));
            assertThat(mine.on(QS_REPLIES).get(0).json().get("code").asText()).isEqualTo("OK");
        }
    }

    @Test
    void theServiceReadsTlsCredentialsAndClientCertificateFromTheStationFile() throws Exception {
        Path example = Path.of("../config/station.example.yaml").toAbsolutePath().normalize();
        String text = Files.readString(example)
                .replace("identity: { site: plant-07, line: axle-2, station: hub-torque-1 }",
                        "identity: { site: harrow-bend, line: skid-1, station: flange-2 }")
                .replace("patterns/hub-5.yaml", example.getParent().resolve("patterns/hub-5.yaml").toString())
                .replace("dir: /var/lib/hammerstep/outbox", "dir: " + dir.resolve("outbox"))
                .replace("    part_present: { pin: 3, debounce_ms: 50 }\n", "");
        assertThat(text).contains("station: flange-2").doesNotContain("part_present");
        Path station = dir.resolve("station.yaml");
        Files.writeString(station, text + "\nbroker:\n  url: " + broker.sslUrl() + "\n  client_id: flange-2\n"
                + "  username: flange-2\n  password_file: " + secret("service", STATION_PW) + "\n"
                + "  ca_file: " + pki.resolve("ca.pem") + "\n  cert_file: " + pki.resolve("flange-2.pem") + "\n"
                + "  key_file: " + pki.resolve("flange-2.key") + "\n  reconnect: { min_ms: 100, max_ms: 500 }\n");
        Received got = new Received();
        int[] exit = {-1};
        try (QualityClient qs = QualityClient.connect(account("qs-run", "qs", QS_PW, pki.resolve("ca.pem")), got::add)) {
            qs.subscribe("qs/replies/qs/#");
            qs.subscribe(PREFIX + "status");
            Thread service = new Thread(() -> {
                java.io.InputStream saved = System.in;
                System.setIn(new java.io.ByteArrayInputStream(new byte[0]));
                try {
                    exit[0] = hammerstep.app.Main.run("run", "--config", station.toString(), "--hardware", "mock",
                            "--exit-after", "5");
                } finally {
                    System.setIn(saved);
                }
            }, "run-under-test");
            service.start();
            Received.await("the service online over TLS", WAIT, () -> got.on(PREFIX + "status").stream()
                    .anyMatch(m -> m.json().get("state").asText().equals("online")));
            qs.publish(PREFIX + "cmd/part", "{\"serial\":\"HX-7001\",\"model\":\"HX-220\"}"
                    .getBytes(StandardCharsets.UTF_8), 30L, QS_REPLIES, "r".getBytes(StandardCharsets.UTF_8));
            Received.await("the service's answer", WAIT, () -> !got.on(QS_REPLIES).isEmpty());
            assertThat(got.on(QS_REPLIES).get(0).json().get("message").asText())
                    .isEqualTo("part HX-7001 started: pattern hub-5");
            service.join(WAIT.toMillis());
            assertThat(exit[0]).isZero();
            assertThat(logText() + broker.log()).doesNotContain(STATION_PW);
        }
    }

    /** Publishes at QoS 1; a refusal by the broker (not authorized) may surface as an error here or not at all. */
    private static void publishQuietly(QualityClient c, String topic, String payload, String responseTopic) {
        try {
            c.publish(topic, payload.getBytes(StandardCharsets.UTF_8), 30L, responseTopic,
                    "x".getBytes(StandardCharsets.UTF_8));
        } catch (IOException e) {
            // refused: what the test wants
        }
    }
}
