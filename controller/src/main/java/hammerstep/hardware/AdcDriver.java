package hammerstep.hardware;

/**
 * One ADC part on an {@link SpiLink}: brings the part up, then reads one conversion at a time as
 * signed counts (zero input reads 0, full positive input reads {@code 2^(bits-1) - 1}).
 * Not thread-safe: {@link #start()} and {@link #read()} run on the acquisition thread.
 */
public interface AdcDriver {

    /** The part's name as its maker writes it, e.g. {@code ADS1256}. */
    String part();

    /** Resolution including the sign, as {@link hammerstep.signal.Calibration#adcBits()} expects. */
    int bits();

    /** Conversions per second the part is set to deliver. */
    double rateHz();

    /**
     * Volts at the input (before the part's own gain) that read as full positive code at gain 1:
     * the {@code referenceV} of {@link hammerstep.signal.Calibration}.
     */
    double fullScaleInputV();

    /** Gain in front of the conversion (the part's PGA, or the front-end network for parts without one). */
    double gain();

    /** Resets and configures the part, checks that it answers as configured, and starts conversions. */
    void start();

    /** Reads the newest conversion; call when {@link DataReady} says one is ready. Allocation-free. */
    int read();

    /** Stops conversions (the part may stay powered). */
    void stop();
}
