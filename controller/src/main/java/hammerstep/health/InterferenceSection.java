package hammerstep.health;

import hammerstep.config.MapReader;
import hammerstep.config.StationSection;

import java.nio.file.Path;

/**
 * The optional {@code interference:} section of the station file. Without it the station warns
 * above {@link InterferenceWatch#DEFAULT_WARN_PER_HOUR} rejected impulses an hour.
 *
 * <pre>
 * interference:
 *   warn_per_hour: 60     # rejected impulses within an hour above which INTERFERENCE is raised
 *   enabled: true         # false: no warning (impulses are still rejected and counted per joint)
 * </pre>
 */
public final class InterferenceSection implements StationSection<InterferenceSection.Watch> {

    public static final InterferenceSection INSTANCE = new InterferenceSection();

    /** @param warnPerHour 0 when the warning is switched off */
    public record Watch(long warnPerHour) {

        public static final Watch DEFAULT = new Watch(InterferenceWatch.DEFAULT_WARN_PER_HOUR);

        public boolean enabled() {
            return warnPerHour > 0;
        }
    }

    @Override
    public String key() {
        return "interference";
    }

    @Override
    public boolean required() {
        return false;
    }

    @Override
    public Watch absent(Path base) {
        return Watch.DEFAULT;
    }

    @Override
    public Watch read(MapReader r, Path base) {
        boolean enabled = r.bool("enabled", true);
        int level = r.integer("warn_per_hour", InterferenceWatch.DEFAULT_WARN_PER_HOUR, 1, 10_000_000);
        r.finish();
        return new Watch(enabled ? level : 0);
    }
}
