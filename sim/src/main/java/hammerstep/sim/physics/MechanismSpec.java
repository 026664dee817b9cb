package hammerstep.sim.physics;

/** How a tool turns the drive's rotation into blows. */
public sealed interface MechanismSpec permits MechanismSpec.Cam, MechanismSpec.TwinHammer, MechanismSpec.OilPulse,
        ClutchSpec {

    /** Strikes per relative revolution of the striking body against the anvil. */
    double strikesPerRev();

    /**
     * Cam-and-ball: a spring-loaded hammer on the spindle, coupled to it by balls in V-shaped
     * helical grooves. Blocked by an anvil jaw, the hammer climbs the cam against the spring until
     * its dogs clear the jaws, then the spring and the spindle throw it at the next jaw.
     *
     * @param dogs              dogs on the hammer (and jaws on the anvil): 2 or 3
     * @param skip              strike every other jaw (pitch doubled: 1.5 strikes per rev with 3 dogs)
     * @param hammerInertiaKgM2 hammer about the spindle axis
     * @param spindleInertiaKgM2 spindle and carrier (the motor's reflected inertia is added)
     * @param springPreloadN    spring force with the hammer fully forward
     * @param springRateNPerM   spring rate
     * @param camLeadMPerRad    axial hammer travel per radian of hammer-to-spindle rotation
     * @param dogHeightM        axial overlap of dogs and jaws: the climb that releases the hammer
     * @param dogArcRad         arc over which a dog and a jaw overlap (dog width plus jaw width)
     * @param ballTravelRad     relative rotation at which the balls reach the groove ends
     */
    record Cam(int dogs, boolean skip, double hammerInertiaKgM2, double spindleInertiaKgM2, double springPreloadN,
               double springRateNPerM, double camLeadMPerRad, double dogHeightM, double dogArcRad,
               double ballTravelRad) implements MechanismSpec {

        /** Relative rotation of hammer to anvil from one strike to the next. */
        public double pitchRad() {
            return (skip ? 2.0 : 1.0) * 2.0 * Math.PI / dogs;
        }

        @Override
        public double strikesPerRev() {
            return 2.0 * Math.PI / pitchRad();
        }
    }

    /**
     * Twin-hammer clutch: the motor turns a cage carrying two pivoted hammers; once per relative
     * revolution both swing into the anvil's jaws and the whole rotor-and-cage mass strikes, then
     * they swing out on the rebound. Held against the anvil with more than {@code camOutTorqueNm}
     * for longer than {@code camOutMs}, the hammers swing out as well.
     *
     * @param cageInertiaKgM2 cage and hammers (the motor rotor's reflected inertia is added)
     * @param dogArcRad       arc of relative rotation over which hammers and jaws overlap
     */
    record TwinHammer(double cageInertiaKgM2, double dogArcRad, double camOutTorqueNm, double camOutMs)
            implements MechanismSpec {

        @Override
        public double strikesPerRev() {
            return 1.0;
        }
    }

    /**
     * Oil-pulse unit: a liner turned by the motor around a blade shaft. Over a sealing window once
     * per {@code 1/pulsesPerRev} revolution, the chamber closes and oil is squeezed: a spring (oil
     * bulk modulus) in series with a leak, capped by a relief valve. Outside the window the chamber
     * vents and only oil shear couples liner and shaft.
     *
     * @param linerInertiaKgM2  liner (the motor's reflected inertia is added)
     * @param pulsesPerRev      sealing windows per relative revolution: 1 or 2
     * @param windowRad         relative rotation over which the chamber stays sealed
     * @param oilStiffness      N·m/rad of the sealed chamber
     * @param leakTimeConstantMs time constant of pressure decay through the leak, the shaft held
     * @param reliefTorqueNm    torque at which the relief valve opens
     * @param ventTimeConstantMs pressure decay after the window opens
     * @param shearNmPerRadS    oil shear between liner and shaft outside the window
     */
    record OilPulse(double linerInertiaKgM2, int pulsesPerRev, double windowRad, double oilStiffness,
                    double leakTimeConstantMs, double reliefTorqueNm, double ventTimeConstantMs,
                    double shearNmPerRadS) implements MechanismSpec {

        @Override
        public double strikesPerRev() {
            return pulsesPerRev;
        }
    }
}
