package hammerstep.mqtt.paho;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * The threads of one Paho client: daemon threads in an executor of their own, so that closing the
 * client can make sure none is left. Paho 1.2.5 has a connect race: when the server closes the
 * socket right after accepting it, the connect thread waits forever (in 100 ms sleeps that ignore
 * interrupts) for a receiver that has already stopped. {@link #shutdown()} stops such a thread as a
 * last resort, so a flapping network cannot pile up stuck threads.
 */
final class ClientThreads {

    private static final Logger LOG = LoggerFactory.getLogger(ClientThreads.class);
    /** Paho keeps its sender, receiver and callback loops on the executor for the connection's life, plus pings. */
    private static final int THREADS = 6;
    private static final AtomicInteger COUNT = new AtomicInteger();

    private final List<Thread> made = new CopyOnWriteArrayList<>();
    private final ScheduledExecutorService executor;

    ClientThreads(String name) {
        executor = Executors.newScheduledThreadPool(THREADS, r -> {
            Thread t = new Thread(r, "mqtt-" + name + "-" + COUNT.incrementAndGet());
            t.setDaemon(true);
            made.add(t);
            return t;
        });
    }

    ScheduledExecutorService executor() {
        return executor;
    }

    /** Ends every thread of the client; waits up to 2 s for them to finish by themselves. */
    @SuppressWarnings({"deprecation", "removal"})
    void shutdown() {
        executor.shutdownNow();
        try {
            if (executor.awaitTermination(2, TimeUnit.SECONDS)) {
                return;
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        for (Thread t : made) {
            if (t.isAlive() && t != Thread.currentThread()) {
                LOG.warn("stopping a stuck MQTT client thread ({})", t.getName());
                try {
                    t.stop();
                } catch (UnsupportedOperationException e) {
                    LOG.warn("cannot stop thread {} on this Java version", t.getName());
                }
            }
        }
    }
}
