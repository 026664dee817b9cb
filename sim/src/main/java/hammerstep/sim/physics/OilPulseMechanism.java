package hammerstep.sim.physics;

/**
 * Oil-pulse unit. One body: the liner with the motor's reflected inertia. Over each sealing
 * window of relative rotation the chamber's torque {@code T} follows a Maxwell element (the oil
 * and the train as one spring {@code k} in series with the leak):
 * {@code dT/dt = k·(ω_liner − ω_nut) − T/τ_leak}, held at the relief torque when it would exceed
 * it and at zero when it would pull. Past the window the chamber vents ({@code T} decays with
 * {@code τ_vent}) and only oil shear couples liner and shaft. The window ends only forwards: a
 * liner thrown back by the pulse stays sealed. At rest the liner sits sealed against the blades,
 * as a hammer rests against its anvil: a loose nut is driven through the oil, without a pulse.
 */
final class OilPulseMechanism extends Mechanism {

    /** Chamber torque, as a fraction of the relief torque, above which the sealed chamber makes a pulse. */
    static final double PULSE_FRACTION = 0.05;

    private final double j;
    private final double pitch;
    private final double window;
    private final double k;
    private final double relief;
    private final double shear;
    private final double leakTauS;
    private final double ventTauS;

    private double th, w;
    private double oilNm;
    private boolean sealed;
    private double windowStart;
    private double lastH = Double.NaN;
    private double leakFactor;
    private double ventFactor;

    OilPulseMechanism(MechanismSpec.OilPulse spec, Drive drive, double trainStiffness) {
        super(drive, trainStiffness, 0.0, spec.linerInertiaKgM2());
        this.j = spec.linerInertiaKgM2() + drive.reflectedInertiaKgM2();
        this.pitch = 2.0 * Math.PI / spec.pulsesPerRev();
        this.window = spec.windowRad();
        this.k = 1.0 / (1.0 / spec.oilStiffness() + 1.0 / trainStiffness);
        this.leakTauS = spec.leakTimeConstantMs() * 1e-3;
        this.ventTauS = spec.ventTimeConstantMs() * 1e-3;
        this.relief = spec.reliefTorqueNm();
        this.shear = spec.shearNmPerRadS();
        reset();
    }

    /**
     * A pulse is the chamber sealed and pressurised above {@link #PULSE_FRACTION} of the relief torque;
     * a loose nut driven through the oil below it is no pulse.
     */
    @Override
    boolean inContact(double trainNm) {
        return sealed && oilNm > PULSE_FRACTION * relief;
    }

    /** The pitch between windows at the liner's free speed: the soonest a new pulse begins after one began. */
    @Override
    double recontactS() {
        return pitch / drive.freeShaftSpeedRadS();
    }

    @Override
    double trainTorque(double nutAngle, double nutSpeed) {
        return oilNm + shear * (w - nutSpeed);
    }

    @Override
    void advance(double h, double trainNm, double nutAngle, double nutSpeed) {
        if (h != lastH) {
            lastH = h;
            leakFactor = Math.exp(-h / leakTauS);
            ventFactor = Math.exp(-h / ventTauS);
        }
        double rel = w - nutSpeed;
        double td = drive.shaftTorque(w);
        w += h * (td - trainNm) / j;
        th += h * w;
        driveWorkJ += td * w * h;
        if (sealed) {
            double t = oilNm * leakFactor + k * rel * h;
            oilNm = t > relief ? relief : (t < 0 ? 0 : t);
            if (th - nutAngle >= windowStart + window) {
                sealed = false;
                windowStart += pitch;
            }
        } else {
            oilNm *= ventFactor;
            if (th - nutAngle >= windowStart) {
                sealed = true;
                release();
            }
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
        return oilNm * oilNm / (2.0 * k);
    }

    @Override
    void reset() {
        th = 0;
        w = 0;
        oilNm = 0;
        sealed = true;
        windowStart = 0;
    }
}
