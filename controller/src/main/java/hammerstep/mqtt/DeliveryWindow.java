package hammerstep.mqtt;

import hammerstep.results.Outbox;
import hammerstep.results.ResultStoreException;
import org.agrona.collections.LongHashSet;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.util.List;

/**
 * The delivery window: publishes pending records at QoS 1 in append order, at most {@code window}
 * unacknowledged at a time, and marks a record delivered only when the broker acknowledges it. The
 * positions in flight are a primitive set (no boxing per publish or acknowledgement). After a
 * reconnect the window starts again from the oldest record not yet acknowledged, with the same ids.
 * Delivery thread only.
 */
final class DeliveryWindow {

    private static final Logger LOG = LoggerFactory.getLogger(ResultPublisher.class);

    private final Outbox outbox;
    private final Topics topics;
    private final LongHashSet inflight = new LongHashSet();
    private long cursor;
    private int window;
    private volatile long published;
    private volatile long acknowledged;
    private volatile long refused;

    DeliveryWindow(Outbox outbox, Topics topics) {
        this.outbox = outbox;
        this.topics = topics;
    }

    /** A new connection: nothing in flight, everything unacknowledged is sent again. */
    void restart(int windowSize) {
        window = windowSize;
        inflight.clear();
        cursor = 0;
    }

    /** Publishes what fits in the window on {@code link}; throws when the link failed. */
    int send(Link link) throws IOException {
        int sent = 0;
        try {
            while (inflight.size() < window) {
                List<Outbox.Entry> batch = outbox.pending(cursor, window - inflight.size());
                if (batch.isEmpty()) {
                    break;
                }
                for (Outbox.Entry e : batch) {
                    if (!link.publish(topics.result(e.kind()), e.payload(), false, e.position())) {
                        return sent;
                    }
                    inflight.add(e.position());
                    cursor = e.position();
                    published++;
                    sent++;
                }
            }
        } catch (ResultStoreException e) {
            LOG.error("cannot read the outbox: {}", e.getMessage());
        }
        return sent;
    }

    /**
     * The broker's answer to the publish tagged {@code position}.
     *
     * @return false when the broker refused the record (the connection must be dropped)
     */
    boolean acknowledged(long position, boolean ok) {
        inflight.remove(position);
        if (!ok) {
            refused++;
            return false;
        }
        try {
            outbox.markDelivered(position);
            acknowledged++;
        } catch (ResultStoreException e) {
            LOG.error("cannot mark a result delivered; it will be sent again: {}", e.getMessage());
        }
        return true;
    }

    long published() {
        return published;
    }

    long acknowledgedCount() {
        return acknowledged;
    }

    long refused() {
        return refused;
    }
}
