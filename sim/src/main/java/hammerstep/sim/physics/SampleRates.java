package hammerstep.sim.physics;

/**
 * The least ADC rate at which a tool family's blow peaks read within 2 % on average and 5 % at worst
 * through an inline transducer of 20 kHz bandwidth (docs/engineer-guide.md, "Sample rate and peaks";
 * measured by {@code PeakErrorTableTest}): a metal strike's top lasts tens of microseconds, the
 * oil-pulse unit's pulse milliseconds.
 */
public final class SampleRates {

    /** Metal-on-metal strikes: cam-and-ball, twin hammer, dog clutches. */
    public static final double METAL_STRIKE_MIN_HZ = 30_000;
    /** The oil-pulse unit's rounder pulses. */
    public static final double OIL_PULSE_MIN_HZ = 10_000;

    private SampleRates() {
    }

    /** The recommended minimum sample rate for a tool with this mechanism, Hz. */
    public static double recommendedMinHz(MechanismSpec mechanism) {
        return mechanism instanceof MechanismSpec.OilPulse ? OIL_PULSE_MIN_HZ : METAL_STRIKE_MIN_HZ;
    }
}
