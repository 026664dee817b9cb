package hammerstep.sequence;

import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.station.PartIdentity;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.List;

/**
 * The records the {@link Sequence} asks the station to store, oldest first, each with the station-clock
 * time it was made at: joint results with their position, pass, attempt and the fitted transducer;
 * part records; events. The sequence decides what to record; this class only builds and queues.
 */
final class Records {

    private final Sequence.Settings settings;
    private final ArrayDeque<SequenceRecord> queue = new ArrayDeque<>();

    Records(Sequence.Settings settings) {
        this.settings = settings;
    }

    /** The oldest record not yet stored, or null. */
    SequenceRecord peek() {
        return queue.peek();
    }

    /** Takes the oldest record off the queue (it was stored). */
    SequenceRecord poll() {
        return queue.poll();
    }

    /** A judged joint on position {@code pos} (0-based) of {@code pattern}. */
    void joint(PartIdentity part, Pattern pattern, int pos, String passName, int attempt, JointResult result,
               long nowNs) {
        queue.add(new SequenceRecord.JointJudged(part, pattern.id(), position(pattern, pos), passName, attempt,
                result, settings.transducerSerial(), settings.calibrationDue(), nowNs));
    }

    /** The record of a part that ended; {@code startedNs} is null when the start is not known. */
    void part(PartIdentity part, String patternId, String verdict, String ended, List<String> jointIds,
              Long startedNs, long nowNs) {
        queue.add(new SequenceRecord.PartClosed(part, patternId, verdict, ended, jointIds, startedNs, nowNs));
    }

    /** An event of the sequence. */
    void event(SequenceRecord.Event event) {
        queue.add(event);
    }

    /** Position {@code pos} (0-based) of {@code pattern}, or null for none ({@code pos < 0}). */
    static SequenceRecord.Position position(Pattern pattern, int pos) {
        return pos < 0 ? null : new SequenceRecord.Position(pos + 1, pattern.positions().get(pos));
    }

    /** {@code r} turned NO-GO with {@code reason} added to its reasons. */
    static JointResult withReason(JointResult r, Reason reason) {
        List<Reason> reasons = new ArrayList<>(r.reasons());
        reasons.add(reason);
        return new JointResult(r.program(), r.startNs(), r.endNs(), r.blows(), r.peaksNm(), r.peakTimesNs(),
                r.widthsMs(), r.impulsesNms(), r.finalTorqueNm(), r.durationMs(), r.shutoffAtNs(),
                r.blowsAfterShutoff(), r.faults(), Verdict.NO_GO, List.copyOf(reasons), r.direction(),
                r.rejectedImpulses(), r.residual());
    }
}
