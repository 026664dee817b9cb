package hammerstep.sim.physics;

import java.util.SplittableRandom;

/**
 * The nut (with socket, extension, transducer rotor and anvil lumped on it) turning on its joint.
 * Stuck, it stays put until the train torque exceeds its holding torque (static friction:
 * {@code staticFrictionRatio} times the running torque, scattered from blow to blow); turning, it
 * accelerates under train torque less running torque and sticks again when it stops. Threads are
 * self-locking: nothing but the tool turns it backwards.
 *
 * <p>Loosening (the tool in reverse): the train torque then acts backwards. The nut resists with
 * {@link #LOOSENING_RATIO} of the running torque at its angle (the thread's pitch helps it off), held by
 * static friction as when tightening; turning back, it gives up its clamp angle, so the resistance
 * falls to the prevailing torque once the clamp load is gone.
 *
 * <p>Relaxation: while the fastener rests, embedding takes back a part of the angle that makes
 * clamp load, approaching {@code relaxationLoss} of it with the relaxation time constant.
 *
 * <p>Yield ({@link Bolt}): the clamp load is elastic–plastic in the clamp angle. Elastic it rises at the
 * joint's rate; at the bolt's yield load the bolt takes a permanent set and hardens (Voce) toward its
 * saturation load. The running torque follows the clamp load (T = K·F·d), so the torque-angle curve
 * flattens and the nut keeps turning under the blows. Turning back, the bolt unloads elastically.
 */
final class Fastener {

    /**
     * Loosening torque over tightening torque at the same clamp load: T = F·(±P/2π + μ·d₂/(2 cos 30°) +
     * μ_b·D_b/2), the pitch term changing sign. With M12×1.75, μ = μ_b = 0.14 it comes to about 0.76
     * (thread-torque relation, textbook; figures ours, from memory of the usual coefficients).
     */
    static final double LOOSENING_RATIO = 0.76;

    private final double inertia;
    private final double invInertia;
    private final SplittableRandom random;
    private JointSpec joint;
    private double invRelaxS;

    private double angle;
    private double speed;
    private boolean stuck = true;
    private boolean reverse;
    private double frictionScale = 1.0;
    private double holdScale = 1.0;
    private double embeddedRad;
    /** Permanent set of the bolt, in nut angle, rad. */
    private double plasticRad;
    private double clampRate;
    private double yieldN;
    private double hardenSpanN;
    private double hardenScaleRad;
    private double jointWorkJ;
    private double restS;

    Fastener(JointSpec joint, double inertiaKgM2, SplittableRandom random) {
        this.inertia = inertiaKgM2;
        this.invInertia = 1.0 / inertiaKgM2;
        this.random = random;
        renew(joint);
    }

    /** A new fastener of {@code joint}: loose, at angle zero, with its own friction. */
    void renew(JointSpec joint) {
        this.joint = joint;
        this.invRelaxS = 1.0 / (joint.relaxationTimeConstantMs() * 1e-3);
        this.clampRate = joint.clampRateNPerRad();
        Bolt bolt = joint.bolt();
        this.yieldN = bolt == null ? Double.POSITIVE_INFINITY : bolt.yieldLoadN();
        this.hardenSpanN = bolt == null ? 0.0 : bolt.saturationLoadN() - bolt.yieldLoadN();
        this.hardenScaleRad = hardenSpanN / (Bolt.HARDENING * clampRate);
        plasticRad = 0;
        angle = 0;
        speed = 0;
        stuck = true;
        reverse = false;
        embeddedRad = 0;
        jointWorkJ = 0;
        restS = 0;
        frictionScale = Math.max(0.5, 1.0 + joint.frictionScatter() * random.nextGaussian());
        drawHold();
    }

    private void drawHold() {
        holdScale = joint.blowScatter() > 0 ? Math.max(0.8, 1.0 + joint.blowScatter() * random.nextGaussian()) : 1.0;
    }

