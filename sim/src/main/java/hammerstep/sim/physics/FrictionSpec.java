package hammerstep.sim.physics;

import java.util.List;
import java.util.SplittableRandom;

/**
 * A joint's friction law for thread and bearing face, with the lubrication state the coefficients are drawn
 * for (docs/simulator.md, "Friction"). Each fastener draws its own kinetic coefficient for thread and for
 * bearing face and its own static-over-kinetic ratio for each, independently.
 *
 * <p>Kinetic coefficients: VDI 2230 Part 1 (2015), friction-class table (guide values for μ_G and μ_K, the
 * same range for thread and bearing face; read from its reproduction at amesweb.info, "Friction coefficient
 * guide values ... according to VDI 2230"). Oiled: class B, 0.08–0.16 (bright steel, oils or greases); dry:
 * class C, 0.14–0.24 (bright or phosphated steel in delivery state, no lubricant added). We read a class's
 * range as mean ± 2σ of a normal distribution clipped at ± 3σ (our reading: the table gives ranges only).
 * Static over kinetic: oiled 1.15 ± 0.04, dry 1.25 ± 0.06 (1σ; steel on steel, from memory of handbook
 * figures, not verified).
 *
 * @param model       the law
 * @param lubrication the state the coefficients are drawn for
 */
public record FrictionSpec(Model model, Lubrication lubrication) {

    /** Stribeck speed: below it kinetic friction rises toward static, m/s (our choice, from memory of the usual 10⁻³–10⁻¹ range). */
    public static final double STRIBECK_SPEED_M_S = 0.01;
    /** Static friction's growth with rest time: time constant of the dwell law, s (our choice). */
    public static final double DWELL_TIME_CONSTANT_S = 1.0;
    /** Exponent of the dwell law (μ_s rises as 1 − exp(−(t/τ)^m); a Kato-type law, exponent from memory). */
    public static final double DWELL_EXPONENT = 0.5;
    /** Slip after breakaway over which friction falls from its breakaway value to kinetic, m (our choice: tens of µm). */
    public static final double SLIP_MEMORY_M = 20e-6;
    /** Rest before a breakaway audit (docs/simulator.md, "Residual torque"), s. */
    public static final double AUDIT_DWELL_S = 60.0;

    /** The friction laws. */
    public enum Model {
        /** Static coefficient to break away, kinetic while turning. */
        COULOMB("coulomb"),
        /** Kinetic friction falls from static with slip speed, then rises with it (viscous). */
        STRIBECK("stribeck"),
        /** Static friction grows with rest time; after breakaway it falls to kinetic over a short slip. */
        STICK_SLIP("stick-slip");

        private final String key;

        Model(String key) {
            this.key = key;
        }

        public String key() {
            return key;
        }

        public static Model of(String key) {
            for (Model m : values()) {
                if (m.key.equals(key)) {
                    return m;
                }
            }
            return null;
        }
    }

    /** Lubrication states and their distributions. */
    public enum Lubrication {
        /** VDI 2230 Part 1 class B (0.08–0.16). */
        OILED("oiled", 0.12, 0.02, 1.15, 0.04, 0.02),
        /** VDI 2230 Part 1 class C (0.14–0.24). */
        DRY("dry", 0.19, 0.025, 1.25, 0.06, 0.005);

        private final String key;
        private final double kineticMean;
        private final double kineticSd;
        private final double staticRatioMean;
        private final double staticRatioSd;
        private final double viscousPerMps;

        Lubrication(String key, double kineticMean, double kineticSd, double staticRatioMean, double staticRatioSd,
                    double viscousPerMps) {
            this.key = key;
            this.kineticMean = kineticMean;
            this.kineticSd = kineticSd;
            this.staticRatioMean = staticRatioMean;
            this.staticRatioSd = staticRatioSd;
            this.viscousPerMps = viscousPerMps;
        }

        public String key() {
            return key;
        }

        /** Mean kinetic coefficient (thread and bearing face alike). */
        public double kineticMean() {
            return kineticMean;
        }

        /** 1σ of the kinetic coefficient before clipping. */
        public double kineticSd() {
            return kineticSd;
        }

        public double staticRatioMean() {
            return staticRatioMean;
        }

        public double staticRatioSd() {
            return staticRatioSd;
        }

        /** Viscous rise of the Stribeck curve per m/s of slip speed (our choice: oil film thicker on oil). */
        public double viscousPerMps() {
            return viscousPerMps;
        }

        public static Lubrication of(String key) {
            for (Lubrication l : values()) {
                if (l.key.equals(key)) {
                    return l;
                }
            }
            return null;
        }
    }

    /** Keys of the models, for preset files. */
    public static final List<String> MODEL_KEYS = List.of("coulomb", "stribeck", "stick-slip");
    /** Keys of the lubrication states, for preset files. */
    public static final List<String> LUBRICATION_KEYS = List.of("dry", "oiled");

    /** A kinetic coefficient: normal, clipped at ± 3σ. */
    public double drawKinetic(SplittableRandom random) {
        return clipped(random, lubrication.kineticMean, lubrication.kineticSd);
    }

    /** A static-over-kinetic ratio: normal, clipped at ± 3σ and at 1. */
    public double drawStaticRatio(SplittableRandom random) {
        return Math.max(1.0, clipped(random, lubrication.staticRatioMean, lubrication.staticRatioSd));
    }

    private static double clipped(SplittableRandom random, double mean, double sd) {
        double z = random.nextGaussian();
        return mean + sd * Math.max(-3.0, Math.min(3.0, z));
    }
}
