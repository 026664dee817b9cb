package hammerstep.station.loop;

import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;
import hammerstep.sequence.SequenceRecord;
import hammerstep.sequence.SequenceRecord.Position;
import hammerstep.sequence.Store;
import hammerstep.station.StationClock;

import java.time.Instant;

/**
 * Where the sequence's typed records become what the journal stores: stamped with the wall-clock
 * time of their {@code atNs} and, for events, worded. The one place the sequence's event texts are
 * written; called by the station loop as it takes a record from the sequence, off the sample path.
 */
public final class SequenceRecords {

    private SequenceRecords() {
    }

    /** {@code r} as the journal stores it, stamped on {@code clock}. */
    public static Store toStore(SequenceRecord r, StationClock clock) {
        Instant at = clock.instantOf(r.atNs());
        if (r instanceof SequenceRecord.JointJudged j) {
            return new Store.Joint(new JointOutcome(j.part().serial(), j.part().model(), j.patternId(),
                    j.position().name(), j.position().number(), j.pass(), j.attempt(), j.result(),
                    j.transducerSerial(), j.calibrationDue(), at, null));
        }
        if (r instanceof SequenceRecord.PartClosed p) {
            return new Store.Part(new PartOutcome(p.part().serial(), p.part().model(), p.patternId(), p.verdict(),
                    p.ended(), p.jointIds(), p.startedNs() == null ? null : clock.instantOf(p.startedNs()), at));
        }
        SequenceRecord.Event e = (SequenceRecord.Event) r;
        return new Store.Event(new StationEvent(e.severity(), e.code(), message(e), e.partSerial(), at));
    }

    /** The event's text for the log, the results and the operator's screen. */
    public static String message(SequenceRecord.Event e) {
        if (e instanceof SequenceRecord.IdentityIgnored x) {
            return "part " + x.partSerial() + " scanned while "
                    + (x.inWork() == null ? "the station is faulted" : "part " + x.inWork() + " is in work");
        }
        if (e instanceof SequenceRecord.UnknownModel x) {
            return "no pattern for model " + x.model();
        }
        if (e instanceof SequenceRecord.PartInterrupted x) {
            int n = x.jointsStored();
            return "part " + x.partSerial() + " was in work when the station stopped (" + n
                    + (n == 1 ? " joint" : " joints") + " stored, no part record): check it,"
                    + " then turn the supervisor key to close it as INTERRUPTED";
        }
        if (e instanceof SequenceRecord.PartEndedByPlant x) {
            return "part " + x.partSerial() + " ended by the plant: " + x.reason();
        }
        if (e instanceof SequenceRecord.UnexpectedRundown x) {
            return "a rundown of " + x.blows() + " blows to " + Math.round(x.finalTorqueNm())
                    + " N·m while no position was prompted";
        }
        if (e instanceof SequenceRecord.WrongPosition x) {
            return "rundown on position " + label(x.position()) + " while " + label(x.prompted()) + " was prompted";
        }
        if (e instanceof SequenceRecord.Loosened x) {
            return x.voided()
                    ? "position " + label(x.position()) + ", judged GO, was loosened"
                    + (x.inferred() ? " (no confirm sensors: taken as the position judged GO last)" : "")
                    + ": it is prompted again and must be tightened again"
                    : "position " + label(x.position()) + " was loosened; it was not judged GO, so nothing is voided";
        }
        if (e instanceof SequenceRecord.SensorFault x) {
            return "torque signal fault " + x.faultNames()
                    + ": tool locked out until the fault clears and the supervisor key is turned";
        }
        if (e instanceof SequenceRecord.SensorFaultCleared) {
            return "torque signal healthy again; lockout released by the supervisor";
        }
        if (e instanceof SequenceRecord.PositionFailed x) {
            return "position " + label(x.position()) + " is NO_GO after " + x.attempts()
                    + (x.attempts() == 1 ? " attempt" : " attempts") + " in pass " + x.pass();
        }
        SequenceRecord.ReworkAcknowledged x = (SequenceRecord.ReworkAcknowledged) e;
        return "NO_GO on position " + label(x.position()) + " acknowledged by the " + x.by();
    }

    private static String label(Position p) {
        return p == null ? "-" : p.number() + " (" + p.name() + ")";
    }
}
