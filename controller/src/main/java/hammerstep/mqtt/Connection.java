package hammerstep.mqtt;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.util.Random;
import java.util.function.Supplier;

/**
 * The publisher's connection and its backoff: connects a new {@link Link} when the next attempt is
 * due, and after a failure or a loss waits min · 2^(failures−1), capped at max, ±20 % jitter, so
 * stations do not reconnect in step. A link serves one connection; each connection has its
 * generation, so a loss reported late by an old link is ignored. While the broker cannot be reached
 * it logs one line per backoff period ({@code reconnect.max_ms}), not one per attempt: the first
 * failure at once, then at most one line per period with the attempts made since and the results
 * kept. Delivery thread only.
 */
final class Connection {

    private static final Logger LOG = LoggerFactory.getLogger(ResultPublisher.class);
    private static final long MS = 1_000_000L;

    private final Supplier<Link> links;
    private final BrokerSettings settings;
    private final Random jitter;
    private Link link;
    private long generation;
    private long nextAttemptNs;
    private int failures;
    private boolean unreachableLogged;
    private long nextUnreachableLogNs;
    private long attemptsSinceLog;
    private volatile boolean connected;
    private volatile long connects;

    Connection(Supplier<Link> links, BrokerSettings settings, long seed, long nowNs) {
        this.links = links;
        this.settings = settings;
        this.jitter = new Random(seed);
        this.nextAttemptNs = nowNs;
    }

    /** The link while connected, else null. */
    Link link() {
        return link;
    }

    long generation() {
        return generation;
    }

    boolean connected() {
        return connected;
    }

    long connects() {
        return connects;
    }

    /** True when no link is up and the next attempt is due. */
    boolean attemptDue(long nowNs) {
        return link == null && nowNs - nextAttemptNs >= 0;
    }

    /**
     * One connection attempt with a new link: connects with {@code will} and {@code events} of the
     * new generation and subscribes to {@code commandFilter}.
     *
     * @return the broker's receive maximum, or -1 when the attempt failed (the next one is scheduled)
     */
    int connect(long nowNs, Link.Will will, java.util.function.LongFunction<Link.Events> events,
                String commandFilter) {
        return connect(nowNs, will, events, commandFilter, -1);
    }

    /** As above; {@code backlog} (results kept, or -1 when unknown) goes into the unreachable line. */
    int connect(long nowNs, Link.Will will, java.util.function.LongFunction<Link.Events> events,
                String commandFilter, long backlog) {
        Link l = links.get();
        long gen = ++generation;
        try {
            int receiveMax = l.connect(will, events.apply(gen));
            link = l;
            l.subscribe(commandFilter);
            failures = 0;
            connected = true;
            connects++;
            if (unreachableLogged && attemptsSinceLog > 0) {
                LOG.info("broker {} reached after {} more failed attempts", settings.url(), attemptsSinceLog);
            }
            unreachableLogged = false;
            attemptsSinceLog = 0;
            return receiveMax;
        } catch (IOException | RuntimeException e) {
            l.close();
            link = null;
            connected = false;
            failures++;
            long delayMs = backoffMs();
            nextAttemptNs = nowNs + delayMs * MS;
            attemptsSinceLog++;
            if (!unreachableLogged || nowNs - nextUnreachableLogNs >= 0) {
                String kept = backlog < 0 ? "" : "; " + backlog + " results kept, measuring and storing go on";
                if (!unreachableLogged) {
                    LOG.warn("cannot reach broker {} ({}){}; trying again in {} ms, next line in {} s unless it"
                            + " connects", settings.url(), e.getMessage(), kept, delayMs,
                            settings.reconnectMaxMs() / 1000.0);
                } else {
                    LOG.warn("still cannot reach broker {} ({}): {} failed attempts since the last line{}",
                            settings.url(), e.getMessage(), attemptsSinceLog, kept);
                }
                unreachableLogged = true;
                attemptsSinceLog = 0;
                nextUnreachableLogNs = nowNs + settings.reconnectMaxMs() * MS;
            }
            return -1;
        }
    }

    /** Drops the link at once and schedules the next attempt; returns the delay in ms. */
    long drop(long nowNs) {
        if (link != null) {
            link.close();
            link = null;
        }
        connected = false;
        failures++;
        long delayMs = backoffMs();
        nextAttemptNs = nowNs + delayMs * MS;
        return delayMs;
    }

    /** Takes the link away for a clean stop (the caller says goodbye on it); null when none. */
    Link release() {
        Link l = link;
        link = null;
        connected = false;
        return l;
    }

    /** min · 2^(failures−1), capped at max, then ±20 % jitter. */
    long backoffMs() {
        int shift = Math.min(Math.max(failures - 1, 0), 30);
        long base = Math.min(settings.reconnectMaxMs(), settings.reconnectMinMs() << shift);
        if (base < 0) {
            base = settings.reconnectMaxMs();
        }
        double factor = 0.8 + 0.4 * jitter.nextDouble();
        return Math.max(1, Math.round(base * factor));
    }
}
