package hammerstep.results;

import java.util.List;

/** An outbox that hands every call to another; a test overrides the calls it wants to change. */
public class ForwardingOutbox implements Outbox {

    private final Outbox inner;

    public ForwardingOutbox(Outbox inner) {
        this.inner = inner;
    }

    @Override
    public long nextSeq(MessageKind kind) {
        return inner.nextSeq(kind);
    }

    @Override
    public long append(MessageKind kind, long seq, String id, byte[] payload) throws ResultStoreException {
        return inner.append(kind, seq, id, payload);
    }

    @Override
    public List<Entry> pending(long afterPosition, int max) throws ResultStoreException {
        return inner.pending(afterPosition, max);
    }

    @Override
    public void markDelivered(long position) throws ResultStoreException {
        inner.markDelivered(position);
    }

    @Override
    public long backlog() {
        return inner.backlog();
    }

    @Override
    public ResultSink.Storage storage() {
        return inner.storage();
    }

    @Override
    public Recovery recovery() {
        return inner.recovery();
    }

    @Override
    public List<Entry> unfinishedPartJoints() {
        return inner.unfinishedPartJoints();
    }

    @Override
    public List<Loss> losses() {
        return inner.losses();
    }

    @Override
    public List<Loss> unreportedLosses() {
        return inner.unreportedLosses();
    }

    @Override
    public void lossesReported(List<Loss> reported) throws ResultStoreException {
        inner.lossesReported(reported);
    }

    @Override
    public List<Loss> raiseSeqs(long[] lastSeqElsewhere, Restamp restamp) throws ResultStoreException {
        return inner.raiseSeqs(lastSeqElsewhere, restamp);
    }

    @Override
    public void close() {
        inner.close();
    }
}
