package hammerstep.sequence;

/** Where the sequence stands. */
public enum Phase {
    /** No part: ready for the next one (white). */
    WAITING,
    /** A position is prompted and the tool is enabled (blue, the position's lamp blinking). */
    PROMPT,
    /** A rundown is under way on the prompted position. */
    RUNDOWN,
    /** The rundown was judged; its result is being stored, the verdict is not shown yet. */
    STORING,
    /** A position came out NO-GO: tool disabled until the rework is acknowledged (red, blue blinking). */
    REWORK,
    /**
     * The part cannot end GO (rejected, or interrupted by a stop of the station): tool disabled until
     * the supervisor key ends it (red blinking).
     */
    REJECTED,
    /** Every position passed every pass (green). */
    COMPLETE,
    /** A result could not be stored: tool disabled until the supervisor key retries (red and yellow blinking). */
    FAULT
}
