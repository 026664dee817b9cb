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
 *
 * <p>A joint that names a friction law ({@link JointSpec#friction()}, docs/simulator.md "Friction") replaces
 * the single torque coefficient by thread and bearing-face friction: {@link JointFriction} gives the
 * coefficients in use (static at rest, after the rest time; turning, by slip speed and slip since breakaway)
 * and {@link ThreadGeometry#torqueNm} the torque at the clamp load, with the pitch term's sign changing when
 * loosening. The blow-to-blow scatter then scales the static coefficients; {@code frictionScatter} and
 * {@code staticFrictionRatio} are not used.
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
    /** The joint's friction law; null: the single torque coefficient (the law of joints without one). */
    private final JointFriction friction = new JointFriction();
    private boolean modelled;
    private ThreadGeometry geometry;
    /** Rotation since the last breakaway, rad (the stick–slip law's slip). */
    private double slipRad;

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
        slipRad = 0;
        modelled = joint.friction() != null;
        if (modelled) {
            geometry = ThreadGeometry.of(joint);
            if (geometry == null) {
                throw new IllegalArgumentException("joint " + joint.name() + ": a friction law needs an ISO metric size M6 to M30");
            }
            friction.renew(joint.friction(), geometry, random);
            frictionScale = 1.0;
        } else {
            frictionScale = Math.max(0.5, 1.0 + joint.frictionScatter() * random.nextGaussian());
        }
        drawHold();
    }

    private void drawHold() {
        holdScale = joint.blowScatter() > 0 ? Math.max(0.8, 1.0 + joint.blowScatter() * random.nextGaussian()) : 1.0;
    }

    /**
     * Running torque at the present angle, N·m, with this fastener's friction and embedding; under a friction
     * law, at the kinetic coefficients (slow, steady turning).
     */
    double runningTorqueNm() {
        if (modelled) {
            double th = friction.threadKinetic();
            return friction.prevailingNm(joint.prevailingTorqueNm(), th)
                    + geometry.torqueNm(clampLoadN(), th, friction.headKinetic(), false);
        }
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
        if (modelled) {
            advanceModelled(h, trainNm);
            return;
        }
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

    /** {@link #advance} under the joint's friction law. */
    private void advanceModelled(double h, double trainNm) {
        double f = clampLoadN();
        if (stuck) {
            // below the torque at the kinetic coefficients nothing breaks away whatever the rest: no pow, no exp
            double thK = friction.threadKinetic();
            double floor = friction.prevailingNm(joint.prevailingTorqueNm(), thK)
                    + geometry.torqueNm(f, thK, friction.headKinetic(), reverse);
            if (trainNm <= floor) {
                restS += h;
                relax(h);
                return;
            }
            double th = Math.max(thK, holdScale * friction.threadStaticAfter(restS));
            double hd = Math.max(friction.headKinetic(), holdScale * friction.headStaticAfter(restS));
            double hold = friction.prevailingNm(joint.prevailingTorqueNm(), th) + geometry.torqueNm(f, th, hd, reverse);
            if (trainNm <= hold) {
                restS += h;
                relax(h);
                return;
            }
            friction.breakAway(th, hd);
            slipRad = 0;
            stuck = false;
        }
        double th = friction.threadTurning(speed, slipRad);
        double running = friction.prevailingNm(joint.prevailingTorqueNm(), th)
                + geometry.torqueNm(f, th, friction.headTurning(speed, slipRad), reverse);
        speed += h * (trainNm - running) * invInertia;
        if (speed <= 0) {
            speed = 0;
            stuck = true;
            restS = 0;
            drawHold();
            return;
        }
        double turned = h * speed;
        angle += reverse ? -turned : turned;
        slipRad += turned;
        jointWorkJ += running * turned;
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

    /**
     * Residual torque, N·m. Under a friction law: what a breakaway audit reads (docs/simulator.md, "Residual
     * torque"): the torque at first movement in the tightening direction, static friction of thread and bearing
     * face after {@link FrictionSpec#AUDIT_DWELL_S} of rest (or the rest so far, if longer), at the clamp load
     * left once embedding has run its course. Without one: the static ratio times the running torque now.
     */
    double residualTorqueNm() {
        if (!modelled) {
            return joint.staticFrictionRatio() * runningTorqueNm();
        }
        double dwell = Math.max(restS, FrictionSpec.AUDIT_DWELL_S);
        double th = friction.threadStaticAfter(dwell);
        return friction.prevailingNm(joint.prevailingTorqueNm(), th)
                + geometry.torqueNm(relaxedClampLoadN(), th, friction.headStaticAfter(dwell), false);
    }

    /** Clamp load once embedding has taken its full share of the elastic clamp angle, N. */
    double relaxedClampLoadN() {
        double elastic = angle - joint.freeAngleRad() - plasticRad;
        if (elastic <= 0) {
            return 0.0;
        }
        double embedded = Math.max(embeddedRad, joint.relaxationLoss() * elastic);
        return Math.max(0.0, clampRate * (elastic - embedded));
    }

    /** This fastener's friction coefficients (under a friction law; meaningless without one). */
    JointFriction friction() {
        return friction;
    }

    /** Whether the joint names a friction law. */
    boolean modelled() {
        return modelled;
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
