package hammerstep.sim.physics;

/**
 * Three-jaw clutch: three jaws on the hammer meet three jaws on the anvil at once, every third of a
 * relative revolution, and the three share each blow (in parallel: three times one jaw's contact
 * stiffness). Faster, lighter blows several times per revolution are the other family of hammer
 * mechanisms in the public description (encyclopedia article "Impact wrench", section "Mechanism");
 * the jaws coming in once the hammer has passed a jaw and letting go on the rebound are our
 * assumptions (docs/simulator.md).
 */
final class ThreeJawClutchMechanism extends ClutchMechanism {

    ThreeJawClutchMechanism(ClutchSpec.ThreeJaw spec, Drive drive, double trainStiffness, double dampingRatio) {
        super(spec, drive, trainStiffness, dampingRatio);
    }
}
