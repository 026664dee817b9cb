package hammerstep.mqtt.paho;

import ch.qos.logback.classic.Level;
import ch.qos.logback.classic.Logger;
import ch.qos.logback.classic.spi.ILoggingEvent;
import ch.qos.logback.core.read.ListAppender;
import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.Link;
import hammerstep.mqtt.PasswordFile;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowable;

/**
 * The broker password: a file only the service may read, never in a log line, an exception message
 * or the settings' text. Loopback only; the port is closed, so the connect fails.
 */
class SecretsTest {

    private static final String SECRET = "Tq!7-hub-fit-secret-4471";

    @TempDir
    Path dir;

    private final ListAppender<ILoggingEvent> logged = new ListAppender<>();
    private Logger root;
    private Level saved;

    @BeforeEach
    void capture() {
        root = (Logger) LoggerFactory.getLogger(org.slf4j.Logger.ROOT_LOGGER_NAME);
        saved = root.getLevel();
        root.setLevel(Level.TRACE);
        logged.start();
        root.addAppender(logged);
    }

    @AfterEach
    void release() {
        root.detachAppender(logged);
        root.setLevel(saved);
    }

    private Path passwordFile(String perms) throws IOException {
        Path p = dir.resolve("mqtt-" + perms + ".pass");
        Files.writeString(p, SECRET + "\n");
        Files.setPosixFilePermissions(p, PosixFilePermissions.fromString(perms));
        return p;
    }

    @Test
    void aPasswordFileReadableOrWritableByEveryUserIsRefused() throws IOException {
        for (String perms : new String[] {"rw-r--r--", "rw----r--", "rw-----w-", "rw-rw-rw-"}) {
            Path p = passwordFile(perms);
            assertThat(PasswordFile.problem(p)).as(perms).contains("every user").contains("chmod 600");
            Throwable t = catchThrowable(() -> PasswordFile.read(p));
            assertThat(t).as(perms).isInstanceOf(IOException.class);
            assertThat(t.getMessage()).doesNotContain(SECRET);
        }
    }

    @Test
    void aPasswordFileForTheServiceAloneIsReadWithoutItsLineBreak() throws IOException {
        for (String perms : new String[] {"rw-------", "r--------", "rw-r-----"}) {
            Path p = passwordFile(perms);
            assertThat(PasswordFile.problem(p)).as(perms).isNull();
            assertThat(new String(PasswordFile.read(p), StandardCharsets.UTF_8)).isEqualTo(SECRET);
        }
    }

    @Test
    void aFailedConnectWithCredentialsLogsAndReportsNoSecret() throws Exception {
        int closedPort;
        try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            closedPort = s.getLocalPort();
        }
        Path pw = passwordFile("rw-------");
        BrokerSettings settings = new BrokerSettings("tcp://127.0.0.1:" + closedPort, "hub-fit-1", "hub-fit-1", pw,
                null, null, null, 10, 2, 100, 500, 60, 300, 60, 8);
        assertThat(settings.toString()).doesNotContain(SECRET);
        PahoLink link = new PahoLink(settings);
        Throwable t;
        try {
            t = catchThrowable(() -> link.connect(new Link.Will("t/status", new byte[0]), new Link.Events() {
                public void connectionLost(String cause) { }

                public void acknowledged(long tag, boolean ok, String detail) { }

                public void message(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] c) { }
            }));
        } finally {
            link.close();
        }
        assertThat(t).isInstanceOf(IOException.class);
        StringBuilder all = new StringBuilder(String.valueOf(t));
        for (Throwable c = t; c != null; c = c.getCause()) {
            all.append(' ').append(c.getMessage());
        }
        for (ILoggingEvent e : logged.list) {
            all.append(' ').append(e.getFormattedMessage());
            if (e.getThrowableProxy() != null) {
                all.append(' ').append(e.getThrowableProxy().getMessage());
            }
        }
        assertThat(all.toString()).doesNotContain(SECRET).doesNotContain(SECRET.substring(0, 12));
    }
}
