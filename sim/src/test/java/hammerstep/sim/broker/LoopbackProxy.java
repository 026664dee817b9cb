package hammerstep.sim.broker;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;

/** A TCP relay on 127.0.0.1 in front of a broker, whose connections a test can cut to play a network outage. */
final class LoopbackProxy implements AutoCloseable {

    private final ServerSocket server;
    private final int target;
    private final List<Socket> open = new CopyOnWriteArrayList<>();
    private volatile boolean cut;
    private final Thread acceptor;

    LoopbackProxy(int targetPort) throws IOException {
        this.target = targetPort;
        this.server = new ServerSocket(0, 50, InetAddress.getLoopbackAddress());
        this.acceptor = new Thread(this::acceptLoop, "test-proxy");
        acceptor.setDaemon(true);
        acceptor.start();
    }

    String url() {
        return "tcp://127.0.0.1:" + server.getLocalPort();
    }

    /** Drops every connection and refuses new ones until {@link #restore()}. */
    void cut() {
        cut = true;
        for (Socket s : open) {
            closeQuietly(s);
        }
        open.clear();
    }

    void restore() {
        cut = false;
    }

    private void acceptLoop() {
        while (!server.isClosed()) {
            try {
                Socket client = server.accept();
                if (cut) {
                    closeQuietly(client);
                    continue;
                }
                Socket upstream = new Socket(InetAddress.getLoopbackAddress(), target);
                open.add(client);
                open.add(upstream);
                pipe(client, upstream);
                pipe(upstream, client);
            } catch (IOException e) {
                // closed, or the broker refused: the client sees a dropped connection
            }
        }
    }

    private void pipe(Socket from, Socket to) {
        Thread t = new Thread(() -> {
            byte[] buf = new byte[16 * 1024];
            try (InputStream in = from.getInputStream(); OutputStream out = to.getOutputStream()) {
                int n;
                while ((n = in.read(buf)) >= 0) {
                    out.write(buf, 0, n);
                    out.flush();
                }
            } catch (IOException e) {
                // connection ended
            } finally {
                closeQuietly(from);
                closeQuietly(to);
            }
        }, "test-proxy-pipe");
        t.setDaemon(true);
        t.start();
    }

    private static void closeQuietly(Socket s) {
        try {
            s.close();
        } catch (IOException e) {
            // closing
        }
    }

    @Override
    public void close() throws IOException {
        cut();
        server.close();
    }
}
