package hammerstep.joint;

/** Why a joint is NO-GO. The names are the codes that results carry. */
public enum Reason {
    TORQUE_LOW,
    TORQUE_HIGH,
    BLOWS_FEW,
    BLOWS_MANY,
    TIME_LONG,
    REHIT,
    SENSOR_FAULT
}
