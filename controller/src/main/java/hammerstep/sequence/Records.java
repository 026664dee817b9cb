package hammerstep.sequence;

import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;
import hammerstep.station.PartIdentity;
import hammerstep.station.StationClock;

import java.time.Instant;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.List;

/**
 * The records the {@link Sequence} asks the station to store, oldest first, each stamped with the
 * wall-clock time of its {@code nowNs}: joint results with their position, pass, attempt and the
 * fitted transducer; part records; station events. The sequence decides what to record; this class
 * only builds, stamps and queues.
 */
final class Records {

    private final StationClock clock;
    private final Sequence.Settings settings;
    private final ArrayDeque<Store> queue = new ArrayDeque<>();

    Records(StationClock clock, Sequence.Settings settings) {
        this.clock = clock;
        this.settings = settings;
    }

    /** The oldest record not yet stored, or null. */
    Store peek() {
        return queue.peek();
    }

    /** Takes the oldest record off the queue (it was stored). */
    Store poll() {
        return queue.poll();
    }

    /** A judged joint on position {@code pos} (0-based) of {@code pattern}. */
    void joint(PartIdentity part, Pattern pattern, int pos, String passName, int attempt, JointResult result,
               long nowNs) {
        queue.add(new Store.Joint(new JointOutcome(part.serial(), part.model(), pattern.id(),
                pattern.positions().get(pos), pos + 1, passName, attempt, result,
                settings.transducerSerial(), settings.calibrationDue(), clock.instantOf(nowNs), null)));
    }

    /** The record of a part that ended; {@code started} is null when it is not known. */
    void part(PartIdentity part, String patternId, String verdict, String ended, List<String> jointIds,
              Instant started, long nowNs) {
        queue.add(new Store.Part(new PartOutcome(part.serial(), part.model(), patternId, verdict, ended, jointIds,
                started, clock.instantOf(nowNs))));
    }

    /** A station event; {@code serial} is the part it concerns, or null. */
    void event(StationEvent.Severity severity, String code, String message, String serial, long nowNs) {
        queue.add(new Store.Event(new StationEvent(severity, code, message, serial, clock.instantOf(nowNs))));
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
