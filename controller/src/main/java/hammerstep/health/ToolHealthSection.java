package hammerstep.health;

import hammerstep.config.MapReader;
import hammerstep.config.StationSection;

import java.nio.file.Path;

/**
 * The optional {@code tool_health:} section of the station file. Without it the station watches its
 * tool with the defaults; {@code enabled: false} switches the watch off.
 *
 * <pre>
 * tool_health:
 *   tool: AW-07            # the tool's name in events (default: "tool")
 *   baseline_joints: 10    # joints learned per program before judging
 *   window: 5              # joints whose median is compared (odd)
 *   drop_percent: 15       # fall below the baseline that raises TOOL_WEAK
 *   min_blows: 3           # joints with fewer blows are not counted
 * </pre>
 */
public final class ToolHealthSection implements StationSection<ToolHealthSection.Watch> {

    public static final ToolHealthSection INSTANCE = new ToolHealthSection();

    /** @param settings null when the watch is switched off */
    public record Watch(String tool, ToolHealth.Settings settings) {

        public static final Watch DEFAULT = new Watch("tool", ToolHealth.Settings.DEFAULT);

        public boolean enabled() {
            return settings != null;
        }
    }

    @Override
    public String key() {
        return "tool_health";
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
        String tool = r.string("tool", "tool");
        ToolHealth.Settings d = ToolHealth.Settings.DEFAULT;
        int baseline = r.integer("baseline_joints", d.baselineJoints(), 3, 10_000);
        int window = r.integer("window", d.window(), 3, 101);
        if (window % 2 == 0) {
            r.problem("window", "'" + r.path("window") + "' is " + window + ": expected an odd number (a median of joints)");
            window++;
        }
        double drop = r.number("drop_percent", d.dropFraction() * 100, 1, 90);
        int minBlows = r.integer("min_blows", d.minBlows(), 2, 10_000);
        r.finish();
        return new Watch(tool, enabled ? new ToolHealth.Settings(baseline, window, drop / 100, minBlows) : null);
    }
}
