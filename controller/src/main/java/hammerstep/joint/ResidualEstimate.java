package hammerstep.joint;

/**
 * The residual (installed) torque of a joint estimated from its blows' shapes, with its 95 % band, or
 * the reason there is none. See {@link ResidualEstimator} for the method and docs/design.md for where
 * the default factor and band come from.
 *
 * @param torqueNm       the estimate, N·m (after the program's calibration when it carries one); NaN when none
 * @param lowNm          lower end of the 95 % band, N·m; NaN when none
 * @param highNm         upper end of the 95 % band, N·m; NaN when none
 * @param uncalibratedNm the estimate by the default factor alone (what audits are fitted against); NaN when none
 * @param slipNm         the measured figure: mean torque over the slide of the last turning blows, N·m; NaN when none
 * @param blowsUsed      turning blows the estimate rests on (at most {@link ResidualEstimator#LAST_TURNING})
 * @param turningBlows   blows of the rundown whose shape says they turned the nut
 * @param calibrated     true when the program's calibration (from audits) was applied
 * @param reason         why there is no estimate; null when there is one
 */
public record ResidualEstimate(double torqueNm, double lowNm, double highNm, double uncalibratedNm, double slipNm,
                               int blowsUsed, int turningBlows, boolean calibrated, Reason reason) {

    /** Why a rundown has no residual estimate. The names are the codes results carry. */
    public enum Reason {
        /** No blow turned the nut: its residual cannot be read from blows that only pressed on it. */
        NO_TURNING_BLOW,
        /** The pulses are hydraulic (oil-pulse tool): their shape does not show the nut sliding. */
        HYDRAULIC_PULSES,
        /** A sensor fault during the rundown: the shapes cannot be trusted. */
        SENSOR_FAULT
    }

    /** No estimate, for {@code reason}. */
    public static ResidualEstimate none(Reason reason, int turningBlows) {
        return new ResidualEstimate(Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, 0, turningBlows,
                false, reason);
    }

    /** True when there is an estimate. */
    public boolean present() {
        return reason == null;
    }
}
