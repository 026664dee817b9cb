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
