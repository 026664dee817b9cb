package hammerstep.results;

import hammerstep.config.MapReader;

import java.nio.file.Path;

/**
 * The {@code storage:} section of the station file: where the outbox journal lives and how much
 * room it may take.
 *
 * <pre>
 * storage:
 *   dir: /var/lib/hammerstep/outbox   # relative paths are taken from the station file's folder
 *   segment_mb: 4       # a journal file is closed and a new one begun past this size
 *   retain_mb: 64       # delivered journal files kept for inspection, oldest deleted first
 *   max_mb: 1024        # the journal's own limit: LOW at 80 %, FULL at 100 %
 *   low_free_mb: 200    # free space on the volume below which storage reads LOW
 *   min_free_mb: 50     # and below which it reads FULL (the rest finishes the part in progress)
 * </pre>
 *
 * @param dir          folder of the journal
 * @param segmentBytes size past which a journal file is rotated
 * @param retainBytes  delivered journal files kept beyond what is pending
 * @param maxBytes     journal size at which storage reads FULL
 * @param lowFreeBytes free volume space below which storage reads LOW
 * @param minFreeBytes free volume space below which storage reads FULL
 */
public record StorageSettings(Path dir, long segmentBytes, long retainBytes, long maxBytes,
                              long lowFreeBytes, long minFreeBytes) {

    private static final long MB = 1024L * 1024L;

    public StorageSettings {
        if (segmentBytes < 4096 || retainBytes < 0 || maxBytes < segmentBytes || minFreeBytes < 0
                || lowFreeBytes < minFreeBytes) {
            throw new IllegalArgumentException("inconsistent storage settings");
        }
    }

    /** Defaults for a journal in {@code dir}. */
    public static StorageSettings defaults(Path dir) {
        return new StorageSettings(dir, 4 * MB, 64 * MB, 1024 * MB, 200 * MB, 50 * MB);
    }

    /** Journal size at which storage reads LOW. */
    public long lowBytes() {
        return maxBytes / 5 * 4;
    }

    /**
     * Reads the section; problems go to the reader's {@link hammerstep.config.Problems}.
     *
     * @param base folder against which a relative {@code dir} is resolved
     */
    public static StorageSettings read(MapReader r, Path base) {
        String dir = r.string("dir");
        double segmentMb = r.number("segment_mb", 4, 0.01, 1024);
        double retainMb = r.number("retain_mb", 64, 0, 1_000_000);
        double maxMb = r.number("max_mb", 1024, 0.01, 1_000_000);
        double lowFreeMb = r.number("low_free_mb", 200, 0, 1_000_000);
        double minFreeMb = r.number("min_free_mb", 50, 0, 1_000_000);
        r.finish();
        if (maxMb < segmentMb) {
            r.problem("max_mb", "'" + r.path("max_mb") + "' must be at least segment_mb (" + segmentMb + ")");
        }
        if (lowFreeMb < minFreeMb) {
            r.problem("low_free_mb", "'" + r.path("low_free_mb") + "' must be at least min_free_mb (" + minFreeMb + ")");
        }
        if (!dir.isEmpty()) {
            String why = hammerstep.config.Folders.problem(base.resolve(dir));
            if (why != null) {
                r.problem("dir", "'" + r.path("dir") + "' cannot hold the result journal: " + why);
            }
        }
        if (!r.problems().isEmpty()) {
            return defaults(base.resolve(dir.isEmpty() ? "outbox" : dir));
        }
        return new StorageSettings(base.resolve(dir).normalize(), Math.max(4096, (long) (segmentMb * MB)),
                (long) (retainMb * MB), Math.max(4096, (long) (maxMb * MB)), (long) (lowFreeMb * MB),
                (long) (minFreeMb * MB));
    }
}
