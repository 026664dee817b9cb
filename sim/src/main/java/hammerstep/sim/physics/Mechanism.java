package hammerstep.sim.physics;

/**
 * The impact mechanism and the bodies it drives, integrated with the semi-implicit (symplectic)
 * Euler method: torques from the state at the start of a step, then velocities, then angles with
 * the new velocities. The train torque couples the mechanism to the fastener: it is computed once
 * per step by {@link #trainTorque} and handed to {@link #advance} as the reaction.
 *
 * <p>A <em>strike</em> begins when the striking body meets the anvil after at least
 * {@link #FREE_FLIGHT_S} apart (for the oil-pulse unit: when a sealing window begins); contact
 * chatter within that time belongs to the strike before. The rig takes the highest train torque
 * from one strike's start to the next as that strike's peak.
 *
 * <p>The mechanism books the work its drive does; the rig books the work done on the train. Single-threaded; allocation-free after construction.
 */
abstract sealed class Mechanism permits CamMechanism, TwinHammerMechanism, OilPulseMechanism {

    protected final Drive drive;
    /** Stiffness of the train from the striking face to the nut, transducer shaft included. */
    protected final double trainStiffness;
    protected final double trainDamping;

    protected double driveWorkJ;
    protected int strikes;
    private double apartS;

    /** Time apart after which a new contact is a new strike (chatter shorter than this is not), s. */
    static final double FREE_FLIGHT_S = 1.0e-3;

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
        return new OilPulseMechanism((MechanismSpec.OilPulse) spec, drive, trainStiffness);
    }

    /** Torque in the train (at the transducer) from the present state; forward is positive. */
    abstract double trainTorque(double nutAngle, double nutSpeed);

    /** Advances the mechanism by {@code h} seconds under the reaction {@code trainNm}. */
    abstract void advance(double h, double trainNm, double nutAngle, double nutSpeed);

    /** Speed of the mechanism's input shaft (spindle, cage or liner), rad/s. */
    abstract double inputSpeedRadS();

    /** Angle of the striking body (hammer, cage or liner), rad. */
    abstract double strikerAngle();

    /** Kinetic energy of the mechanism's bodies and the potential energy of its springs, J. */
    abstract double storedJ();

    /** Elastic energy held in the train (and oil) now, J. */
    abstract double trainElasticJ(double nutAngle);

    /** At rest, the striking body against the anvil jaw, all angles zero (a new fastener). */
    abstract void reset();

    /** Strikes begun so far. */
    final int strikes() {
        return strikes;
    }

    /** Books contact for a step of {@code h} under {@code trainNm}: a contact after free flight is a strike. */
    final void trackContact(double h, double trainNm) {
        if (trainNm != 0) {
            if (apartS >= FREE_FLIGHT_S) {
                strikes++;
            }
            apartS = 0;
        } else {
            apartS += h;
        }
    }

    /** The striker starts resting against the anvil: its first push is no strike. */
    final void restAgainstAnvil() {
        apartS = 0;
    }

    final double driveWorkJ() {
        return driveWorkJ;
    }

    /**
     * Unilateral spring-damper contact on a face at {@code delta} penetration closing at
     * {@code deltaSpeed}: pushes, never pulls.
     */
    final double contact(double delta, double deltaSpeed) {
        if (delta <= 0) {
            return 0.0;
        }
        double t = trainStiffness * delta + trainDamping * deltaSpeed;
        return t > 0 ? t : 0.0;
    }
}
