package hammerstep.sim.physics;

/**
 * A modelled impact tool: its drive, its impact mechanism and the train (anvil, socket,
 * extension) between mechanism and fastener. SI units throughout: kg·m², N·m/rad, rad, s.
 *
 * @param name  preset name, or the file it came from
 * @param drive the motor and gearing that turn the mechanism's input
 * @param mechanism how the drive's rotation becomes blows
 * @param train the tooling after the mechanism, up to the transducer and beyond it to the nut
 */
public record ToolSpec(String name, DriveSpec drive, MechanismSpec mechanism, TrainSpec train) {

    /**
     * Anvil, socket and extension. Their compliances act in series with the transducer shaft;
     * their inertias are lumped at the fastener end (see docs/simulator.md).
     *
     * @param anvilStiffness     N·m/rad, hammer-to-anvil contact and anvil shaft together
     * @param socketStiffness    N·m/rad
     * @param extensionStiffness N·m/rad; {@code +Inf} when the tool has no extension
     * @param inertiaKgM2        anvil, socket and extension together
     * @param dampingRatio       structural damping of the train, as a fraction of critical
     */
    public record TrainSpec(double anvilStiffness, double socketStiffness, double extensionStiffness,
                            double inertiaKgM2, double dampingRatio) {

        /** The train's stiffness in series with a transducer shaft of {@code shaftStiffness}. */
        public double seriesStiffness(double shaftStiffness) {
            return 1.0 / (1.0 / anvilStiffness + 1.0 / socketStiffness + 1.0 / extensionStiffness
                    + 1.0 / shaftStiffness);
        }
    }
}
