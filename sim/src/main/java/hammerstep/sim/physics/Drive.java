package hammerstep.sim.physics;

/**
 * A tool's motor as seen from the mechanism's input shaft: the torque it applies at a given shaft
 * speed while powered, or its braking and drag when not. Single-threaded; allocation-free.
 */
abstract sealed class Drive permits CordlessDrive, AirDrive {

    protected boolean powered;

    static Drive of(DriveSpec spec) {
        if (spec instanceof DriveSpec.Cordless c) {
            return new CordlessDrive(c);
        }
        return new AirDrive((DriveSpec.Air) spec);
    }

    final void setPowered(boolean powered) {
        this.powered = powered;
    }

    final boolean powered() {
        return powered;
    }

    /** Torque at the mechanism's input shaft turning at {@code shaftRadS}, N·m. */
    abstract double shaftTorque(double shaftRadS);

    /** Motor inertia reflected to the input shaft, kg·m². */
    abstract double reflectedInertiaKgM2();

    /** Free speed of the input shaft under the present supply, rad/s. */
    abstract double freeShaftSpeedRadS();
}
