package hammerstep.joint;

/**
 * Which way a rundown's strikes turned the fastener, in the program's sense (a left-hand program
 * flips the sign of the signal, see {@link JointProgram#leftHand()}).
 */
public enum Direction {
    /** Strikes in the tightening sense: judged against the program's windows. */
    TIGHTEN,
    /** The tool in reverse: its strikes go against the tightening sense. Never GO ({@link Reason#LOOSENED}). */
    LOOSEN;

    /** The name results carry: {@code tighten} or {@code loosen}. */
    public String key() {
        return this == TIGHTEN ? "tighten" : "loosen";
    }
}
