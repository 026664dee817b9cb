package hammerstep.hardware;

import hammerstep.station.StationClock;

import java.time.Instant;

/** A clock that moves only when told to; optionally a step on every reading (for timeouts). */
final class FakeClock implements StationClock {

    long nowNs;
    long stepPerReadNs;

    @Override
    public long nanoTime() {
        long t = nowNs;
        nowNs += stepPerReadNs;
        return t;
    }

    @Override
    public Instant instantOf(long nanoTime) {
        return Instant.EPOCH.plusNanos(nanoTime);
    }

    void advanceNs(long ns) {
        nowNs += ns;
    }
}
