package hammerstep.sim.physics;

/**
 * Cam-and-ball mechanism. Bodies: spindle (with the motor's reflected inertia) and hammer.
 * With {@code φ = θ_spindle − θ_hammer}, the balls hold the hammer back axially by
 * {@code x(φ) = c·|φ|} (rounded over a small arc at the V's bottom), the spring pushes with
 * {@code F = F₀ + k·x}, and the cam turns that into {@code T_cam = F·dx/dφ} on the hammer (and
 * its reaction on the spindle). Dogs overlap jaws while {@code x < h}; overlapping, the hammer's
 * front dog face meets the jaw face through the train's spring. Landing after a release, the
 * hammer engages in the gap it is over; over a jaw, it waits until it has passed it.
 */
final class CamMechanism extends Mechanism {

    private static final double ROUNDING_RAD = 0.02;
    private static final double STOP_STIFFNESS = 2000.0;

    private final double jS;
    private final double jH;
    private final double invJS;
    private final double invJH;
    private final double springRate;
    private final double x0;
    private final double lead;
    private final double dogHeight;
    private final double pitch;
    private final double arc;
    private final double ballTravel;

    private double thS, wS, thH, wH;
    private boolean engaged = true;
    private double face;

    CamMechanism(MechanismSpec.Cam spec, Drive drive, double trainStiffness, double dampingRatio) {
        super(drive, trainStiffness, dampingRatio, spec.hammerInertiaKgM2());
        this.jS = spec.spindleInertiaKgM2() + drive.reflectedInertiaKgM2();
        this.jH = spec.hammerInertiaKgM2();
        this.invJS = 1.0 / jS;
        this.invJH = 1.0 / jH;
        this.springRate = spec.springRateNPerM();
        this.x0 = spec.springPreloadN() / spec.springRateNPerM();
        this.lead = spec.camLeadMPerRad();
        this.dogHeight = spec.dogHeightM();
        this.pitch = spec.pitchRad();
        this.arc = spec.dogArcRad();
        this.ballTravel = spec.ballTravelRad();
    }

    private double axial(double phi) {
        double a = Math.abs(phi);
        return a <= ROUNDING_RAD ? lead * a * a / (2 * ROUNDING_RAD) : lead * (a - 0.5 * ROUNDING_RAD);
    }

    /** Cam torque on the hammer, forward positive. */
    private double camTorque(double phi) {
        double a = Math.abs(phi);
        double slope = a <= ROUNDING_RAD ? lead * phi / ROUNDING_RAD : (phi > 0 ? lead : -lead);
        double x = a <= ROUNDING_RAD ? lead * a * a / (2 * ROUNDING_RAD) : lead * (a - 0.5 * ROUNDING_RAD);
        double t = springRate * (x0 + x) * slope;
        if (a > ballTravel) {
            t += STOP_STIFFNESS * (a - ballTravel) * (phi > 0 ? 1 : -1);
        }
        return t;
    }

    @Override
    double trainTorque(double nutAngle, double nutSpeed) {
        if (!engaged) {
            return 0.0;
        }
        double psi = thH - nutAngle;
        double d = psi - face;
        double dv = wH - nutSpeed;
        if (d > 0) {
            return contact(d, dv);
        }
        double back = face - pitch + arc - psi;
        if (back > 0) {
            return -contact(back, -dv);
        }
        return 0.0;
    }

    @Override
    void advance(double h, double trainNm, double nutAngle, double nutSpeed) {
        double phi = thS - thH;
        double tc = camTorque(phi);
        double td = drive.shaftTorque(wS);
        wS += h * (td - tc) * invJS;
        wH += h * (tc - trainNm) * invJH;
        thS += h * wS;
        thH += h * wH;
        driveWorkJ += td * wS * h;
        trackContact(h, trainNm);
        double x = axial(thS - thH);
        if (engaged) {
            if (x >= dogHeight) {
                engaged = false;
                release();
            }
        } else if (x < dogHeight) {
            double psi = thH - (nutAngle + nutSpeed * h);
            double k = Math.floor(psi / pitch);
            if (psi - k * pitch >= arc) {
                engaged = true;
                face = (k + 1) * pitch;
            }
        }
    }

    @Override
    double inputAngleRad() {
        return thS;
    }

    @Override
    double inputSpeedRadS() {
        return wS;
    }

    @Override
    double storedJ() {
        double phi = thS - thH;
        double a = Math.abs(phi);
        double x = axial(phi);
        double spring = 0.5 * springRate * ((x0 + x) * (x0 + x) - x0 * x0);
        double stop = a > ballTravel ? 0.5 * STOP_STIFFNESS * (a - ballTravel) * (a - ballTravel) : 0.0;
        return 0.5 * jS * wS * wS + 0.5 * jH * wH * wH + spring + stop;
    }

    @Override
    double strikerAngle() {
        return thH;
    }

    @Override
    double trainElasticJ(double nutAngle) {
        if (!engaged) {
            return 0.0;
        }
        double psi = thH - nutAngle;
        double d = Math.max(psi - face, face - pitch + arc - psi);
        return d > 0 ? 0.5 * trainStiffness * d * d : 0.0;
    }

    @Override
    void reset() {
        restAgainstAnvil();
        face = 0;
        thH = 0;
        thS = 0;
        wS = 0;
        wH = 0;
        engaged = true;
    }

    @Override
    void resetSwitched() {
        reset();
        face = pitch - arc;
    }

    boolean engaged() {
        return engaged;
    }
}
