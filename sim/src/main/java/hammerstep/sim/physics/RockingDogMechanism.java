package hammerstep.sim.physics;

/**
 * Rocking dog: a single hammer dog that rocks on a pin in the hammer frame, into the path of the
 * anvil's jaw once per relative revolution and out again after the strike, so the whole frame
 * delivers one heavy blow per turn (slower, heavier blows once per revolution: the public
 * description of impact-wrench hammer mechanisms in the encyclopedia article "Impact wrench",
 * section "Mechanism"). The dog's own rocking is not integrated: it is in as soon as the frame has
 * passed the jaw by the overlap arc, and out on the rebound or when pushed out by a held torque
 * (our assumptions, docs/simulator.md). One dog carries the whole blow.
 */
final class RockingDogMechanism extends ClutchMechanism {

    RockingDogMechanism(ClutchSpec.RockingDog spec, Drive drive, double trainStiffness, double dampingRatio) {
        super(spec, drive, trainStiffness, dampingRatio);
    }
}
