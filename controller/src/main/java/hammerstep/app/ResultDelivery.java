package hammerstep.app;

import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.results.JournalWriter;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.Outbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StationId;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.station.SystemStationClock;
import org.agrona.concurrent.AgentRunner;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;


/**
 * The service's way from the station to the plant: the outbox journal of {@code storage:} (in
 * memory, with a warning, when the station file has none), the result sink on it, driven by the
 * {@link JournalWriter} on a thread of its own (the journal's one writer: the station hands it
 * records through a ring and never waits on the disk), and, with a {@code broker:} section, the
 * MQTT publisher on a thread of its own that reads the outbox, hands its delivered marks to the
 * writer and takes the plant's commands. {@link #close()} stops the publisher (which publishes the
 * offline status and disconnects cleanly), then the writer (which stores what is still waiting),
 * then closes the journal; call it after the station loop has stopped, so no result is offered after.
 */
final class ResultDelivery implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger("hammerstep.run");

    private final Outbox outbox;
    private final JournalWriter journal;
    private final ResultPublisher publisher;
    private AgentRunner runner;
    private AgentRunner journalRunner;
    private boolean closed;

    private ResultDelivery(Outbox outbox, JournalWriter journal, ResultPublisher publisher) {
        this.outbox = outbox;
        this.journal = journal;
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
        reportStorageAtStart(sink, outbox, storage);
        JournalWriter journal = new JournalWriter(sink, outbox, JournalWriter.DEFAULT_CAPACITY);
        ResultPublisher publisher = null;
        if (broker == null) {
            LOG.warn("no 'broker' section: results are stored and not delivered");
        } else {
            BrokerSettings settings = broker.clientId().isEmpty()
                    ? broker.withClientId(id.site() + "-" + id.line() + "-" + id.station()) : broker;
            SystemStationClock clock = new SystemStationClock();
            publisher = new ResultPublisher(journal.forDelivery(), id, () -> new PahoLink(settings), commands, settings,
                    clock, clock.nanoTime(), version);
            LOG.info("delivering results to {} as {}{}", settings.url(), settings.clientId(),
                    settings.username() == null ? "" : " (user " + settings.username() + ")");
        }
        return new ResultDelivery(outbox, journal, publisher);
    }

    /** A store already LOW or FULL at start: one log line, and its event stored to go out when the broker is reached. */
    private static void reportStorageAtStart(OutboxResultSink sink, Outbox outbox, StorageSettings storage) {
        String where = storage == null ? "memory" : storage.dir().toString();
        try {
            ResultSink.Storage state = sink.reportStorageAtStart();
            if (state == ResultSink.Storage.FULL) {
                LOG.error("STORAGE_FULL at start: result storage in {} is full ({} results not yet delivered); no new"
                        + " part starts until results are delivered; the alarm goes out when the broker is reached",
                        where, outbox.backlog());
            } else if (state == ResultSink.Storage.LOW) {
                LOG.warn("STORAGE_LOW at start: result storage in {} is running low ({} results not yet delivered)",
                        where, outbox.backlog());
            }
        } catch (ResultStoreException e) {
            LOG.error("STORAGE_FULL at start: result storage in {} is full and cannot take its alarm: {}", where,
                    e.getMessage());
        }
    }

    /** Starts the journal writer's thread and the publisher's (when there is a broker); call once the station is wired. */
    void start() {
        if (journalRunner == null) {
            journalRunner = JournalWriter.start(journal, t -> LOG.error("journal writer failed; going on", t));
        }
        if (publisher != null && runner == null) {
            runner = ResultPublisher.start(publisher);
        }
    }

    /** Where the station hands its records. */
    JournalWriter journal() {
        return journal;
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
        if (journalRunner != null) {
            journalRunner.close(); // the writer stores what still waits as it stops
            journalRunner = null;
        } else {
            journal.onClose();
        }
        try {
            outbox.close();
        } catch (Exception e) {
            LOG.warn("closing the result journal: {}", e.getMessage());
        }
    }
}
