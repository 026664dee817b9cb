package hammerstep.sim.physics;

/**
 * Twin-pin clutch in an oil bath: two pins, on opposite sides of the hammer, shift into the path of
 * the anvil's two lugs and strike both at once, twice per relative revolution (the public
 * description of hammer mechanisms striking once or twice per revolution: encyclopedia article
 * "Impact wrench", section "Mechanism"). The mechanism runs in oil: the hammer turns against the
 * bath's viscous drag, and the oil film in each contact adds damping (a lower restitution than a
 * dry strike). The blow itself is metal on metal, not a hydraulic pulse. Pin travel is not
 * integrated: the pins are in once the hammer has passed a lug by the overlap arc (our assumption,
 * docs/simulator.md).
 */
final class TwinPinOilBathMechanism extends ClutchMechanism {

    TwinPinOilBathMechanism(ClutchSpec.TwinPinOilBath spec, Drive drive, double trainStiffness, double dampingRatio) {
        super(spec, drive, trainStiffness, dampingRatio);
    }
}
