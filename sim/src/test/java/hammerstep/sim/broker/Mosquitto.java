package hammerstep.sim.broker;

import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;

/** A Mosquitto broker run by a test: loopback only, persistence in a folder of the test's. */
final class Mosquitto implements AutoCloseable {

    private final Path conf;
    private final int port;
    private Process process;

    /** The mosquitto binary, or null when it is not installed. */
    static Path binary() {
        for (String dir : (System.getenv().getOrDefault("PATH", "") + ":/usr/sbin:/usr/local/sbin").split(":")) {
            Path p = Path.of(dir.isEmpty() ? "." : dir, "mosquitto");
            if (Files.isExecutable(p)) {
                return p;
            }
        }
        return null;
    }

    /**
     * @param extra further configuration lines (e.g. a password file)
     */
    Mosquitto(Path dir, String extra) throws IOException {
        this(dir, extra, true);
    }

    /**
     * @param extra       further configuration lines (e.g. a password file)
     * @param persistence whether the broker keeps sessions and queued messages across a restart
     */
    Mosquitto(Path dir, String extra, boolean persistence) throws IOException {
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            port = s.getLocalPort();
        }
        Path data = Files.createDirectories(dir.resolve("data"));
        conf = dir.resolve("mosquitto.conf");
        String user = "root".equals(System.getProperty("user.name")) ? "user root\n" : "";
        Files.writeString(conf, "listener " + port + " 127.0.0.1\n" + "persistence " + persistence + "\n"
                + "persistence_location " + data + "/\n" + "autosave_interval 1\n" + user
                + "log_dest stdout\n" + (extra.contains("allow_anonymous") ? "" : "allow_anonymous true\n") + extra);
    }

    int port() {
        return port;
    }

    String url() {
        return "tcp://127.0.0.1:" + port;
    }

    /** The listener's url with a TLS listener (the extra lines set cafile, certfile, keyfile). */
    String sslUrl() {
        return "ssl://127.0.0.1:" + port;
    }

    /** What the broker logged so far. */
    String log() throws IOException {
        Path log = conf.resolveSibling("mosquitto.log");
        return Files.exists(log) ? Files.readString(log) : "";
    }

    void start() throws IOException, InterruptedException {
        process = new ProcessBuilder(binary().toString(), "-c", conf.toString())
                .redirectErrorStream(true).redirectOutput(conf.resolveSibling("mosquitto.log").toFile()).start();
        long end = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (System.nanoTime() - end < 0) {
            try (Socket s = new Socket(InetAddress.getLoopbackAddress(), port)) {
                return;
            } catch (IOException e) {
                if (!process.isAlive()) {
                    throw new IOException("mosquitto exited: " + Files.readString(conf.resolveSibling("mosquitto.log")));
                }
                Thread.sleep(50);
            }
        }
        throw new IOException("mosquitto did not listen on " + port);
    }

    /** Stops the broker with SIGTERM (it saves its sessions and queued messages) and waits for it. */
    void stop() throws InterruptedException {
        if (process != null && process.isAlive()) {
            process.destroy();
            if (!process.waitFor(10, TimeUnit.SECONDS)) {
                process.destroyForcibly().waitFor(5, TimeUnit.SECONDS);
            }
        }
    }

    @Override
    public void close() throws InterruptedException {
        stop();
    }
}
