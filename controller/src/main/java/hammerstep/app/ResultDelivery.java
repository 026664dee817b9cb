package hammerstep.app;

import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.Outbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StationId;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import org.agrona.concurrent.AgentRunner;
import org.agrona.concurrent.SystemNanoClock;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.time.Clock;

/**
 * The service's way from the station to the plant: the outbox journal of {@code storage:} (in
 * memory, with a warning, when the station file has none), the station's result sink on it, and,
 * with a {@code broker:} section, the MQTT publisher on a thread of its own that delivers the
 * outbox and takes the plant's commands. {@link #close()} stops the publisher (which publishes the
 * offline status and disconnects cleanly) and then closes the journal; call it after the station
 * loop has stopped, so no result is stored after.
 */
final class ResultDelivery implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger("hammerstep.run");

    private final Outbox outbox;
    private final ResultSink sink;
    private final ResultPublisher publisher;
    private AgentRunner runner;
    private boolean closed;

    private ResultDelivery(Outbox outbox, ResultSink sink, ResultPublisher publisher) {
        this.outbox = outbox;
        this.sink = sink;
        this.publisher = publisher;
    }

    /**
     * Opens the journal and, with a broker, starts the publisher.
     *
     * @param storage  the {@code storage:} section, or null
     * @param broker   the {@code broker:} section, or null
     * @param commands what the plant's commands go to
     */
    static ResultDelivery open(StationId id, StorageSettings storage, BrokerSettings broker, StationCommands commands,
                               String version) {
        Outbox outbox;
        if (storage == null) {
            LOG.warn("no 'storage' section: results are kept in memory only and lost when the service stops");
            outbox = new MemoryOutbox();
        } else {
            try {
                FileOutbox journal = FileOutbox.open(storage);
                Outbox.Recovery r = journal.recovery();
                if (!r.notes().isEmpty() || r.tornBytes() != 0) {
                    LOG.warn("result journal in {} recovered: {}", storage.dir(), String.join("; ", r.notes()));
                }
                for (Outbox.Loss l : r.losses()) {
                    LOG.error("RESULTS_LOST: {}", OutboxResultSink.lossMessage(l));
                }
                LOG.info("results journal {}: {} pending from before", storage.dir(), journal.backlog());
                outbox = journal;
            } catch (ResultStoreException e) {
                throw new UserError("storage: cannot open the result journal in " + storage.dir() + ": "
                        + e.getMessage(), 1);
            }
        }
        OutboxResultSink sink = new OutboxResultSink(outbox, id);
        try {
            sink.reportLosses(); // the alarms are on their way before the first result of this run
        } catch (ResultStoreException e) {
            throw new UserError("storage: cannot store the alarm for results lost from " + storage.dir() + ": "
                    + e.getMessage(), 1);
        }
        ResultPublisher publisher = null;
        if (broker == null) {
            LOG.warn("no 'broker' section: results are stored and not delivered");
        } else {
            BrokerSettings settings = broker.clientId().isEmpty()
                    ? broker.withClientId(id.site() + "-" + id.line() + "-" + id.station()) : broker;
            publisher = new ResultPublisher(outbox, id, () -> new PahoLink(settings), commands, settings,
                    new SystemNanoClock(), Clock.systemUTC(), System.nanoTime(), version);
            LOG.info("delivering results to {} as {}{}", settings.url(), settings.clientId(),
                    settings.username() == null ? "" : " (user " + settings.username() + ")");
        }
        return new ResultDelivery(outbox, sink, publisher);
    }

    /** Starts the publisher's thread (when there is a broker); call once the station is wired. */
    void start() {
        if (publisher != null && runner == null) {
            runner = ResultPublisher.start(publisher);
        }
    }

    ResultSink sink() {
        return sink;
    }

    Outbox outbox() {
        return outbox;
    }

    /** The publisher's figures, or null without a broker. */
    ResultPublisher.Figures figures() {
        return publisher == null ? null : publisher.figures();
    }

    /** Idempotent. */
    @Override
    public void close() {
        if (closed) {
            return;
        }
        closed = true;
        if (runner != null) {
            runner.close();
            runner = null;
        }
        try {
            outbox.close();
        } catch (Exception e) {
            LOG.warn("closing the result journal: {}", e.getMessage());
        }
    }
}
