package hammerstep.station.setup;

import hammerstep.config.MapReader;
import hammerstep.config.StationSection;

import java.nio.file.Path;

/**
 * The optional {@code sequence:} section: how the station paces what the operator sees.
 *
 * <pre>
 * sequence:
 *   complete_hold_ms: 1500   # green after a finished part, when no part-present sensor ends it
 *   blink_period_ms: 1000    # one on-off cycle of a blinking lamp
 * </pre>
 */
public final class TimingSection implements StationSection<TimingSection.Timing> {

    public static final TimingSection INSTANCE = new TimingSection();

    public record Timing(double completeHoldMs, double blinkPeriodMs) {
        public static final Timing DEFAULT = new Timing(1500, 1000);

        public long blinkPeriodNs() {
            return (long) (blinkPeriodMs * 1e6);
        }
    }

    @Override
    public String key() {
        return "sequence";
    }

    @Override
    public boolean required() {
        return false;
    }

    @Override
    public Timing absent(Path base) {
        return Timing.DEFAULT;
    }

    @Override
    public Timing read(MapReader r, Path base) {
        double hold = r.number("complete_hold_ms", Timing.DEFAULT.completeHoldMs(), 0, 600_000);
        double blink = r.number("blink_period_ms", Timing.DEFAULT.blinkPeriodMs(), 100, 10_000);
        r.finish();
        return new Timing(hold, blink);
    }
}
