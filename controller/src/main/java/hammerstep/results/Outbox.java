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

    /** What the store found when it opened: anything other than a clean start is reported. */
    record Recovery(int segments, long records, long pending, long tornBytes, List<String> notes) {

        public Recovery {
            notes = List.copyOf(notes);
        }

        public static Recovery fresh() {
            return new Recovery(0, 0, 0, 0, List.of());
        }

        /** True when nothing had to be cut or skipped. */
        public boolean clean() {
            return tornBytes == 0 && notes.isEmpty();
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

    /** Releases files; pending records stay for the next start. */
    @Override
    void close();
}
