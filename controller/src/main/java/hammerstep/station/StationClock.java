package hammerstep.station;

import java.time.Instant;

/**
 * The station's time. {@link #nanoTime()} is monotonic and is what every deadline and sample time
 * is measured in; compare readings as {@code deadline - now < 0}. Read it once per duty cycle and
 * pass the value down. The simulator supplies a virtual clock so a station runs faster than real
 * time and deterministically.
 */
public interface StationClock {

    /** Monotonic time in nanoseconds; only differences mean anything. */
    long nanoTime();

    /** The wall-clock (UTC) time at which this clock read {@code nanoTime}; used to stamp results. */
    Instant instantOf(long nanoTime);
}
