package hammerstep.station.setup;

import hammerstep.config.MapReader;
import hammerstep.config.StationSection;
import hammerstep.results.StationId;

import java.nio.file.Path;

/**
 * The {@code identity:} section: which station this is, as the quality system names it.
 *
 * <pre>
 * identity: { site: plant-07, line: axle-2, station: hub-torque-1 }
 * </pre>
 */
public final class IdentitySection implements StationSection<StationId> {

    public static final IdentitySection INSTANCE = new IdentitySection();

    @Override
    public String key() {
        return "identity";
    }

    @Override
    public StationId read(MapReader r, Path base) {
        String site = level(r, "site");
        String line = level(r, "line");
        String station = level(r, "station");
        r.finish();
        return new StationId(site, line, station);
    }

    private static String level(MapReader r, String key) {
        String v = r.string(key);
        if (!r.has(key)) {
            return "unknown";
        }
        if (!StationId.validLevel(v)) {
            r.problem(key, "'" + r.path(key) + "' is \"" + v
                    + "\": expected 1 to 64 letters, digits, '.', '_' or '-' (it is one MQTT topic level)");
            return "unknown";
        }
        return v;
    }
}
