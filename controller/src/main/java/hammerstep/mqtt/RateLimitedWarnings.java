package hammerstep.mqtt;

import org.slf4j.Logger;

/**
 * Warnings that a client can cause at will (refused or malformed commands), kept from flooding the
 * log: in each interval the first {@code burst} are logged, the rest only counted, and once the
 * interval is over one line says how many were left out. The interval starts with its first
 * warning, so a quiet station logs the next refusal at once. Time comes in as {@code nowNs}; call
 * {@link #poll(long)} from the duty cycle so the count is logged even when no further warning comes.
 * Single-threaded (the delivery thread).
 */
public final class RateLimitedWarnings {

    private final Logger log;
    private final String what;
    private final int burst;
    private final long intervalNs;
    private boolean windowOpen;
    private long windowStartNs;
    private int loggedInWindow;
    private long leftOutInWindow;
    private long leftOutTotal;

    /**
     * @param what the warnings' subject in the summary line, plural ("refused commands")
     * @param burst warnings logged per interval, at least 1
     */
    public RateLimitedWarnings(Logger log, String what, int burst, long intervalNs) {
        if (burst < 1 || intervalNs <= 0) {
            throw new IllegalArgumentException("burst must be at least 1 and the interval positive");
        }
        this.log = log;
        this.what = what;
        this.burst = burst;
        this.intervalNs = intervalNs;
    }

    /** Logs the warning (SLF4J format) unless this interval's burst is used up; then only counts it. */
    public void warn(long nowNs, String format, Object... args) {
        poll(nowNs);
        if (!windowOpen) {
            windowOpen = true;
            windowStartNs = nowNs;
            loggedInWindow = 0;
            leftOutInWindow = 0;
        }
        if (loggedInWindow < burst) {
            loggedInWindow++;
            log.warn(format, args);
        } else {
            leftOutInWindow++;
            leftOutTotal++;
        }
    }

    /** Ends the interval once it is over, logging how many warnings it left out (if any). */
    public void poll(long nowNs) {
        if (!windowOpen || nowNs - windowStartNs - intervalNs < 0) {
            return;
        }
        if (leftOutInWindow > 0) {
            log.warn("{} more {} in the last {} s not logged ({} in all since start)", leftOutInWindow, what,
                    intervalNs / 1_000_000_000L, leftOutTotal);
        }
        windowOpen = false;
    }

    /** Warnings counted but not logged since start. */
    public long leftOut() {
        return leftOutTotal;
    }
}
