package hammerstep.sim.physics;

/**
 * A striker that is one body about the axis and meets the anvil's jaws through engaging parts that
 * come in and go out: the twin-hammer cage and the dog clutches ({@link ClutchMechanism}). Engaged,
 * the parts meet the jaw face through the train's spring; after the strike they let go on the rebound
 * (contact lost while the striker falls behind the anvil), or when held against the jaw above the
 * release torque for the release time. Out, the striker turns freely until it has passed the jaw it
 * struck by the overlap arc, and the parts come in again for the jaw one pitch on.
 *
 * <p>The variants differ only in their figures: pitch, overlap, release, the striking inertia, the
 * stiffness a strike meets, and the drag of an oil bath (zero when dry).
 */
abstract sealed class JawStriker extends Mechanism permits TwinHammerMechanism, ClutchMechanism {

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

    /**
     * @param strikeStiffness stiffness a strike meets, N·m/rad
     * @param j               striking inertia, the motor's reflected inertia included, kg·m²
     * @param pitch           jaw pitch, rad (2π: one strike per relative turn)
     * @param overlap         arc past the jaw after which the parts come in again, rad
     * @param releaseNm       held torque above which the parts are pushed out
     * @param releaseS        how long it must be held, s
     * @param bathDrag        viscous drag of an oil bath on the striker, N·m·s/rad (0 when dry)
     */
    JawStriker(Drive drive, double strikeStiffness, double dampingRatio, double j, double pitch, double overlap,
               double releaseNm, double releaseS, double bathDrag) {
        super(drive, strikeStiffness, dampingRatio, j);
        this.j = j;
        this.pitch = pitch;
        this.overlap = overlap;
        this.releaseNm = releaseNm;
        this.releaseS = releaseS;
        this.bathDrag = bathDrag;
    }

    /**
     * One pitch at the drive's free speed: after a strike the parts come in again only for the jaw one
     * pitch on, and the striker turns no faster than its free speed, so any contact sooner is the same
     * strike's rebound.
     */
    @Override
    final double recontactS() {
        return pitch / drive.freeShaftSpeedRadS();
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
        // an oil bath's drag counts against the drive, as a motor's own drag does
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

    /** Places the striker (tests: a strike from a known state). */
    final void setStriker(double angleRad, double speedRadS) {
        th = angleRad;
        w = speedRadS;
    }
}
