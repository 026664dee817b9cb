package hammerstep.sim.physics;

/**
 * A modelled bolted joint, as the fastener's torque-angle behaviour. Before seating the nut turns
 * against its prevailing torque; from the snug point torque rises linearly at
 * {@code (fullTorqueNm - prevailingTorqueNm) / angleToFullRad}. The fastener turns only when the
 * torque on it exceeds the static holding torque ({@code staticFrictionRatio} times the running
 * torque); while it turns, the running torque resists. Clamp load follows {@code T = K·F·d}.
 *
 * @param name                 preset name or file
 * @param prevailingTorqueNm   running torque before seating (thread drag, locking element)
 * @param freeAngleRad         rotation from start to the snug point
 * @param fullTorqueNm         torque reached {@code angleToFullRad} after seating
 * @param angleToFullRad       rotation from snug to full torque (ISO 5393: about 30° hard, 720° soft)
 * @param staticFrictionRatio  breakaway over running torque (≥ 1)
 * @param frictionScatter      1-sigma relative scatter of the torque coefficient from fastener to fastener
 * @param blowScatter          1-sigma relative scatter of the holding torque from blow to blow
 * @param kFactor              nut factor K of T = K·F·d
 * @param diameterM            nominal thread diameter d
 * @param relaxationLoss       fraction of clamp load lost to embedding once the fastener rests
 * @param relaxationTimeConstantMs time constant of that loss
 * @param bolt                 the bolt (size and ISO 898-1 property class) that yields; {@code null}: an
 *                             elastic bolt that never yields (a joint file without a {@code bolt} section)
 * @param friction             the friction law of thread and bearing face with its lubrication state
 *                             (docs/simulator.md, "Friction"); {@code null}: the single torque coefficient K with
 *                             {@code staticFrictionRatio} and {@code frictionScatter} (a joint file that names no
 *                             {@code friction.model}). With a law, {@code kFactor} still sets the joint's clamp
 *                             rate (full torque at K), but torque follows the drawn coefficients.
 */
public record JointSpec(String name, double prevailingTorqueNm, double freeAngleRad, double fullTorqueNm,
                        double angleToFullRad, double staticFrictionRatio, double frictionScatter, double blowScatter,
                        double kFactor, double diameterM, double relaxationLoss, double relaxationTimeConstantMs,
                        Bolt bolt, FrictionSpec friction) {

    /** A joint with the single torque coefficient (no friction law). */
    public JointSpec(String name, double prevailingTorqueNm, double freeAngleRad, double fullTorqueNm,
                     double angleToFullRad, double staticFrictionRatio, double frictionScatter, double blowScatter,
                     double kFactor, double diameterM, double relaxationLoss, double relaxationTimeConstantMs,
                     Bolt bolt) {
        this(name, prevailingTorqueNm, freeAngleRad, fullTorqueNm, angleToFullRad, staticFrictionRatio, frictionScatter,
                blowScatter, kFactor, diameterM, relaxationLoss, relaxationTimeConstantMs, bolt, null);
    }

    /** This joint under another friction law ({@code null}: the single torque coefficient), named {@code newName}. */
    public JointSpec withFriction(String newName, FrictionSpec law) {
        return new JointSpec(newName, prevailingTorqueNm, freeAngleRad, fullTorqueNm, angleToFullRad,
                staticFrictionRatio, frictionScatter, blowScatter, kFactor, diameterM, relaxationLoss,
                relaxationTimeConstantMs, bolt, law);
    }

    /** Clamp load per radian past the snug point while the bolt is elastic, N/rad (from T = K·F·d). */
    public double clampRateNPerRad() {
        return rateNmPerRad() / (kFactor * diameterM);
    }

    /** Torque rise per radian after seating, at the nominal torque coefficient. */
    public double rateNmPerRad() {
        return (fullTorqueNm - prevailingTorqueNm) / angleToFullRad;
    }

    /** Running torque at a fastener angle (radians from start), at the nominal torque coefficient. */
    public double runningTorqueNm(double angleRad) {
        double past = angleRad - freeAngleRad;
        return past <= 0 ? prevailingTorqueNm : prevailingTorqueNm + rateNmPerRad() * past;
    }

    /**
     * Clamp load for a running torque, N, from T = K·F·d (the prevailing part clamps nothing), elastic
     * bolt (the fastener applies yield).
     */
    public double clampLoadN(double torqueNm) {
        return Math.max(0.0, torqueNm - prevailingTorqueNm) / (kFactor * diameterM);
    }
}
