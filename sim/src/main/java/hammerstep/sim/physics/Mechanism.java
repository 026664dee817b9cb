package hammerstep.sim.physics;

/**
 * The impact mechanism and the bodies it drives, integrated with the semi-implicit (symplectic)
 * Euler method: torques from the state at the start of a step, then velocities, then angles with
 * the new velocities. The train torque couples the mechanism to the fastener: it is computed once
 * per step by {@link #trainTorque} and handed to {@link #advance} as the reaction.
 *
 * <p>A <em>blow</em> (docs/simulator.md, "What a blow is") is a contact episode of the striker on the
 * anvil ({@link #inContact}); episodes apart less than the mechanism's re-contact time
 * ({@link #recontactS()}) are one blow. The rig takes the highest train torque of a blow as its peak.
 * A <em>release</em> (the cam letting the hammer go forward over a jaw, the twin hammers swinging out,
 * a sealing window beginning) does not bound a blow; it marks a blow cut short when it comes in
 * mid-strike.
 *
 * <p>The mechanism books the work its drive does; the rig books the work done on the train. Single-threaded; allocation-free after construction.
 */
abstract sealed class Mechanism permits CamMechanism, JawStriker, OilPulseMechanism {

    protected final Drive drive;
    /** Stiffness of the train from the striking face to the nut, transducer shaft included. */
    protected final double trainStiffness;
    protected final double trainDamping;

    protected double driveWorkJ;
    /** Energy lost inside the mechanism (end stops, ball friction), J. */
    protected double internalLossJ;
    protected int releases;
    private double apartS;
    private boolean releasedSinceContact;

    /** Free flight after which a contact without a release begins a new blow, s (kept for {@link #trackContact}). */
    static final double REBLOW_S = 5.0e-3;

    /**
     * Coefficient of restitution of the striker on the anvil (train contact) with the presets' damping
     * ratio 0.3 on unloading: about 0.67 (measured on the model, {@code ContactLossTest}); steel on steel
     * lies at roughly 0.5 to 0.9 depending on speed and geometry (contact mechanics, memory).
     */
    static final double TRAIN_RESTITUTION_AT_PRESET_DAMPING = 0.67;

    Mechanism(Drive drive, double trainStiffness, double dampingRatio, double strikingInertia) {
        this.drive = drive;
        this.trainStiffness = trainStiffness;
        this.trainDamping = 2.0 * dampingRatio * Math.sqrt(trainStiffness * strikingInertia);
    }

    static Mechanism of(MechanismSpec spec, Drive drive, double trainStiffness, double dampingRatio) {
        if (spec instanceof MechanismSpec.Cam c) {
            return new CamMechanism(c, drive, trainStiffness, dampingRatio);
        }
        if (spec instanceof MechanismSpec.TwinHammer t) {
            return new TwinHammerMechanism(t, drive, trainStiffness, dampingRatio);
        }
        if (spec instanceof ClutchSpec c) {
            return ClutchMechanism.of(c, drive, trainStiffness, dampingRatio);
        }
        return new OilPulseMechanism((MechanismSpec.OilPulse) spec, drive, trainStiffness);
    }

    /**
     * Whether the striker touches the anvil now, given the train torque of this step (a sealed chamber
     * for the oil-pulse unit): the contact episodes that make blows.
     */
    boolean inContact(double trainNm) {
        return trainNm != 0.0;
    }

    /**
     * The mechanism's own re-contact time, s: a contact episode that begins sooner than this after the
     * start of a blow belongs to that blow. It is the shortest interval between strikes on successive
     * jaws (one jaw pitch at the input's free speed); any contact sooner is a rebound or the striker
     * following a nut that moved on (docs/simulator.md, "What a blow is").
     */
    double recontactS() {
        return REBLOW_S;
    }

    /** Torque in the train (at the transducer) from the present state; forward is positive. */
    abstract double trainTorque(double nutAngle, double nutSpeed);

    /** Advances the mechanism by {@code h} seconds under the reaction {@code trainNm}. */
    abstract void advance(double h, double trainNm, double nutAngle, double nutSpeed);

    /** Speed of the mechanism's input shaft (spindle, cage or liner), rad/s. */
    abstract double inputSpeedRadS();

    /** Angle of the mechanism's input shaft, rad. */
    abstract double inputAngleRad();

    /** Angle of the striking body (hammer, cage or liner), rad. */
    abstract double strikerAngle();

    /** Kinetic energy of the mechanism's bodies and the potential energy of its springs, J. */
    abstract double storedJ();

    /** Elastic energy held in the train (and oil) now, J. */
    abstract double trainElasticJ(double nutAngle);

    /** At rest, the striking body against the anvil jaw, all angles zero (a new fastener). */
    abstract void reset();

    /**
     * At rest after the tool's direction was switched, angles zero: the striking dogs rest against the
     * backs of the jaws they last struck, so in the new sense they have the free travel between the
     * jaws ahead of them before they strike. Without dogs (the oil-pulse unit), as {@link #reset()}.
     */
    void resetSwitched() {
        reset();
    }

    /** Blow boundaries so far (releases and re-strikes after long free flight). */
    final int releases() {
        return releases;
    }

    /** A release of the striker: the blow under way ends. */
    final void release() {
        releases++;
        releasedSinceContact = true;
    }

    /** Books contact for a step of {@code h} under {@code trainNm} (cam and twin-hammer). */
    final void trackContact(double h, double trainNm) {
        if (trainNm != 0) {
            if (apartS > REBLOW_S && !releasedSinceContact) {
                releases++;
            }
            apartS = 0;
            releasedSinceContact = false;
        } else {
            apartS += h;
        }
    }

    /** The striker rests against the anvil (a new fastener). */
    final void restAgainstAnvil() {
        apartS = 0;
        releasedSinceContact = false;
    }

    /** Energy lost inside the mechanism (not in the train), J. */
    final double internalLossJ() {
        return internalLossJ;
    }

    /** Work the drive has done on the mechanism's input shaft, J. */
    final double driveWorkJ() {
        return driveWorkJ;
    }

    /**
     * Unilateral contact on a face at {@code delta} penetration, closing at {@code deltaSpeed}:
     * the train's spring, with its damping acting only while the contact unloads (restitution
     * below one without a torque step at first touch). Pushes, never pulls.
     */
    final double contact(double delta, double deltaSpeed) {
        if (delta <= 0) {
            return 0.0;
        }
        double t = trainStiffness * delta;
        if (deltaSpeed < 0) {
            t += trainDamping * deltaSpeed;
        }
        return t > 0 ? t : 0.0;
    }
}
