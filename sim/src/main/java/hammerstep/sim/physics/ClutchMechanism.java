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
abstract sealed class ClutchMechanism extends JawStriker
        permits RockingDogMechanism, ThreeJawClutchMechanism, TwinPinOilBathMechanism {

    ClutchMechanism(ClutchSpec spec, Drive drive, double trainStiffness, double dampingRatio) {
        super(drive, contactInSeries(spec, trainStiffness), dampingRatio + spec.filmDampingRatio(),
                spec.hammerInertiaKgM2() + drive.reflectedInertiaKgM2(), spec.pitchRad(), spec.overlapRad(),
                spec.releaseTorqueNm(), spec.releaseMs() * 1e-3, spec.bathDragNmPerRadS());
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

    /** The engaging parts in parallel, in series with the train: the stiffness a strike meets, N·m/rad. */
    static double contactInSeries(ClutchSpec spec, double trainStiffness) {
        double parts = spec.engaging() * spec.partStiffnessNmPerRad();
        return 1.0 / (1.0 / trainStiffness + 1.0 / parts);
    }
}