    /** Running torque at the present angle, N·m, with this fastener's friction and embedding. */
    double runningTorqueNm() {
        double f = clampLoadN();
        double nominal = joint.prevailingTorqueNm() + (f > 0 ? f * joint.kFactor() * joint.diameterM() : 0.0);
        return frictionScale * nominal;
    }

    /** Load the yielded bolt holds at a permanent set of {@code plastic} rad: the hardening curve, N. */
    private double flowLoadN(double plastic) {
        return yieldN + hardenSpanN * (1.0 - Math.exp(-plastic / hardenScaleRad));
    }

    /** After the nut turned: past the flow load, the bolt takes a permanent set (return mapping). */
    private void yieldBolt() {
        if (joint.bolt() == null) {
            return;
        }
        double clampAngle = angle - joint.freeAngleRad() - embeddedRad;
        if (clampRate * (clampAngle - plasticRad) <= flowLoadN(plasticRad)) {
            return;
        }
        // Newton on k·(u − p) = flow(p); the flow curve is smooth and rising, two steps suffice
        for (int i = 0; i < 3; i++) {
            double g = clampRate * (clampAngle - plasticRad) - flowLoadN(plasticRad);
            double slope = clampRate + hardenSpanN / hardenScaleRad * Math.exp(-plasticRad / hardenScaleRad);
            plasticRad += g / slope;
        }
    }

    /** Whether the bolt has yielded (taken a permanent set). */
    boolean yielded() {
        return plasticRad > 0;
    }

    /** Which way the tool turns the nut from now on; the nut must be at rest. */
    void setReverse(boolean reverse) {
        this.reverse = reverse;
        speed = 0;
        stuck = true;
    }

    /**
     * Advances by {@code h} under {@code trainNm}, the train torque in the tool's sense (forward when
     * tightening, backward in reverse): the nut's {@link #speedRadS()} is in that sense too.
     */
    void advance(double h, double trainNm) {
        double running = reverse ? LOOSENING_RATIO * runningTorqueNm() : runningTorqueNm();
        if (stuck) {
            if (trainNm <= joint.staticFrictionRatio() * holdScale * running) {
                restS += h;
                relax(h);
                return;
            }
            stuck = false;
        }
        speed += h * (trainNm - running) * invInertia;
        if (speed <= 0) {
            speed = 0;
            stuck = true;
            restS = 0;
            drawHold();
            return;
        }
        angle += reverse ? -h * speed : h * speed;
        jointWorkJ += running * speed * h;
        if (!reverse) {
            yieldBolt();
        }
    }

    private void relax(double h) {
        // embedding takes back a part of the elastic clamp angle (the clamp load), not of the bolt's set
        double clampAngle = angle - joint.freeAngleRad() - plasticRad;
        if (clampAngle <= 0 || joint.relaxationLoss() <= 0) {
            return;
        }
        double target = joint.relaxationLoss() * clampAngle;
        embeddedRad += (target - embeddedRad) * h * invRelaxS;
    }

    double angleRad() {
        return angle;
    }

    /** Speed in the tool's sense (never negative). */
    double speedRadS() {
        return speed;
    }

    boolean reverse() {
        return reverse;
    }

    /** Torque to start the fastener turning further now (first movement), N·m. */
    double residualTorqueNm() {
        return joint.staticFrictionRatio() * runningTorqueNm();
    }

    /**
     * Clamp load now, N: the joint's rate from T = K·F·d (nominal torque coefficient) on the clamp angle
     * less embedding and the bolt's permanent set.
     */
    double clampLoadN() {
        double past = angle - joint.freeAngleRad() - embeddedRad - plasticRad;
        return past > 0 ? clampRate * past : 0.0;
    }

    double kineticJ() {
        return 0.5 * inertia * speed * speed;
    }

    /** Work the fastener did against its running torque (thread and head friction, clamping), J. */
    double jointWorkJ() {
        return jointWorkJ;
    }

    JointSpec joint() {
        return joint;
    }
}
