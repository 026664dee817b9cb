package hammerstep.sim.physics;

import java.util.SplittableRandom;

/**
 * One fastener's friction under a {@link FrictionSpec}: its drawn coefficients for thread and bearing face
 * (static and kinetic) and the law that gives the coefficient in use, as a function of rest time (stuck) or
 * slip speed and slip since breakaway (turning). Coefficients only; {@link ThreadGeometry#torqueNm} makes
 * torque of them. The prevailing torque (thread drag of a locking element) scales with the thread's
 * coefficient in use over its kinetic one.
 *
 * <p>No allocation after construction; single-threaded, as the fastener.
 */
final class JointFriction {

    private FrictionSpec spec;
    private ThreadGeometry geometry;
    private double threadKinetic;
    private double threadStatic;
    private double headKinetic;
    private double headStatic;
    private double viscousPerMps;
    /** Coefficients at the last breakaway: where the turning law starts. */
    private double threadBreak;
    private double headBreak;

    /** Draws this fastener's coefficients. */
    void renew(FrictionSpec spec, ThreadGeometry geometry, SplittableRandom random) {
        this.spec = spec;
        this.geometry = geometry;
        threadKinetic = spec.drawKinetic(random);
        threadStatic = threadKinetic * spec.drawStaticRatio(random);
        headKinetic = spec.drawKinetic(random);
        headStatic = headKinetic * spec.drawStaticRatio(random);
        viscousPerMps = spec.lubrication().viscousPerMps();
        threadBreak = threadStatic;
        headBreak = headStatic;
    }

    /** Sets the coefficients outright (tests with a hand-worked case). */
    void set(FrictionSpec spec, ThreadGeometry geometry, double threadKinetic, double threadStatic, double headKinetic,
             double headStatic) {
        this.spec = spec;
        this.geometry = geometry;
        this.threadKinetic = threadKinetic;
        this.threadStatic = threadStatic;
        this.headKinetic = headKinetic;
        this.headStatic = headStatic;
        this.viscousPerMps = spec.lubrication().viscousPerMps();
        threadBreak = threadStatic;
        headBreak = headStatic;
    }

    ThreadGeometry geometry() {
        return geometry;
    }

    double threadKinetic() {
        return threadKinetic;
    }

    double threadStatic() {
        return threadStatic;
    }

    double headKinetic() {
        return headKinetic;
    }

    double headStatic() {
        return headStatic;
    }

    /** Static coefficient of the thread after {@code restS} at rest. */
    double threadStaticAfter(double restS) {
        return staticAfter(threadKinetic, threadStatic, restS);
    }

    /** Static coefficient of the bearing face after {@code restS} at rest. */
    double headStaticAfter(double restS) {
        return staticAfter(headKinetic, headStatic, restS);
    }

    /**
     * Stick–slip: static friction grows with rest from kinetic toward its drawn static value,
     * {@code μ_s(t) = μ_k + (μ_s − μ_k)·(1 − exp(−(t/τ)^m))}; the other laws hold their static value at once.
     */
    private double staticAfter(double kinetic, double stat, double restS) {
        if (spec.model() != FrictionSpec.Model.STICK_SLIP) {
            return stat;
        }
        if (restS <= 0) {
            return kinetic;
        }
        double x = Math.pow(restS / FrictionSpec.DWELL_TIME_CONSTANT_S, FrictionSpec.DWELL_EXPONENT);
        return kinetic + (stat - kinetic) * (1.0 - Math.exp(-x));
    }

    /** The nut breaks away with these coefficients (static, perhaps scaled from blow to blow): the turning law starts from them. */
    void breakAway(double thread, double head) {
        threadBreak = thread;
        headBreak = head;
    }

    /** Thread coefficient while turning at {@code speedRadS} with {@code slipRad} turned since breakaway. */
    double threadTurning(double speedRadS, double slipRad) {
        double r = 0.5e-3 * geometry.pitchDiameterMm();
        return turning(threadKinetic, threadBreak, speedRadS * r, slipRad * r);
    }

    /** Bearing-face coefficient while turning. */
    double headTurning(double speedRadS, double slipRad) {
        double r = 0.5e-3 * geometry.bearingDiameterMm();
        return turning(headKinetic, headBreak, speedRadS * r, slipRad * r);
    }

    /**
     * Coulomb: kinetic. Stribeck: {@code μ_k + (μ_break − μ_k)·exp(−(v/v_s)²) + c_v·v}. Stick–slip:
     * {@code μ_k + (μ_break − μ_k)·exp(−s/s_c)}, s the slip since breakaway (the breakaway overshoot).
     */
    private double turning(double kinetic, double atBreak, double slipSpeedMps, double slipM) {
        switch (spec.model()) {
            case STRIBECK: {
                double u = slipSpeedMps / FrictionSpec.STRIBECK_SPEED_M_S;
                return kinetic + (atBreak - kinetic) * Math.exp(-u * u) + viscousPerMps * slipSpeedMps;
            }
            case STICK_SLIP:
                return kinetic + (atBreak - kinetic) * Math.exp(-slipM / FrictionSpec.SLIP_MEMORY_M);
            default:
                return kinetic;
        }
    }

    /** Prevailing torque at a thread coefficient: the joint's figure is at the kinetic one. */
    double prevailingNm(double prevailingNm, double threadCoefficient) {
        return prevailingNm * threadCoefficient / threadKinetic;
    }
}
