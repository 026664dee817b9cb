package hammerstep.results;

import org.agrona.concurrent.Agent;
import org.agrona.concurrent.AgentRunner;
import org.agrona.concurrent.BackoffIdleStrategy;
import org.agrona.ErrorHandler;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The journal's one writer: a duty cycle ({@link #doWork()}) that takes the station's records from
 * a ring, stores each durably through the {@link ResultSink} on the journal (id, {@code seq},
 * message, forced append) and answers with a {@link Done} on a second ring; it also applies the
 * delivery side's delivered marks ({@link DeliveryView}). So the station thread never waits on a
 * disk: it offers a record, goes on with its samples and learns a cycle or a stalled write later
 * that the record is on disk.
 *
 * <p>Threads: {@link #offer}, {@link #poll}, {@link #storage()} and {@link #unfinishedPart()} belong
 * to the station thread (single producer of requests, single consumer of answers);
 * {@link #doWork()} to the writer's thread; the {@link #forDelivery() delivery view} to the
 * delivery thread (single producer of marks). Both rings are Agrona's one-to-one queues with slots
 * allocated once. The sink and the outbox are used on the writer's thread only, apart from the
 * delivery view's reads. In tests and in virtual time the same object runs on one thread:
 * {@code doWork()} is called by hand.
 *
 * <p>One record is stored per duty cycle, so each forced write is one cycle: a runner goes straight
 * on to the next while records wait, and a test that stalls every write models each one.
 */
public final class JournalWriter implements Agent {

    private static final Logger LOG = LoggerFactory.getLogger(JournalWriter.class);

    /** Default room in each ring (a power of two): far more than the station ever has waiting (it waits for each record). */
    public static final int DEFAULT_CAPACITY = 64;

    /** Something the writer can store: a joint, a part or an event. */
    public interface Storable {
        /** Stores this record through {@code sink}; called on the writer's thread. */
        ResultSink.Receipt storeIn(ResultSink sink) throws ResultStoreException;
    }

    /**
     * The writer's answer to one offered record, in the order offered.
     *
     * @param receipt the record's identity, null when it was not stored
     * @param failure why it was not stored, null when it was
     */
    public record Done(Storable record, ResultSink.Receipt receipt, String failure) {
        public boolean stored() {
            return failure == null;
        }
    }

    private final ResultSink sink;
    private final Outbox outbox;
    private final Spsc.Queue<Storable> requests;
    private final Spsc.Queue<Done> answers;
    private final DeliveryView delivery;
    private final UnfinishedPart unfinished;
    private volatile ResultSink.Storage storage;
    private volatile long stored;
    private volatile long failed;

    /**
     * @param sink   where records are stored (an {@link OutboxResultSink} on {@code outbox}); from now
     *               on used on the writer's thread only
     * @param outbox the outbox under {@code sink}, for delivered marks and the delivery view; null
     *               when nothing delivers from it
     */
    public JournalWriter(ResultSink sink, Outbox outbox, int capacity) {
        this.sink = sink;
        this.outbox = outbox;
        this.requests = new Spsc.Queue<>(capacity);
        this.answers = new Spsc.Queue<>(capacity);
        this.delivery = outbox == null ? null : new DeliveryView(outbox, capacity * 64);
        this.unfinished = sink.unfinishedPart();
        this.storage = sink.storage();
    }

    /** A writer on {@code sink} alone (no delivery view), with the default capacity. */
    public JournalWriter(ResultSink sink) {
        this(sink, null, DEFAULT_CAPACITY);
    }

    /**
     * Runs the writer on a thread of its own (named {@code journal-writer}). Between empty cycles it
     * spins briefly, yields, then parks for up to 100 µs.
     */
    public static AgentRunner start(JournalWriter writer, ErrorHandler errors) {
        AgentRunner runner = new AgentRunner(new BackoffIdleStrategy(20, 10, 1_000, 100_000), errors, null, writer);
        AgentRunner.startOnThread(runner);
        return runner;
    }

    @Override
    public String roleName() {
        return "journal-writer";
    }

    // ---- station thread ---------------------------------------------------------------------------

    /** Hands {@code record} to the writer; false when the ring is full (offer it again later). */
    public boolean offer(Storable record) {
        return requests.offer(record);
    }

    /** The oldest answer not yet taken, or null. */
    public Done poll() {
        return answers.poll();
    }

    /** The store's room as the writer last saw it (after its last write, or at start). */
    public ResultSink.Storage storage() {
        return storage;
    }

    /** The part the store found unfinished when it opened (read once, at construction), or null. */
    public UnfinishedPart unfinishedPart() {
        return unfinished;
    }

    // ---- writer thread ----------------------------------------------------------------------------

    /**
     * Applies waiting delivered marks, stores at most one record and posts its answer, then reads the
     * store's room afresh (it changes with writes, deliveries and the volume's free space).
     */
    @Override
    public int doWork() {
        int work = delivery == null ? 0 : delivery.apply();
        try {
            work += storeOne();
        } finally {
            storage = sink.storage();
        }
        return work;
    }

    private int storeOne() {
        if (answers.remainingCapacity() == 0) {
            return 0; // the station has not taken its answers yet; never drop one
        }
        Storable record = requests.poll();
        if (record == null) {
            return 0;
        }
        Done done;
        try {
            done = new Done(record, record.storeIn(sink), null);
            stored++;
        } catch (ResultStoreException | RuntimeException e) {
            done = new Done(record, null, e.getMessage() == null ? e.toString() : e.getMessage());
            failed++;
        } catch (Error e) {
            failed++;
            answers.offer(new Done(record, null, "journal writer failed: " + e));
            throw e;
        }
        answers.offer(done); // room checked above; this thread is the only producer
        return 1;
    }

    /**
     * On the writer's thread as its runner stops (after the station loop stopped): stores every
     * record still waiting, so nothing offered is lost; answers no longer matter and are not kept.
     */
    @Override
    public void onClose() {
        if (delivery != null) {
            while (delivery.apply() > 0) {
                // every mark that arrived
            }
        }
        Storable record;
        while ((record = requests.poll()) != null) {
            try {
                record.storeIn(sink);
                stored++;
            } catch (ResultStoreException | RuntimeException e) {
                failed++;
                LOG.error("a result offered before the stop could not be stored: {}", e.getMessage());
            }
        }
    }

    /** Records waiting for the writer now (exact on one thread, a snapshot across threads). */
    public int waiting() {
        return requests.size();
    }

    /** Records stored since start. */
    public long stored() {
        return stored;
    }

    /** Records the store refused since start. */
    public long failed() {
        return failed;
    }

    // ---- delivery thread --------------------------------------------------------------------------

    /**
     * The outbox as the delivery side should use it: reads go to the outbox, a delivered mark goes
     * through a ring to this writer, so the journal has one writing thread. Null without an outbox.
     */
    public Outbox forDelivery() {
        return delivery;
    }
}
