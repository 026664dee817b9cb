package hammerstep.sim.physics;

import hammerstep.config.MapReader;

/** Reads the keys of a dog clutch's {@code mechanism} section (docs/simulator.md, "Dog clutches"). */
final class ClutchReader {

    private ClutchReader() {
    }

    static ClutchSpec read(String type, MapReader m) {
        double jh = m.requiredNumber("hammer_inertia_kg_m2", 1e-7, 1);
        double overlap = Math.toRadians(m.requiredNumber("overlap_deg", 1, 100));
        double part = m.requiredNumber(partKey(type), 100, 1e12);
        double releaseNm = m.requiredNumber("release_torque_nm", 0, 10_000);
        double releaseMs = m.number("release_ms", 3.0, 0.1, 1000);
        switch (type) {
            case "rocking-dog":
                return new ClutchSpec.RockingDog(jh, overlap, part, releaseNm, releaseMs);
            case "three-jaw":
                return new ClutchSpec.ThreeJaw(jh, overlap, part, releaseNm, releaseMs);
            default:
                MapReader bath = m.map("oil_bath");
                double film = bath.number("film_damping_ratio", 0.1, 0, 1);
                double drag = bath.number("drag_nm_per_rad_s", 1e-4, 0, 1);
                bath.finish();
                return new ClutchSpec.TwinPinOilBath(jh, overlap, part, releaseNm, releaseMs, film, drag);
        }
    }

    /** The stiffness key names the part that engages: a dog, a jaw or a pin. */
    static String partKey(String type) {
        switch (type) {
            case "rocking-dog":
                return "dog_stiffness_nm_per_rad";
            case "three-jaw":
                return "jaw_stiffness_nm_per_rad";
            default:
                return "pin_stiffness_nm_per_rad";
        }
    }
}
