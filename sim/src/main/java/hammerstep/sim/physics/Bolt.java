package hammerstep.sim.physics;

import java.util.List;

/**
 * A joint's bolt: ISO metric thread and ISO 898-1 property class. Its loads follow from the stress
 * area and the class's stresses. Beyond yield the bolt hardens from {@link #HARDENING} of the joint's
 * elastic rate toward {@link #saturationLoadN()} (a Voce law, our choice): clamp load saturates while
 * the nut keeps turning, as torque-angle curves of yielding bolts flatten (bolted-joint practice).
 *
 * @param size          designation, e.g. {@code M16} or {@code M14x1.5}
 * @param diameterMm    nominal diameter d
 * @param pitchMm       thread pitch P
 * @param propertyClass ISO 898-1 property class: {@code 8.8}, {@code 10.9} or {@code 12.9}
 */
public record Bolt(String size, double diameterMm, double pitchMm, String propertyClass) {

    /** Property classes this model knows. */
    public static final List<String> CLASSES = List.of("8.8", "10.9", "12.9");

    /** Initial hardening past yield as a fraction of the elastic rate (assumption: 2 %). */
    public static final double HARDENING = 0.02;

    /**
     * Of the margin between yield and tensile load, the part a torqued bolt can still take in tension:
     * the thread friction's torsion uses the rest (assumption: half).
     */
    public static final double TENSILE_MARGIN_USED = 0.5;

    /**
     * Stress area As = π/4 · ((d₂ + d₃)/2)², d₂ = d − 0.649519·P, d₃ = d − 1.226869·P
     * (ISO 898-1, stress area of a thread), mm².
     */
    public double stressAreaMm2() {
        double d2 = diameterMm - 0.649519 * pitchMm;
        double d3 = diameterMm - 1.226869 * pitchMm;
        double m = 0.5 * (d2 + d3);
        return Math.PI / 4 * m * m;
    }

    /** Proof stress Sp (ISO 898-1, minimum), MPa. */
    public double proofStressMpa() {
        return switch (propertyClass) {
            case "8.8" -> diameterMm <= 16 ? 580 : 600;
            case "10.9" -> 830;
            default -> 970;
        };
    }

    /** Lower yield strength Rp0.2 (ISO 898-1, minimum), MPa. */
    public double yieldStressMpa() {
        return switch (propertyClass) {
            case "8.8" -> diameterMm <= 16 ? 640 : 660;
            case "10.9" -> 940;
            default -> 1100;
        };
    }

    /** Tensile strength Rm (ISO 898-1, minimum), MPa. */
    public double tensileStressMpa() {
        return switch (propertyClass) {
            case "8.8" -> diameterMm <= 16 ? 800 : 830;
            case "10.9" -> 1040;
            default -> 1220;
        };
    }

    /** Proof load As·Sp, N. */
    public double proofLoadN() {
        return stressAreaMm2() * proofStressMpa();
    }

    /** Yield load As·Rp0.2, N: where the bolt (in tension alone) begins to yield. */
    public double yieldLoadN() {
        return stressAreaMm2() * yieldStressMpa();
    }

    /** Tensile load As·Rm, N. */
    public double tensileLoadN() {
        return stressAreaMm2() * tensileStressMpa();
    }

    /** Load the hardening approaches: yield load plus {@link #TENSILE_MARGIN_USED} of the margin to the tensile load, N. */
    public double saturationLoadN() {
        return yieldLoadN() + TENSILE_MARGIN_USED * (tensileLoadN() - yieldLoadN());
    }

    /** ISO coarse pitch for a diameter (M6 to M30), mm; NaN for another diameter. */
    public static double coarsePitchMm(double diameterMm) {
        double[][] table = {{6, 1.0}, {8, 1.25}, {10, 1.5}, {12, 1.75}, {14, 2.0}, {16, 2.0}, {18, 2.5}, {20, 2.5},
                {22, 2.5}, {24, 3.0}, {27, 3.0}, {30, 3.5}};
        for (double[] row : table) {
            if (row[0] == diameterMm) {
                return row[1];
            }
        }
        return Double.NaN;
    }
}
