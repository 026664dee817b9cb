package hammerstep.results;

import hammerstep.joint.JointResult;

import java.time.Instant;
import java.time.LocalDate;

/**
 * A judged joint with the context the station knows: which part, which position of which pattern,
 * which pass, which attempt.
 *
 * @param position      the position's label in the pattern
 * @param positionIndex 1-based position number in the pattern
 * @param pass          the pass's name (e.g. snug, final)
 * @param attempt       1 for the first rundown on this position in this pass, then 2, 3, ...
 * @param at            wall-clock time (UTC) of the verdict
 * @param tracePath     where the joint's torque trace is kept, or null when none is stored
 */
public record JointOutcome(
        String partSerial,
        String partModel,
        String pattern,
        String position,
        int positionIndex,
        String pass,
        int attempt,
        JointResult result,
        String transducerSerial,
        LocalDate calibrationDue,
        Instant at,
        String tracePath) {
}
