package hammerstep.results;

import java.util.List;

/**
 * The durable store of results between the station and the network. The station thread appends;
 * the delivery thread reads what is pending, in append order, and marks each record delivered once
 * the broker has acknowledged it. A record is never removed before it is marked delivered, and
 * never dropped because storage runs short: {@link #storage()} tells the station to stop starting
 * parts instead. Implementations are thread-safe for one appender and one deliverer.
 */
public interface Outbox extends AutoCloseable {

    /**
     * One stored result.
     *
     * @param position the record's place in the append order, across all kinds (starts at 1)
     * @param seq      the per-station, per-kind sequence number carried inside {@code payload}
     * @param payload  the message exactly as it is published
     */
    record Entry(long position, MessageKind kind, long seq, String id, byte[] payload) { }

    /**
     * A range of stored results that is gone from the store: seqs {@code firstSeq} to {@code lastSeq}
     * (inclusive) of {@code kind} were assigned, and no record of them is left. Their seqs are never
     * given again.
     */
    record Loss(MessageKind kind, long firstSeq, long lastSeq) {

        public Loss {
            if (firstSeq < 1 || lastSeq < firstSeq) {
                throw new IllegalArgumentException("expected 1 <= firstSeq <= lastSeq, got " + firstSeq + ".." + lastSeq);
            }
        }

        /** How many results the range holds. */
        public long count() {
            return lastSeq - firstSeq + 1;
        }

        /** E.g. {@code joint seq 17 to 20} or {@code part seq 3}. */
        public String range() {
            return kind.topic() + " seq " + firstSeq + (lastSeq == firstSeq ? "" : " to " + lastSeq);
        }
    }

    /**
     * What the store found when it opened: anything other than a clean start is reported.
     *
     * @param losses ranges of results that were assigned a seq and are gone, in kind and seq order
     */
    record Recovery(int segments, long records, long pending, long tornBytes, List<String> notes, List<Loss> losses) {

        public Recovery {
            notes = List.copyOf(notes);
            losses = List.copyOf(losses);
        }

        public Recovery(int segments, long records, long pending, long tornBytes, List<String> notes) {
            this(segments, records, pending, tornBytes, notes, List.of());
        }

        public static Recovery fresh() {
            return new Recovery(0, 0, 0, 0, List.of());
        }

        /** True when nothing had to be cut or skipped and nothing is gone. */
        public boolean clean() {
            return tornBytes == 0 && notes.isEmpty() && losses.isEmpty();
        }
    }

    /** The {@code seq} the next record of {@code kind} must carry; 1 for the first. */
    long nextSeq(MessageKind kind);

    /**
     * Stores one record and makes it durable before returning (the caller shows the verdict only
     * after). {@code seq} must equal {@link #nextSeq(MessageKind)}. Appender thread only.
     *
     * @return the record's position
     */
    long append(MessageKind kind, long seq, String id, byte[] payload) throws ResultStoreException;

    /** Up to {@code max} undelivered records with a position after {@code afterPosition}, in order. */
    List<Entry> pending(long afterPosition, int max) throws ResultStoreException;

    /** Marks one record delivered; unknown or already delivered positions are ignored. */
    void markDelivered(long position) throws ResultStoreException;

    /** Records not yet marked delivered. */
    long backlog();

    /** Room left: LOW warns, FULL means start no new part (appends still succeed while the medium takes them). */
    ResultSink.Storage storage();

    /** What opening the store found. */
    Recovery recovery();

    /**
     * The joint records stored after the last part record, delivered or not, as found when the store
     * opened: the joints of a part that was in work when the station stopped (power cut, kill) and
     * never got its part record. Empty when the last part ended with its record, and for a store
     * that starts empty.
     */
    List<Entry> unfinishedPartJoints();

    /**
     * Every loss found since the store opened (at opening, and later by {@link #raiseSeq}), reported
     * or not; for the status. Any thread.
     */
    default List<Loss> losses() {
        return List.of();
    }

    /**
     * The losses not yet reported as stored alarm events, oldest first. The appender reports each
     * (an event stored through this outbox) and then calls {@link #lossesReported}; until then a
     * restart finds them again, so a loss is reported at least once.
     */
    default List<Loss> unreportedLosses() {
        return List.of();
    }

    /** Records durably that {@code reported} (taken from {@link #unreportedLosses()}) are reported. Appender thread. */
    default void lossesReported(List<Loss> reported) throws ResultStoreException {
        // a store that loses nothing has nothing to record
    }

    /**
     * A cross check from outside the store (the station's own retained status, read back from the
     * broker) says seqs up to {@code lastSeqElsewhere[kind.ordinal()]} were assigned before (0: not
     * known). Where that is at or above the first seq this run of the store gave, the seqs from there
     * up to it are a {@link Loss}, and every record of this run not yet delivered is given a seq above
     * it ({@code restamp} writes the new seq into a payload; the id stays), so no seq is given twice.
     * Call before any record of this run is delivered. Any thread.
     *
     * @return the losses found, none when the store already knew every seq the cross check names
     */
    default List<Loss> raiseSeqs(long[] lastSeqElsewhere, Restamp restamp) throws ResultStoreException {
        return List.of();
    }

    /**
     * The rule of {@link #raiseSeqs} for every store: the kinds whose seq {@code lastSeqElsewhere}
     * reaches this run's first ({@code runStartSeq}) are lost from there up to it, and their seqs
     * must rise by {@code delta[kind]} (set here; 0 for the others).
     */
    static List<Loss> raisedRanges(long[] lastSeqElsewhere, long[] runStartSeq, long[] delta) {
        List<Loss> found = new java.util.ArrayList<>();
        for (MessageKind kind : MessageKind.values()) {
            int k = kind.ordinal();
            if (lastSeqElsewhere[k] >= runStartSeq[k]) {
                delta[k] = lastSeqElsewhere[k] + 1 - runStartSeq[k];
                found.add(new Loss(kind, runStartSeq[k], lastSeqElsewhere[k]));
            }
        }
        return found;
    }

    /** Writes a new seq into a stored payload. */
    @FunctionalInterface
    interface Restamp {
        byte[] apply(byte[] payload, long newSeq) throws ResultStoreException;
    }

    /** Releases files; pending records stay for the next start. */
    @Override
    void close();

    /**
     * The results of {@code kind} (joints or parts) the store held when it was opened, delivered
     * or not, oldest first, within a bound of the store's; handed over once. None for a store
     * that keeps nothing across a restart.
     */
    default List<Entry> storedAtOpen(MessageKind kind) {
        return List.of();
    }
}
