package hammerstep.sim.station;

/**
 * How a scripted operator works and which mistakes they make, per joint (probabilities 0 to 1).
 *
 * @param reactionMs       mean time to notice a lamp and act (scattered ±40 %)
 * @param moveMs           time to put the socket on another position
 * @param releaseAfterMs   how long after the tool stops the trigger is let go
 * @param maxHoldMs        the longest the trigger is held when the tool never stops
 * @param supervisorMs     time for the supervisor to come and turn the key
 * @param skip             goes to another position than the lit one
 * @param rehit            strikes the position just finished once more
 * @param releaseEarly     lets go after one or two blows
 * @param holdTooLong      keeps the trigger pulled well after the tool stopped
 * @param forgetAck        leaves a rework unacknowledged for {@code forgetAckMs}
 * @param loosen           goes back to the position just finished with the tool in reverse and loosens it
 *                         (lets go once the bolt spins free), before the lit one
 */
public record Habits(double reactionMs, double moveMs, double releaseAfterMs, double maxHoldMs, double supervisorMs,
                     double skip, double rehit, double releaseEarly, double holdTooLong, double forgetAck,
                     double forgetAckMs, double loosen) {

    /** Habits of an operator who never loosens a bolt. */
    public Habits(double reactionMs, double moveMs, double releaseAfterMs, double maxHoldMs, double supervisorMs,
                  double skip, double rehit, double releaseEarly, double holdTooLong, double forgetAck,
                  double forgetAckMs) {
        this(reactionMs, moveMs, releaseAfterMs, maxHoldMs, supervisorMs, skip, rehit, releaseEarly, holdTooLong,
                forgetAck, forgetAckMs, 0);
    }

    /** A careful operator who makes no mistakes. */
    public static Habits careful() {
        return new Habits(400, 700, 150, 4000, 5000, 0, 0, 0, 0, 0, 0);
    }

    public Habits {
        for (double p : new double[] {skip, rehit, releaseEarly, holdTooLong, forgetAck, loosen}) {
            if (!(p >= 0 && p <= 1)) {
                throw new IllegalArgumentException("a mistake's probability must lie in [0, 1]: " + p);
            }
        }
    }
}
