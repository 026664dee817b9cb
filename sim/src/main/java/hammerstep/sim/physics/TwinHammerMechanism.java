package hammerstep.sim.physics;

/**
 * Twin-hammer clutch. One body: motor rotor (reflected) plus cage and hammers, the whole of which
 * strikes. Engaged, the hammers meet the anvil jaw face through the train's spring; after the
 * strike they swing out on the rebound (contact lost while the cage falls behind the anvil), or
 * when held against the jaw above the cam-out torque for the cam-out time. Swung out, the cage
 * turns freely until it has passed the jaw, and the hammers swing in for the jaw one relative
 * revolution on.
 */
final class TwinHammerMechanism extends JawStriker {

    private static final double PITCH = 2.0 * Math.PI;

    TwinHammerMechanism(MechanismSpec.TwinHammer spec, Drive drive, double trainStiffness, double dampingRatio) {
        super(drive, trainStiffness, dampingRatio, spec.cageInertiaKgM2() + drive.reflectedInertiaKgM2(), PITCH,
                spec.dogArcRad(), spec.camOutTorqueNm(), spec.camOutMs() * 1e-3, 0.0);
    }
}
