package hammerstep.results;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * An outbox in memory, for tests and for running without local storage. Delivered records are
 * forgotten at once; storage is judged on the payload bytes still pending against a byte budget.
 */
public final class MemoryOutbox implements Outbox {

    private final long maxBytes;
    private final long lowBytes;
    private final TreeMap<Long, Entry> pending = new TreeMap<>();
    private final Map<MessageKind, Long> nextSeq = new EnumMap<>(MessageKind.class);
    private long nextPosition = 1;
    private long pendingBytes;
    /** The first seq of each kind this outbox may give without asking: above it is this run's own. */
    private final long[] runStartSeq = new long[MessageKind.values().length];
    private final List<Loss> losses = new ArrayList<>();
    private final List<Loss> unreported = new ArrayList<>();

    /**
     * @param maxBytes pending payload bytes at which storage reads FULL
     * @param lowBytes pending payload bytes at which storage reads LOW
     */
    public MemoryOutbox(long maxBytes, long lowBytes) {
        if (lowBytes > maxBytes || lowBytes <= 0) {
            throw new IllegalArgumentException("expected 0 < lowBytes <= maxBytes");
        }
        this.maxBytes = maxBytes;
        this.lowBytes = lowBytes;
        for (MessageKind k : MessageKind.values()) {
            nextSeq.put(k, 1L);
            runStartSeq[k.ordinal()] = 1;
        }
    }

    /** An outbox without a practical limit. */
    public MemoryOutbox() {
        this(Long.MAX_VALUE, Long.MAX_VALUE);
    }

    @Override
    public synchronized long nextSeq(MessageKind kind) {
        return nextSeq.get(kind);
    }

    @Override
    public synchronized long append(MessageKind kind, long seq, String id, byte[] payload) throws ResultStoreException {
        long expected = nextSeq.get(kind);
        if (seq != expected) {
            throw new ResultStoreException(kind.topic() + " seq " + seq + " out of order: expected " + expected);
        }
        long position = nextPosition++;
        pending.put(position, new Entry(position, kind, seq, id, payload.clone()));
        pendingBytes += payload.length;
        nextSeq.put(kind, seq + 1);
        return position;
    }

    @Override
    public synchronized List<Entry> pending(long afterPosition, int max) {
        List<Entry> out = new ArrayList<>(Math.min(max, pending.size()));
        for (Entry e : pending.tailMap(afterPosition, false).values()) {
            if (out.size() == max) {
                break;
            }
            out.add(e);
        }
        return out;
    }

    @Override
    public synchronized void markDelivered(long position) {
        Entry e = pending.remove(position);
        if (e != null) {
            pendingBytes -= e.payload().length;
        }
    }

    @Override
    public synchronized List<Loss> losses() {
        return List.copyOf(losses);
    }

    @Override
    public synchronized List<Loss> unreportedLosses() {
        return unreported.isEmpty() ? List.of() : List.copyOf(unreported);
    }

    @Override
    public synchronized void lossesReported(List<Loss> reported) {
        unreported.removeAll(reported);
    }

    /** As the file outbox: a memory outbox starts at seq 1 each run, so a run before may have used more. */
    @Override
    public synchronized List<Loss> raiseSeqs(long[] lastSeqElsewhere, Restamp restamp) throws ResultStoreException {
        long[] delta = new long[runStartSeq.length];
        List<Loss> found = Outbox.raisedRanges(lastSeqElsewhere, runStartSeq, delta);
        if (found.isEmpty()) {
            return List.of();
        }
        List<Entry> again = new ArrayList<>(pending.values());
        pending.clear();
        for (Entry e : again) {
            long d = delta[e.kind().ordinal()];
            long position = nextPosition++;
            pending.put(position, new Entry(position, e.kind(), e.seq() + d, e.id(),
                    d == 0 ? e.payload() : restamp.apply(e.payload(), e.seq() + d)));
        }
        for (MessageKind kind : MessageKind.values()) {
            int k = kind.ordinal();
            nextSeq.put(kind, nextSeq.get(kind) + delta[k]);
            runStartSeq[k] += delta[k];
        }
        losses.addAll(found);
        unreported.addAll(found);
        return found;
    }

    @Override
    public synchronized long backlog() {
        return pending.size();
    }

    @Override
    public synchronized ResultSink.Storage storage() {
        if (pendingBytes >= maxBytes) {
            return ResultSink.Storage.FULL;
        }
        return pendingBytes >= lowBytes ? ResultSink.Storage.LOW : ResultSink.Storage.OK;
    }

    /** A memory outbox starts empty: there is never an unfinished part from before. */
    @Override
    public List<Entry> unfinishedPartJoints() {
        return List.of();
    }

    @Override
    public Recovery recovery() {
        return Recovery.fresh();
    }

    @Override
    public void close() {
        // nothing held
    }
}
