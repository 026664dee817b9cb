package hammerstep.sequence;

import hammerstep.joint.JointResult;
import hammerstep.results.ResultSink;
import hammerstep.station.PartIdentity;
import hammerstep.station.VirtualClock;
import hammerstep.station.loop.SequenceRecords;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/** Drives a {@link Sequence} by hand the way the station loop does, storing every record at once. */
final class Harness {

    final VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
    final Sequence seq;
    /** What the sequence handed out, as typed records and as the loop stamps and words them for the journal. */
    final List<SequenceRecord> records = new ArrayList<>();
    final List<Store> stored = new ArrayList<>();
    boolean storeFails;
    private long seq0;

    Harness(boolean confirmSensors) {
        seq = new Sequence(new Sequence.Settings("TQ-0042", null, 500), confirmSensors);
    }

    long now() {
        clock.advanceNs(1_000_000);
        return clock.nanoTime();
    }

    Harness start(Pattern pattern, String serial) {
        seq.partArrived(new PartIdentity(serial, "M1"), pattern, now());
        drain();
        return this;
    }

    /** A whole rundown: start, optional shut-off, verdict, storing. */
    Harness rundown(JointResult r) {
        seq.rundownStarted(now());
        seq.jointJudged(r, now());
        drain();
        return this;
    }

    void drain() {
        SequenceRecord r;
        while ((r = seq.nextToStore()) != null) {
            if (storeFails) {
                seq.storeFailed(now());
                return;
            }
            take(r);
            seq.stored(new ResultSink.Receipt("r" + seq0, seq0++), now());
        }
    }

    /** Keeps {@code r} as the loop would hand it to the journal. */
    void take(SequenceRecord r) {
        records.add(r);
        stored.add(SequenceRecords.toStore(r, clock));
    }

    void ack() {
        seq.acknowledge(now());
        drain();
    }

    void key() {
        seq.supervisorKey(now());
        drain();
    }

    List<Store.Joint> joints() {
        return stored.stream().filter(s -> s instanceof Store.Joint).map(s -> (Store.Joint) s).toList();
    }

    List<Store.Part> parts() {
        return stored.stream().filter(s -> s instanceof Store.Part).map(s -> (Store.Part) s).toList();
    }

    List<String> eventCodes() {
        return stored.stream().filter(s -> s instanceof Store.Event).map(s -> ((Store.Event) s).event().code()).toList();
    }
}
