package hammerstep.station;

import java.time.Instant;
import java.util.function.LongSupplier;

/** A test clock: monotonic time read from the test's own counter, every stamp the same fixed instant. */
public final class FixedWallClock implements StationClock {

    private final LongSupplier nanos;
    private final Instant wall;

    public FixedWallClock(LongSupplier nanos, Instant wall) {
        this.nanos = nanos;
        this.wall = wall;
    }

    @Override
    public long nanoTime() {
        return nanos.getAsLong();
    }

    @Override
    public Instant instantOf(long nanoTime) {
        return wall;
    }
}
