package hammerstep.station.loop;

import hammerstep.web.LiveBoard;
import hammerstep.web.WebSettings;
import hammerstep.web.WebView;

import java.io.IOException;
import java.net.InetSocketAddress;
import java.nio.ByteBuffer;
import java.nio.channels.SelectionKey;
import java.nio.channels.Selector;
import java.nio.channels.SocketChannel;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.atomic.AtomicLong;

/**
 * The web view of the station under benchmark, served on a loopback port, with {@code n} live pages
 * open: {@code n} connections to its event stream ({@code /events}), read as fast as they come by
 * one thread (the browsers' side; on a plant they sit on other computers). The view's own threads
 * (its pool and the feed that writes every page's events) run as in the service.
 */
final class LiveClients {

    private final WebView view;
    private final Selector selector;
    private final Thread reader;
    private final AtomicLong bytes = new AtomicLong();
    private volatile boolean running = true;

    private LiveClients(WebView view, Selector selector) {
        this.view = view;
        this.selector = selector;
        this.reader = new Thread(this::read, "live-clients");
        this.reader.setDaemon(true);
    }

    static LiveClients start(LiveBoard board, int n) throws Exception {
        WebView view = WebView.start(WebSettings.loopback(0), board, "bench/bench/bench");
        Selector selector = Selector.open();
        byte[] request = ("GET /events HTTP/1.1\r\nHost: 127.0.0.1:" + view.port() + "\r\nAccept: text/event-stream\r\n\r\n")
                .getBytes(StandardCharsets.US_ASCII);
        for (int i = 0; i < n; i++) {
            SocketChannel ch = SocketChannel.open(new InetSocketAddress("127.0.0.1", view.port()));
            ByteBuffer out = ByteBuffer.wrap(request);
            while (out.hasRemaining()) {
                ch.write(out);
            }
            ch.configureBlocking(false);
            ch.register(selector, SelectionKey.OP_READ);
        }
        LiveClients clients = new LiveClients(view, selector);
        clients.reader.start();
        long giveUp = System.nanoTime() + 10_000_000_000L;
        while (view.livePages() < n && System.nanoTime() - giveUp < 0) {
            Thread.sleep(10);
        }
        if (view.livePages() < n) {
            throw new IllegalStateException("only " + view.livePages() + " of " + n + " live pages opened");
        }
        return clients;
    }

    private void read() {
        ByteBuffer buf = ByteBuffer.allocateDirect(64 * 1024);
        try {
            while (running) {
                selector.select(100);
                for (SelectionKey k : selector.selectedKeys()) {
                    buf.clear();
                    int got = ((SocketChannel) k.channel()).read(buf);
                    if (got < 0) {
                        k.cancel();
                    } else {
                        bytes.addAndGet(got);
                    }
                }
                selector.selectedKeys().clear();
            }
        } catch (IOException e) {
            e.printStackTrace();
        }
    }

    /** Closes the connections and the view; returns the live pages still open and the bytes they read. */
    String stop() throws Exception {
        String figures = view.livePages() + " live pages open at the end, " + bytes.get() / 1024 + " kB of events read";
        running = false;
        reader.join(5000);
        for (SelectionKey k : selector.keys()) {
            k.channel().close();
        }
        selector.close();
        view.close();
        return figures;
    }
}
