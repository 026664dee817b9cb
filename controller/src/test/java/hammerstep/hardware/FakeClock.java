package hammerstep.hardware;

import org.agrona.concurrent.NanoClock;

/** A clock that moves only when told to; optionally a step on every reading (for timeouts). */
final class FakeClock implements NanoClock {

    long nowNs;
    long stepPerReadNs;

    @Override
    public long nanoTime() {
        long t = nowNs;
        nowNs += stepPerReadNs;
        return t;
    }

    void advanceNs(long ns) {
        nowNs += ns;
    }
}
