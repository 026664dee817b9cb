package hammerstep.station;

import java.time.Instant;

/**
 * The one clock of the controller: the station loop, the acquisition and the ADC driver, the result
 * publisher and its commands and status, and the result sink all take this type.
 * {@link #nanoTime()} is monotonic and is what every deadline and sample time is measured in;
 * compare readings as {@code deadline - now < 0}. Read it once per duty cycle and pass the value
 * down. Wall-clock (UTC) time is only for stamps, never for deadlines. Two implementations:
 * {@link SystemStationClock} (the only code that reads the system clock) and {@link VirtualClock}
 * (moves only when told to: tests, the simulator and {@code --fast} runs).
 */
public interface StationClock {

    /** Monotonic time in nanoseconds; only differences mean anything. */
    long nanoTime();

    /** The wall-clock (UTC) time at which this clock read {@code nanoTime}; used to stamp results. */
    Instant instantOf(long nanoTime);

    /** The wall-clock (UTC) time now: stamps of messages and events that carry no sample time. */
    default Instant now() {
        return instantOf(nanoTime());
    }
}
