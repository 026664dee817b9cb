package hammerstep.results;

import org.agrona.collections.LongArrayQueue;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.util.List;

/**
 * The outbox as the delivery thread sees it when a {@link JournalWriter} owns the journal: reads
 * ({@link #pending}, {@link #backlog}, {@link #storage}, {@link #nextSeq}) go straight to the
 * outbox; {@link #markDelivered} puts the position on a single-producer, single-consumer ring that
 * the writer applies in its duty cycle, so delivered marks are written by the journal's one writer,
 * never by the delivery thread. A mark is therefore applied a writer cycle later: {@link #backlog()}
 * lags by that much, and a record acknowledged just before a connection loss may be sent once more
 * after the reconnect (same id: at least once, as always). When the ring is full, marks wait in a
 * queue of the delivery thread's own and go on the ring as it drains; none is dropped.
 */
final class DeliveryView implements Outbox {

    private static final Logger LOG = LoggerFactory.getLogger(DeliveryView.class);
    private static final int MAX_MARKS_PER_CYCLE = 256;

    private final Outbox outbox;
    private final Spsc.Longs marks;
    private final LongArrayQueue overflow = new LongArrayQueue(); // delivery thread only

    /** @param markCapacity how many marks the ring holds, a power of two */
    DeliveryView(Outbox outbox, int markCapacity) {
        this.outbox = outbox;
        this.marks = new Spsc.Longs(markCapacity);
    }

    // ---- delivery thread --------------------------------------------------------------------------

    @Override
    public void markDelivered(long position) {
        flush();
        if (!overflow.isEmpty() || !marks.offer(position)) {
            overflow.addLong(position);
        }
    }

    private void flush() {
        while (!overflow.isEmpty() && marks.offer(overflow.peekLong())) {
            overflow.pollLong();
        }
    }

    @Override
    public List<Entry> pending(long afterPosition, int max) throws ResultStoreException {
        flush();
        return outbox.pending(afterPosition, max);
    }

    @Override
    public long backlog() {
        return outbox.backlog();
    }

    @Override
    public ResultSink.Storage storage() {
        return outbox.storage();
    }

    @Override
    public long nextSeq(MessageKind kind) {
        return outbox.nextSeq(kind);
    }

    @Override
    public long append(MessageKind kind, long seq, String id, byte[] payload) throws ResultStoreException {
        throw new ResultStoreException("the delivery side does not store results; the journal writer does");
    }

    @Override
    public Recovery recovery() {
        return outbox.recovery();
    }

    @Override
    public List<Entry> storedAtOpen(MessageKind kind) {
        return outbox.storedAtOpen(kind);
    }

    @Override
    public List<Entry> unfinishedPartJoints() {
        return outbox.unfinishedPartJoints();
    }

    @Override
    public List<Loss> losses() {
        return outbox.losses();
    }

    /** The cross check runs on the delivery thread; the outbox takes its own lock against the writer. */
    @Override
    public List<Loss> raiseSeqs(long[] lastSeqElsewhere, Restamp restamp) throws ResultStoreException {
        return outbox.raiseSeqs(lastSeqElsewhere, restamp);
    }

    /** The writer's owner closes the outbox; the view holds nothing of its own. */
    @Override
    public void close() {
        // nothing held
    }

    // ---- writer thread ----------------------------------------------------------------------------

    /** Marks delivered what the ring brought since the last call; returns how many. */
    int apply() {
        int n = 0;
        while (n < MAX_MARKS_PER_CYCLE && !marks.isEmpty()) {
            long position = marks.take();
            n++;
            try {
                outbox.markDelivered(position);
            } catch (ResultStoreException e) {
                LOG.error("cannot mark a result delivered; it will be sent again: {}", e.getMessage());
            }
        }
        return n;
    }
}
