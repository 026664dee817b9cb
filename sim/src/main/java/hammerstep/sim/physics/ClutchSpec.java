package hammerstep.sim.physics;

/**
 * Dog clutches whose whole striker (the hammer or its frame, with the motor's reflected inertia)
 * swings, slides or rocks parts into the anvil's path once per pitch of relative rotation, strikes
 * through them, and lets go on the rebound: the rocking dog, the three-jaw clutch and the twin-pin
 * clutch in an oil bath (docs/simulator.md, "Dog clutches"). The parts that engage at once act in
 * parallel: {@code engaging} of them, each of {@code partStiffnessNmPerRad}.
 */
public sealed interface ClutchSpec extends MechanismSpec
        permits ClutchSpec.RockingDog, ClutchSpec.ThreeJaw, ClutchSpec.TwinPinOilBath {

    /** Hammer (frame, cage) about the spindle axis, without the motor's reflected inertia, kg·m². */
    double hammerInertiaKgM2();

    /** Relative rotation of hammer to anvil from one strike to the next, rad. */
    default double pitchRad() {
        return 2.0 * Math.PI / strikesPerRev();
    }

    /** Arc of relative rotation over which the engaging parts overlap the anvil's jaws, rad. */
    double overlapRad();

    /** Dogs, jaws or pins that meet the anvil at once in each strike. */
    int engaging();

    /** Contact stiffness of one engaging part against its jaw, N·m/rad about the axis. */
    double partStiffnessNmPerRad();

    /** Held against the jaw above this torque for {@link #releaseMs()}, the parts are pushed out. */
    double releaseTorqueNm();

    double releaseMs();

    /** Damping ratio added to the train's in the contact (an oil film), fraction of critical. */
    default double filmDampingRatio() {
        return 0.0;
    }

    /** Drag on the hammer turning in oil, N·m per rad/s. */
    default double bathDragNmPerRadS() {
        return 0.0;
    }

    /**
     * Rocking dog: one hammer dog on a pin in the hammer frame. Once per relative revolution the dog
     * rocks in behind the anvil's single jaw, the whole frame strikes through it, and it rocks out as
     * the frame falls back: one heavy blow per turn.
     */
    record RockingDog(double hammerInertiaKgM2, double overlapRad, double partStiffnessNmPerRad,
                      double releaseTorqueNm, double releaseMs) implements ClutchSpec {

        @Override
        public double strikesPerRev() {
            return 1.0;
        }

        @Override
        public int engaging() {
            return 1;
        }
    }

    /**
     * Three-jaw clutch: three jaws on the hammer meet three jaws on the anvil at once, every third of a
     * relative revolution; the load is shared by the three.
     */
    record ThreeJaw(double hammerInertiaKgM2, double overlapRad, double partStiffnessNmPerRad,
                    double releaseTorqueNm, double releaseMs) implements ClutchSpec {

        @Override
        public double strikesPerRev() {
            return 3.0;
        }

        @Override
        public int engaging() {
            return 3;
        }
    }

    /**
     * Twin-pin clutch in an oil bath: two pins in the hammer, on opposite sides, shift into the
     * path of the anvil's two lugs and strike both at once, twice per relative revolution; the
     * mechanism runs in oil, which drags on the hammer and damps each contact through its film.
     * Not a hydraulic pulse unit: the blow is metal on metal.
     */
    record TwinPinOilBath(double hammerInertiaKgM2, double overlapRad, double partStiffnessNmPerRad,
                          double releaseTorqueNm, double releaseMs, double filmDampingRatio,
                          double bathDragNmPerRadS) implements ClutchSpec {

        @Override
        public double strikesPerRev() {
            return 2.0;
        }

        @Override
        public int engaging() {
            return 2;
        }
    }
}
