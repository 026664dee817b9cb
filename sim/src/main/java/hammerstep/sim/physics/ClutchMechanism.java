package hammerstep.sim.physics;

/**
 * A dog clutch whose whole striker strikes: one body, the hammer (frame, cage) with the motor's
 * reflected inertia. Engaged, its engaging parts (dogs, jaws, pins) meet the anvil's jaw face
 * through their contact stiffness, {@code n} parts in parallel, in series with the train. After
 * the strike they let go on the rebound (contact lost while the hammer falls behind the anvil), or
 * when held against the jaw above the release torque for the release time. Out, the hammer turns
 * freely until it has passed the jaw it struck, and the parts come in again for the jaw one pitch
 * on. Strikes per relative turn are therefore {@code 2π / pitch} wherever the hammer clears a jaw
 * between strikes.
 *
 * <p>The three variants share these dynamics about the axis; they differ in pitch, in how many
 * parts share the blow, and in the oil bath (see the subclasses and docs/simulator.md).
 */
abstract sealed class ClutchMechanism extends Mechanism
        permits RockingDogMechanism, ThreeJawClutchMechanism, TwinPinOilBathMechanism {

    private final double j;
    private final double pitch;
    private final double overlap;
    private final double releaseNm;
    private final double releaseS;
    private final double bathDrag;

    private double th, w;
    private boolean engaged = true;
    private boolean pushed;
    private double face;
    private double heldS;

    ClutchMechanism(ClutchSpec spec, Drive drive, double trainStiffness, double dampingRatio) {
        super(drive, contactInSeries(spec, trainStiffness), dampingRatio + spec.filmDampingRatio(),
                spec.hammerInertiaKgM2() + drive.reflectedInertiaKgM2());
        this.j = spec.hammerInertiaKgM2() + drive.reflectedInertiaKgM2();
        this.pitch = spec.pitchRad();
        this.overlap = spec.overlapRad();
        this.releaseNm = spec.releaseTorqueNm();
        this.releaseS = spec.releaseMs() * 1e-3;
        this.bathDrag = spec.bathDragNmPerRadS();
    }

    static ClutchMechanism of(ClutchSpec spec, Drive drive, double trainStiffness, double dampingRatio) {
        if (spec instanceof ClutchSpec.RockingDog r) {
            return new RockingDogMechanism(r, drive, trainStiffness, dampingRatio);
        }
        if (spec instanceof ClutchSpec.ThreeJaw t) {
            return new ThreeJawClutchMechanism(t, drive, trainStiffness, dampingRatio);
        }
        return new TwinPinOilBathMechanism((ClutchSpec.TwinPinOilBath) spec, drive, trainStiffness, dampingRatio);
    }

    /**
     * One pitch at the drive's free speed: after a strike the parts come in again only for the jaw one
     * pitch on, and the hammer turns no faster than its free speed, so any contact sooner is the same
     * strike's rebound.
     */
    @Override
    double recontactS() {
        return pitch / drive.freeShaftSpeedRadS();
    }

    /** The engaging parts in parallel, in series with the train: the stiffness a strike meets, N·m/rad. */
    static double contactInSeries(ClutchSpec spec, double trainStiffness) {
        double parts = spec.engaging() * spec.partStiffnessNmPerRad();
        return 1.0 / (1.0 / trainStiffness + 1.0 / parts);
    }

    /** The stiffness a strike meets, N·m/rad. */
    final double strikeStiffness() {
        return trainStiffness;
    }

    /** The striking inertia, motor included, kg·m². */
    final double strikingInertia() {
        return j;
    }

    @Override
    final double trainTorque(double nutAngle, double nutSpeed) {
        if (!engaged) {
            return 0.0;
        }
        return contact(th - nutAngle - face, w - nutSpeed);
    }

    @Override
    final void advance(double h, double trainNm, double nutAngle, double nutSpeed) {
        double td = drive.shaftTorque(w);
        w += h * (td - bathDrag * w - trainNm) / j;
        th += h * w;
        // the bath's drag counts against the drive, as a motor's own drag does
        driveWorkJ += (td - bathDrag * w) * w * h;
        trackContact(h, trainNm);
        if (engaged) {
            if (trainNm > 0) {
                pushed = true;
            }
            heldS = trainNm > releaseNm ? heldS + h : 0.0;
            boolean rebound = pushed && trainNm == 0 && w < nutSpeed;
            if (rebound || heldS >= releaseS) {
                engaged = false;
                release();
            }
        } else if (th - nutAngle > face + overlap) {
            engaged = true;
            pushed = false;
            heldS = 0;
            face += pitch;
        }
    }

    @Override
    final double inputAngleRad() {
        return th;
    }

    @Override
    final double inputSpeedRadS() {
        return w;
    }

    @Override
    final double strikerAngle() {
        return th;
    }

    @Override
    final double storedJ() {
        return 0.5 * j * w * w;
    }

    @Override
    final double trainElasticJ(double nutAngle) {
        double d = th - nutAngle - face;
        return engaged && d > 0 ? 0.5 * trainStiffness * d * d : 0.0;
    }

    @Override
    final void resetSwitched() {
        reset();
        // out of engagement behind the jaw: it comes in at once and strikes after the free travel
        engaged = false;
        face = -overlap;
    }

    @Override
    final void reset() {
        restAgainstAnvil();
        th = 0;
        w = 0;
        face = 0;
        engaged = true;
        pushed = false;
        heldS = 0;
    }

    /** Places the hammer (tests: a strike from a known state). */
    final void setStriker(double angleRad, double speedRadS) {
        th = angleRad;
        w = speedRadS;
    }
}
