package hammerstep.sim.physics;

/**
 * Cam-and-ball mechanism. Bodies: spindle (with the motor's reflected inertia) and hammer.
 * With {@code φ = θ_spindle − θ_hammer}, the balls hold the hammer back axially by
 * {@code x(φ) = c·|φ|} (rounded over a small arc at the V's bottom), the spring pushes with
 * {@code F = F₀ + k·x}, and the cam turns that into {@code T_cam = F·dx/dφ} on the hammer (and
 * its reaction on the spindle). Dogs overlap jaws while {@code x < h}; overlapping, the hammer's
 * front dog face meets the jaw face through the train's spring. Landing after a release, the
 * hammer engages in the gap it is over; over a jaw, it waits until it has passed it.
 *
 * <p>Losses: the train contact's damping on unloading (see {@link Mechanism#contact}); the balls at the
 * groove ends with a nominal coefficient of restitution of {@link #STOP_RESTITUTION} (our assumption at
 * the low end of steel on steel, 0.5 to 0.9: contact mechanics, memory; 0.57 as measured), a
 * Kelvin–Voigt stop that pushes only. A hammer lifted over its dog height while moving backwards (its rebound) has its dogs clear of
 * the jaws, but that is no release: only a hammer going forward over a jaw is released.
 */
final class CamMechanism extends Mechanism {

    private static final double ROUNDING_RAD = 0.02;
    private static final double STOP_STIFFNESS = 2000.0;
    /**
     * Nominal coefficient of restitution of the balls on the groove ends (assumption, see the class
     * comment): it sets the stop's damping ratio as for a linear spring and dashpot; pushing only, the
     * stop lets go a little earlier and rebounds at about {@link #STOP_RESTITUTION_MEASURED}.
     */
    static final double STOP_RESTITUTION = 0.5;
    /** The groove-end stop's restitution as measured on the model ({@code ContactLossTest}). */
    static final double STOP_RESTITUTION_MEASURED = 0.57;

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
    private final double stopDamping;

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
        this.stopDamping = 2.0 * dampingRatioFor(STOP_RESTITUTION) * Math.sqrt(STOP_STIFFNESS * jS * jH / (jS + jH));
    }

    /** Damping ratio of a linear spring-dashpot contact with restitution {@code e}: −ln e / √(π² + ln² e). */
    static double dampingRatioFor(double e) {
        double l = Math.log(e);
        return -l / Math.sqrt(Math.PI * Math.PI + l * l);
    }

    private double axial(double phi) {
        double a = Math.abs(phi);
        return a <= ROUNDING_RAD ? lead * a * a / (2 * ROUNDING_RAD) : lead * (a - 0.5 * ROUNDING_RAD);
    }

    /**
     * Cam torque on the hammer, forward positive, at relative angle {@code phi} opening at {@code rel}
     * (rad/s); its non-conservative part (the stop's damping) goes to {@link #stopLossNm}.
     */
    private double camTorque(double phi, double rel) {
        double a = Math.abs(phi);
        double slope = a <= ROUNDING_RAD ? lead * phi / ROUNDING_RAD : (phi > 0 ? lead : -lead);
        double x = a <= ROUNDING_RAD ? lead * a * a / (2 * ROUNDING_RAD) : lead * (a - 0.5 * ROUNDING_RAD);
        double t = springRate * (x0 + x) * slope;
        stopLossNm = 0;
        if (a > ballTravel) {
            double sign = phi > 0 ? 1 : -1;
            double elastic = STOP_STIFFNESS * (a - ballTravel);
            double push = elastic + stopDamping * rel * sign;
            if (push < 0) {
                push = 0;
            }
            t += push * sign;
            stopLossNm = (push - elastic) * sign;
        }
        return t;
    }

    private double stopLossNm;

    /**
     * One jaw pitch at the spindle's free speed. Between two releases over successive jaws the hammer
     * turns one pitch against the anvil and ends at the same cam angle (the dog height), so the spindle
     * has turned one pitch against the anvil too, and it turns no faster than its free speed.
     */
    @Override
    double recontactS() {
        return pitch / drive.freeShaftSpeedRadS();
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
        double tc = camTorque(phi, wS - wH);
        internalLossJ -= stopLossNm * (wH - wS) * h;
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
                // over a jaw only going forward; lifted on its rebound, the hammer is not released
                if (wH >= nutSpeed) {
                    release();
                }
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

    /** Places spindle and hammer, dogs lifted clear of the jaws (tests: the balls against the groove ends). */
    void setLifted(double spindleRad, double spindleRadS, double hammerRad, double hammerRadS) {
        thS = spindleRad;
        wS = spindleRadS;
        thH = hammerRad;
        wH = hammerRadS;
        engaged = false;
    }

    double hammerSpeedRadS() {
        return wH;
    }

    /** Relative angle spindle − hammer at which the balls reach the groove ends, rad. */
    double ballTravelRad() {
        return ballTravel;
    }
}
