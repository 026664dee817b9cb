package hammerstep.hardware;

/**
 * Time-based debounce of one contact: the debounced state follows the raw state only after the raw
 * state has stayed the same for the whole debounce time. Pure: the caller passes the raw reading and
 * the time. Allocation-free; one thread.
 */
public final class Debouncer {

    private final long debounceNs;
    private boolean stable;
    private boolean candidate;
    private long candidateSinceNs;

    public Debouncer(long debounceNs, boolean initial) {
        if (debounceNs < 0) {
            throw new IllegalArgumentException("debounce time must not be negative");
        }
        this.debounceNs = debounceNs;
        this.stable = initial;
        this.candidate = initial;
    }

    /** Takes a raw reading made at {@code nowNs} and returns the debounced state. */
    public boolean update(boolean raw, long nowNs) {
        if (raw != candidate) {
            candidate = raw;
            candidateSinceNs = nowNs;
        }
        if (candidate != stable && nowNs - candidateSinceNs >= debounceNs) {
            stable = candidate;
        }
        return stable;
    }

    public boolean state() {
        return stable;
    }
}
