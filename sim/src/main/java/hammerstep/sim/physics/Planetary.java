package hammerstep.sim.physics;

/** Speed ratios of a simple planetary stage from its tooth counts (Willis relation). */
public final class Planetary {

    private Planetary() {
    }

    /** Sun in, carrier out, ring held: input turns per output turn, {@code 1 + Zr/Zs}. */
    public static double ringFixedRatio(int sunTeeth, int ringTeeth) {
        return 1.0 + (double) ringTeeth / sunTeeth;
    }

    /** Sun in, ring out, carrier held: {@code -Zr/Zs} (the ring turns backwards). */
    public static double carrierFixedRatio(int sunTeeth, int ringTeeth) {
        return -(double) ringTeeth / sunTeeth;
    }

    /** Whether the teeth mesh on a common centre distance: {@code Zr = Zs + 2 Zp}. */
    public static boolean meshes(int sunTeeth, int planetTeeth, int ringTeeth) {
        return ringTeeth == sunTeeth + 2 * planetTeeth;
    }
}
