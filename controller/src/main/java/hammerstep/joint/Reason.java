package hammerstep.joint;

/** Why a joint is NO-GO. The names are the codes that results carry. */
public enum Reason {
    TORQUE_LOW,
    TORQUE_HIGH,
    BLOWS_FEW,
    BLOWS_MANY,
    TIME_LONG,
    REHIT,
    SENSOR_FAULT,
    /** Set by the station: a rundown on a position other than the prompted one (position confirm sensors). */
    OUT_OF_SEQUENCE,
    /** The rundown's strikes went against the tightening sense: the tool ran in reverse (a loosening). */
    LOOSENED,
    /**
     * Set in replay: the trace ended during the rundown, before it had stayed below its start level for
     * {@code end_after_ms}; its end, and perhaps its last blows, are not in the file. Never GO.
     */
    TRACE_ENDED,
    /**
     * The program judges on the residual-torque estimate ({@code final_torque: residual_estimate}) and the
     * rundown has none (no turning blow, hydraulic pulses, a sensor fault). Never GO.
     */
    RESIDUAL_UNKNOWN
}
