package hammerstep.health;

import hammerstep.results.StationEvent;

import java.time.Instant;

/**
 * Counts the electrical impulses the conditioner rejects and warns when they come too often: more
 * than {@code warnPerHour} within the last hour raises {@code INTERFERENCE} (a warning pointing at the
 * transducer cable's shielding and grounding); once the count over the hour is back at or below half
 * the level, {@code INTERFERENCE_OK} (a notice). Rejected impulses change no result, but a line where
 * they are frequent is one where a larger or wider disturbance will sooner or later be a fault.
 *
 * <p>The hour is kept as 60 one-minute counts. {@link #add} is for the sample path (one addition);
 * {@link #poll} for the station's cycle. Single-threaded; allocates only the event it returns.
 */
public final class InterferenceWatch {

    public static final String WARNING = "INTERFERENCE";
    public static final String OK = "INTERFERENCE_OK";
    /** Default warning level, impulses per hour: one a minute is already a line worth a look. */
    public static final int DEFAULT_WARN_PER_HOUR = 60;

    private static final long MINUTE_NS = 60_000_000_000L;

    private final long warnPerHour;
    private final long[] minutes = new long[60];
    private int current;
    private long minuteStartNs;
    private boolean started;
    private long pending;
    private boolean warned;

    /** @param warnPerHour level above which the warning is raised; at least 1 */
    public InterferenceWatch(long warnPerHour) {
        if (warnPerHour < 1) {
            throw new IllegalArgumentException("warnPerHour must be at least 1");
        }
        this.warnPerHour = warnPerHour;
    }

    /** Notes {@code impulses} more rejected impulses. */
    public void add(long impulses) {
        pending += impulses;
    }

    /**
     * Moves the hour on to {@code nowNs} and returns the event to store when the warning rises or
     * clears, else null.
     */
    public StationEvent poll(long nowNs, Instant at) {
        if (!started) {
            started = true;
            minuteStartNs = nowNs;
        }
        while (nowNs - minuteStartNs >= MINUTE_NS) {
            minuteStartNs += MINUTE_NS;
            current = (current + 1) % minutes.length;
            minutes[current] = 0;
        }
        minutes[current] += pending;
        pending = 0;
        long hour = lastHour();
        if (!warned && hour > warnPerHour) {
            warned = true;
            return new StationEvent(StationEvent.Severity.WARNING, WARNING, hour
                    + " electrical impulses rejected from the torque signal within the hour (warning above "
                    + warnPerHour + "): check the transducer cable's shielding and grounding, and welders, "
                    + "contactors or drives switching nearby", null, at);
        }
        if (warned && hour <= warnPerHour / 2) {
            warned = false;
            return new StationEvent(StationEvent.Severity.NOTICE, OK, hour
                    + " electrical impulses rejected within the hour: interference back below the warning level",
                    null, at);
        }
        return null;
    }

    /** Impulses rejected within the last hour (the minute under way included). */
    public long lastHour() {
        long sum = pending;
        for (long m : minutes) {
            sum += m;
        }
        return sum;
    }

    public boolean warned() {
        return warned;
    }
}
