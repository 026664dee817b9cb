package hammerstep.station;

import java.time.Instant;

/** The real clock: {@link System#nanoTime()} for time, the system's UTC clock for stamps. Stateless, thread-safe. */
public final class SystemStationClock implements StationClock {

    @Override
    public long nanoTime() {
        return System.nanoTime();
    }

    /** Stamps relative to now, so a wall-clock step (NTP) shifts later stamps but never reorders deadlines. */
    @Override
    public Instant instantOf(long nanoTime) {
        return Instant.now().minusNanos(System.nanoTime() - nanoTime);
    }

    @Override
    public Instant now() {
        return Instant.now();
    }
}
