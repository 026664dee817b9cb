package hammerstep.trace;

import hammerstep.config.MapReader;
import hammerstep.config.StationSection;

import java.nio.file.Path;

/**
 * The optional {@code traces:} section of the station file: where the station keeps every joint's
 * torque trace and how many it keeps. Without the section no traces are kept.
 *
 * <pre>
 * traces:
 *   dir: /var/lib/hammerstep/traces   # relative paths are against the station file's folder
 *   max_count: 20000                  # traces kept at most (oldest deleted first)
 *   max_mb: 1000                      # and megabytes (10^6 bytes) at most
 *   encoding: int16                   # int16 (2 bytes a sample, scaled per trace) or float32
 *   lead_ms: 50                       # signal kept before a rundown's start
 *   ring_s: 12                        # longest span kept per joint (memory: rate × this × 4 bytes)
 * </pre>
 */
public final class TracesSection implements StationSection<TracesSection.Traces> {

    public static final TracesSection INSTANCE = new TracesSection();

    public record Traces(Path dir, int maxCount, long maxBytes, StoredTrace.Encoding encoding, double leadMs,
                         double ringSeconds) { }

    @Override
    public String key() {
        return "traces";
    }

    @Override
    public boolean required() {
        return false;
    }

    @Override
    public Traces read(MapReader r, Path base) {
        String dir = r.string("dir");
        int count = r.integer("max_count", 20_000, 1, 10_000_000);
        double mb = r.number("max_mb", 1000, 1, 10_000_000);
        String enc = r.choice("encoding", "int16", java.util.List.of("int16", "float32"));
        double lead = r.number("lead_ms", 50, 0, 10_000);
        double ring = r.number("ring_s", 12, 0.1, 600);
        r.finish();
        Path d = Path.of(dir.isEmpty() ? "traces" : dir);
        Path where = base == null || d.isAbsolute() ? d : base.resolve(d);
        if (!dir.isEmpty()) {
            String why = hammerstep.config.Folders.problem(where);
            if (why != null) {
                r.problem("dir", "'" + r.path("dir") + "' cannot hold the stored traces: " + why);
            }
        }
        return new Traces(where, count, (long) (mb * 1e6),
                enc.equals("float32") ? StoredTrace.Encoding.FLOAT32 : StoredTrace.Encoding.INT16, lead, ring);
    }
}
