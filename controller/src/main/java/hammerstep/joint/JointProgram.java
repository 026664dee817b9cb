package hammerstep.joint;

/**
 * What the line engineer set for one joint: the windows a rundown is judged against and the
 * thresholds that find blows and rundowns in the signal. All torques in N·m, times in ms.
 *
 * @param id          program name as written in the file
 * @param revision    content hash of the program file as loaded ("" for programs built in code)
 * @param shutoffAtNm torque at which tool enable drops; {@code NaN} when the program sets none
 * @param rehitBlows  reaching {@code torque.min} within this many blows marks a rehit; 0 disables
 * @param leftHand    a left-hand thread ({@code thread: left}): the fastener tightens counter-clockwise, so
 *                    the transducer reads its strikes negative. The monitor flips the sign: torques,
 *                    peaks and windows stay in the tightening sense (positive), a loosening's peaks negative
 * @param residualCalibration the residual estimate's calibration from audits ({@code residual_calibration});
 *                    null when the program carries none (the default factor and band apply)
 */
public record JointProgram(
        String id,
        String revision,
        Torque torque,
        FinalTorque finalTorque,
        Blows blows,
        Rundown rundown,
        double shutoffAtNm,
        int rehitBlows,
        boolean leftHand,
        ResidualCalibration residualCalibration) {

    /** A program without a residual calibration. */
    public JointProgram(String id, String revision, Torque torque, FinalTorque finalTorque, Blows blows,
                        Rundown rundown, double shutoffAtNm, int rehitBlows, boolean leftHand) {
        this(id, revision, torque, finalTorque, blows, rundown, shutoffAtNm, rehitBlows, leftHand, null);
    }

    /** A program for a right-hand thread (the common case). */
    public JointProgram(String id, String revision, Torque torque, FinalTorque finalTorque, Blows blows,
                        Rundown rundown, double shutoffAtNm, int rehitBlows) {
        this(id, revision, torque, finalTorque, blows, rundown, shutoffAtNm, rehitBlows, false, null);
    }

    /** +1 for a right-hand thread, -1 for a left-hand one: the transducer's sign of a tightening strike. */
    public float tighteningSign() {
        return leftHand ? -1f : 1f;
    }

    /** Default fastest plausible blow rate, per minute, from which the dead time follows. */
    public static final double DEFAULT_MAX_RATE_PER_MIN = 4000.0;

    /** Torque window; the final torque must lie in [min, max]. */
    public record Torque(double minNm, double targetNm, double maxNm) { }

    /**
     * Blow detection and the blow-count window.
     *
     * @param countAboveNm  a pulse whose torque reaches this is a blow
     * @param releaseBelowNm a pulse ends when torque falls below this (hysteresis)
     * @param deadTimeMs    after a blow starts, lobes within this time belong to the same strike
     */
    public record Blows(double countAboveNm, double releaseBelowNm, int min, int max, double deadTimeMs) { }

    /**
     * Rundown segmentation.
     *
     * @param startAboveNm a rundown starts when torque reaches this
     * @param endAfterMs   and ends when torque has stayed below it this long
     * @param maxMs        a rundown longer than this is cut and judged {@code TIME_LONG}
     */
    public record Rundown(double startAboveNm, double endAfterMs, double maxMs) { }

    public boolean hasShutoff() {
        return !Double.isNaN(shutoffAtNm);
    }

    /** Dead time for a fastest blow rate: half the shortest blow interval. */
    public static double deadTimeMsFor(double maxRatePerMin) {
        return 0.5 * 60_000.0 / maxRatePerMin;
    }
}
