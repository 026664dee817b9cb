package hammerstep.sim.physics;

/**
 * Twin-hammer clutch. One body: motor rotor (reflected) plus cage and hammers, the whole of which
 * strikes. Engaged, the hammers meet the anvil jaw face through the train's spring; after the
 * strike they swing out on the rebound (contact lost while the cage falls behind the anvil), or
 * when held against the jaw above the cam-out torque for the cam-out time. Swung out, the cage
 * turns freely until it has passed the jaw, and the hammers swing in for the jaw one relative
 * revolution on.
 */
final class TwinHammerMechanism extends Mechanism {

    private static final double PITCH = 2.0 * Math.PI;

    private final double j;
    private final double arc;
    private final double camOutNm;
    private final double camOutS;

    private double th, w;
    private boolean engaged = true;
    private boolean pushed;
    private double face;
    private double heldS;

    TwinHammerMechanism(MechanismSpec.TwinHammer spec, Drive drive, double trainStiffness, double dampingRatio) {
        super(drive, trainStiffness, dampingRatio, spec.cageInertiaKgM2() + drive.reflectedInertiaKgM2());
        this.j = spec.cageInertiaKgM2() + drive.reflectedInertiaKgM2();
        this.arc = spec.dogArcRad();
        this.camOutNm = spec.camOutTorqueNm();
        this.camOutS = spec.camOutMs() * 1e-3;
    }

    /** One relative turn at the cage's free speed: the soonest the hammers can strike the jaw again after swinging out. */
    @Override
    double recontactS() {
        return PITCH / drive.freeShaftSpeedRadS();
    }

    @Override
    double trainTorque(double nutAngle, double nutSpeed) {
        if (!engaged) {
            return 0.0;
        }
        return contact(th - nutAngle - face, w - nutSpeed);
    }

    @Override
    void advance(double h, double trainNm, double nutAngle, double nutSpeed) {
        double td = drive.shaftTorque(w);
        w += h * (td - trainNm) / j;
        th += h * w;
        driveWorkJ += td * w * h;
        trackContact(h, trainNm);
        if (engaged) {
            if (trainNm > 0) {
                pushed = true;
            }
            heldS = trainNm > camOutNm ? heldS + h : 0.0;
            boolean rebound = pushed && trainNm == 0 && w < nutSpeed;
            if (rebound || heldS >= camOutS) {
                engaged = false;
                release();
            }
        } else if (th - nutAngle > face + arc) {
            engaged = true;
            pushed = false;
            heldS = 0;
            face += PITCH;
        }
    }

    @Override
    double inputAngleRad() {
        return th;
    }

    @Override
    double inputSpeedRadS() {
        return w;
    }

    @Override
    double strikerAngle() {
        return th;
    }

    @Override
    double storedJ() {
        return 0.5 * j * w * w;
    }

    @Override
    double trainElasticJ(double nutAngle) {
        double d = th - nutAngle - face;
        return engaged && d > 0 ? 0.5 * trainStiffness * d * d : 0.0;
    }

    @Override
    void resetSwitched() {
        reset();
        // out of engagement behind the jaw: it engages at once and strikes after the free travel
        engaged = false;
        face = -arc;
    }

    /** Places the cage (tests: a strike from a known state). */
    void setStriker(double angleRad, double speedRadS) {
        th = angleRad;
        w = speedRadS;
    }

    @Override
    void reset() {
        restAgainstAnvil();
        th = 0;
        w = 0;
        face = 0;
        engaged = true;
        pushed = false;
        heldS = 0;
    }
}
