package hammerstep.sim.broker;

import ch.qos.logback.classic.Level;
import com.hivemq.embedded.EmbeddedHiveMQ;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Comparator;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.stream.Stream;

/**
 * An MQTT 5 broker inside the simulator (HiveMQ Community Edition, embedded), so the demo needs
 * nothing installed. It listens on 127.0.0.1 only, keeps everything in memory, sends no usage
 * statistics, takes 64 unacknowledged publishes per client (its default is 10) and does not take over logging (its own logback set-up is skipped and its bundled
 * logback.xml is left out of the simulator's jar). Its working folders live in a temporary folder
 * removed on {@link #close()}.
 */
public final class EmbeddedBroker implements AutoCloseable {

    private final EmbeddedHiveMQ hivemq;
    private final Path home;
    private final int port;
    private boolean running;

    private EmbeddedBroker(EmbeddedHiveMQ hivemq, Path home, int port) {
        this.hivemq = hivemq;
        this.home = home;
        this.port = port;
    }

    /** Starts a broker on {@code port} of 127.0.0.1 (0: a free port), waiting up to 30 s. */
    public static EmbeddedBroker start(int port) throws IOException {
        int p = port == 0 ? freePort() : port;
        ((ch.qos.logback.classic.Logger) LoggerFactory.getLogger("com.hivemq")).setLevel(Level.WARN);
        ((ch.qos.logback.classic.Logger) LoggerFactory.getLogger("io.netty")).setLevel(Level.WARN);
        Path home = Files.createTempDirectory("hammerstep-broker-");
        Path conf = Files.createDirectories(home.resolve("conf"));
        Files.writeString(conf.resolve("config.xml"), """
                <?xml version="1.0"?>
                <hivemq>
                    <listeners>
                        <tcp-listener>
                            <port>%d</port>
                            <bind-address>127.0.0.1</bind-address>
                        </tcp-listener>
                    </listeners>
                    <persistence>
                        <mode>in-memory</mode>
                    </persistence>
                    <mqtt>
                        <receive-maximum>
                            <server-receive-maximum>64</server-receive-maximum>
                        </receive-maximum>
                    </mqtt>
                    <anonymous-usage-statistics>
                        <enabled>false</enabled>
                    </anonymous-usage-statistics>
                </hivemq>
                """.formatted(p));
        EmbeddedHiveMQ hivemq = EmbeddedHiveMQ.builder()
                .withConfigurationFolder(conf)
                .withDataFolder(Files.createDirectories(home.resolve("data")))
                .withExtensionsFolder(Files.createDirectories(home.resolve("extensions")))
                .withoutLoggingBootstrap()
                .build();
        EmbeddedBroker broker = new EmbeddedBroker(hivemq, home, p);
        broker.resume();
        return broker;
    }

    /** {@code tcp://127.0.0.1:PORT}. */
    public String url() {
        return "tcp://127.0.0.1:" + port;
    }

    public int port() {
        return port;
    }

    /** Stops the broker, keeping the object for {@link #resume()} (sessions are lost: in memory). */
    public void stop() {
        if (running) {
            await("stop", hivemq.stop());
            running = false;
        }
    }

    /** Starts it again after {@link #stop()}. */
    public void resume() {
        if (!running) {
            await("start", hivemq.start());
            running = true;
        }
    }

    private static void await(String what, java.util.concurrent.CompletableFuture<Void> f) {
        try {
            f.get(30, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted during broker " + what, e);
        } catch (ExecutionException | TimeoutException e) {
            throw new IllegalStateException("embedded broker could not " + what + ": " + e.getMessage(), e);
        }
    }

    @Override
    public void close() {
        try {
            stop();
            hivemq.close();
        } catch (Exception e) {
            // shutting down
        } finally {
            deleteTree(home);
        }
    }

    /**
     * Stops the broker on a thread of its own and returns at once: the demo's summary is printed and
     * its process may end without waiting the seconds a broker takes to stop. The working folder is
     * removed when the stop is done, or as the JVM exits, whichever comes first.
     */
    public void closeInBackground() {
        Thread cleanup = new Thread(() -> deleteTree(home), "embedded-broker-cleanup");
        try {
            Runtime.getRuntime().addShutdownHook(cleanup);
        } catch (IllegalStateException e) {
            // the JVM is already exiting
        }
        Thread stopper = new Thread(() -> {
            close();
            try {
                Runtime.getRuntime().removeShutdownHook(cleanup);
            } catch (IllegalStateException e) {
                // the JVM is exiting: the hook removes the folder
            }
        }, "embedded-broker-stop");
        stopper.setDaemon(true);
        stopper.start();
    }

    private static int freePort() throws IOException {
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            return s.getLocalPort();
        }
    }

    private static void deleteTree(Path root) {
        try (Stream<Path> s = Files.walk(root)) {
            s.sorted(Comparator.reverseOrder()).forEach(p -> {
                try {
                    Files.deleteIfExists(p);
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                }
            });
        } catch (IOException | UncheckedIOException e) {
            // a temporary folder left behind is harmless
        }
    }
}
