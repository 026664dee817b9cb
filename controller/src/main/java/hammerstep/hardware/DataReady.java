package hammerstep.hardware;

/**
 * Tells the acquisition when the ADC has a new conversion: the part's data-ready line, or a
 * timer at the sample rate for parts that convert on request. Polled from the acquisition thread.
 */
public interface DataReady {

    /** True when a new conversion can be read now; {@code nowNs} is the acquisition's clock reading. */
    boolean ready(long nowNs);

    /** Called after a conversion was read, so a timer can schedule the next one. */
    default void taken(long nowNs) {
    }
}
