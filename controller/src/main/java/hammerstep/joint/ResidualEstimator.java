package hammerstep.joint;

import hammerstep.signal.BlowShapes;
import hammerstep.signal.SignalFaults;

/**
 * Estimates a joint's residual torque from its blows' shapes ({@link BlowShapes}): the mean torque over
 * the slide of the last {@link #LAST_TURNING} blows that turned the nut is the running torque it turned
 * against; the residual, what a breakaway audit reads, is that times {@link #DEFAULT_FACTOR} (static
 * over sliding friction and the last slide's rise), or the program's calibration from audits.
 * Blows after the last turning one (pressing on a nut that no longer turns) leave the residual as it
 * was and are not used.
 *
 * <p>No estimate, with a reason, where the method does not hold: no turning blow in the rundown,
 * hydraulic pulses (half or more of the last {@link #LAST_SHAPES} blows with a readable shape), a
 * sensor fault. Only the last blows decide on hydraulic pulses: the first lobes of a soft joint's
 * rundown (torque creeping above the floor between blows) can read like a hydraulic tail.
 *
 * <p>Allocation-free per blow; one {@link ResidualEstimate} per rundown. Single-threaded.
 */
public final class ResidualEstimator {

    /** Turning blows averaged, the last ones of the rundown. */
    public static final int LAST_TURNING = 3;
    /**
     * Residual over slide torque, measured on the calibration set (today's simulator presets, every
     * tool but the oil-pulse one on every joint preset); see docs/design.md, "Residual torque estimate".
     */
    public static final double DEFAULT_FACTOR = 1.12;
    /** Half-width of the 95 % band of an uncalibrated estimate, as a fraction of it (same source). */
    public static final double DEFAULT_BAND = 0.031;

    /** Blows with a readable shape whose kinds decide on hydraulic pulses, the last ones of the rundown. */
    public static final int LAST_SHAPES = 4;

    private final double[] slips = new double[LAST_TURNING];
    private final boolean[] hydraulicShapes = new boolean[LAST_SHAPES];
    private int turning;
    private int shaped;

    /** Forgets the rundown before. */
    public void reset() {
        turning = 0;
        shaped = 0;
    }

    /** A blow in the tightening sense; {@code slot} is its lobe in {@code shapes}, or -1 when none was kept. */
    public void onBlow(BlowShapes shapes, int slot) {
        if (slot < 0) {
            return;
        }
        BlowShapes.Kind kind = shapes.kind(slot);
        if (kind == BlowShapes.Kind.UNKNOWN) {
            return;
        }
        hydraulicShapes[shaped % LAST_SHAPES] = kind == BlowShapes.Kind.HYDRAULIC;
        shaped++;
        if (kind == BlowShapes.Kind.TURNING) {
            slips[turning % LAST_TURNING] = shapes.slipNm(slot);
            turning++;
        }
    }

    /** Turning blows so far in this rundown. */
    public int turningBlows() {
        return turning;
    }

    /**
     * The estimate at the end of a rundown with sensor faults {@code faults} (bits of
     * {@link SignalFaults}), calibrated by {@code calibration} when it is not null.
     */
    public ResidualEstimate estimate(int faults, ResidualCalibration calibration) {
        if (faults != 0) {
            return ResidualEstimate.none(ResidualEstimate.Reason.SENSOR_FAULT, turning);
        }
        int last = Math.min(LAST_SHAPES, shaped);
        int hydraulic = 0;
        for (int k = 0; k < last; k++) {
            hydraulic += hydraulicShapes[k] ? 1 : 0;
        }
        if (last > 0 && 2 * hydraulic >= last) {
            return ResidualEstimate.none(ResidualEstimate.Reason.HYDRAULIC_PULSES, turning);
        }
        if (turning == 0) {
            return ResidualEstimate.none(ResidualEstimate.Reason.NO_TURNING_BLOW, 0);
        }
        int used = Math.min(LAST_TURNING, turning);
        double sum = 0;
        for (int k = 0; k < used; k++) {
            sum += slips[(turning - 1 - k) % LAST_TURNING];
        }
        double slip = sum / used;
        double estimate = DEFAULT_FACTOR * slip;
        if (calibration == null) {
            double band = DEFAULT_BAND * estimate;
            return new ResidualEstimate(estimate, estimate - band, estimate + band, estimate, slip, used, turning,
                    false, null);
        }
        double calibrated = calibration.apply(estimate);
        return new ResidualEstimate(calibrated, calibrated - calibration.bandNm(), calibrated + calibration.bandNm(),
                estimate, slip, used, turning, true, null);
    }
}
