package hammerstep.station;

import java.time.Instant;

/**
 * A clock that moves only when told to: tests, the simulator and {@code --fast} runs. Wall-clock
 * stamps are {@code epoch + nanoTime}. Single-threaded: whoever drives the virtual station owns it.
 */
public final class VirtualClock implements StationClock {

    private final Instant epoch;
    private long nowNs;

    public VirtualClock(Instant epoch) {
        this.epoch = epoch;
    }

    @Override
    public long nanoTime() {
        return nowNs;
    }

    @Override
    public Instant instantOf(long nanoTime) {
        return epoch.plusNanos(nanoTime);
    }

    public void advanceNs(long ns) {
        if (ns < 0) {
            throw new IllegalArgumentException("time runs forward only: " + ns);
        }
        nowNs += ns;
    }

    /** Sets the time; never earlier than now. */
    public void setNs(long ns) {
        advanceNs(ns - nowNs);
    }
}
