package hammerstep.sim.physics;

/** What turns the mechanism: a cordless brushless motor through a planetary stage, or an air motor. */
public sealed interface DriveSpec permits DriveSpec.Cordless, DriveSpec.Air {

    /** Inertia of the motor reflected to the mechanism's input shaft, kg·m². */
    double reflectedInertiaKgM2();

    /**
     * Brushless motor on a battery, driving the mechanism through one planetary stage (sun in,
     * carrier out, ring fixed). The motor follows a DC speed-torque line: current
     * {@code (V - ω/Kv) / (R_winding + R_battery)}, capped by the controller's current limit;
     * the battery's internal resistance makes the voltage sag under load.
     *
     * @param voltageV               battery open-circuit voltage
     * @param internalResistanceOhm  battery pack resistance (sag)
     * @param kvRpmPerV              motor speed constant
     * @param windingResistanceOhm   motor phase-to-phase resistance
     * @param currentLimitA          motor controller's current limit while driving
     * @param brakeCurrentA          current limit of the electronic brake (windings shorted) when released
     * @param motorInertiaKgM2       rotor inertia
     * @param dragNmPerRadS          viscous drag at the motor, N·m per rad/s
     * @param sunTeeth               planetary sun (input)
     * @param planetTeeth            planet
     * @param ringTeeth              ring (fixed)
     * @param gearEfficiency         of the stage, 0..1
     */
    record Cordless(double voltageV, double internalResistanceOhm, double kvRpmPerV, double windingResistanceOhm,
                    double currentLimitA, double brakeCurrentA, double motorInertiaKgM2, double dragNmPerRadS,
                    int sunTeeth, int planetTeeth, int ringTeeth, double gearEfficiency) implements DriveSpec {

        public double ratio() {
            return Planetary.ringFixedRatio(sunTeeth, ringTeeth);
        }

        @Override
        public double reflectedInertiaKgM2() {
            double n = ratio();
            return motorInertiaKgM2 * n * n;
        }
    }

    /**
     * Vane air motor. At the reference supply pressure it has {@code freeSpeedRpm} and
     * {@code stallTorqueNm}; stall torque scales with gauge pressure, free speed with its square
     * root (see docs/simulator.md).
     *
     * @param referencePressureBar gauge pressure at which the figures hold
     * @param freeSpeedRpm         motor free speed at the reference pressure
     * @param stallTorqueNm        motor stall torque at the reference pressure
     * @param rotorInertiaKgM2     rotor inertia
     * @param dragNmPerRadS        viscous drag at the motor
     * @param gearRatio            motor turns per mechanism turn; 1 for direct drive
     */
    record Air(double referencePressureBar, double freeSpeedRpm, double stallTorqueNm, double rotorInertiaKgM2,
               double dragNmPerRadS, double gearRatio) implements DriveSpec {

        @Override
        public double reflectedInertiaKgM2() {
            return rotorInertiaKgM2 * gearRatio * gearRatio;
        }
    }
}
