package hammerstep.joint;

import java.util.List;

/** How a rundown's final torque is taken from its blow peaks. */
public enum FinalTorque {
    /** The highest blow peak. */
    MAX_PEAK("max_peak"),
    /** The peak of the last blow. */
    LAST_PEAK("last_peak"),
    /** The mean of the last three peaks (of all of them when fewer). */
    MEAN_LAST_3("mean_last_3"),
    /**
     * The residual-torque estimate ({@link ResidualEstimator}); a rundown without one is NO-GO
     * {@link Reason#RESIDUAL_UNKNOWN}, never GO.
     */
    RESIDUAL_ESTIMATE("residual_estimate");

    private final String key;

    FinalTorque(String key) {
        this.key = key;
    }

    /** The name used in program files. */
    public String key() {
        return key;
    }

    public static List<String> keys() {
        return List.of(MAX_PEAK.key, LAST_PEAK.key, MEAN_LAST_3.key, RESIDUAL_ESTIMATE.key);
    }

    public static FinalTorque ofKey(String key) {
        for (FinalTorque f : values()) {
            if (f.key.equals(key)) {
                return f;
            }
        }
        throw new IllegalArgumentException("unknown final_torque: " + key);
    }
}
