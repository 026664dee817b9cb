package hammerstep.sim.demo;

import hammerstep.app.UserError;

import java.io.IOException;
import java.io.Reader;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.Properties;

/**
 * Where a demo run on a {@code --state} folder left off, so the next run on it continues: the
 * parts handed to the operator so far (the next part serials follow them) and the virtual time the
 * run ended (the next run starts a minute later, so no result is stamped like an earlier one).
 * Kept as {@code demo-run.properties} beside the outbox.
 *
 * @param partsRun parts of the runs so far
 * @param start    virtual start of the next run
 */
record DemoState(int partsRun, Instant start) {

    static final String FILE = "demo-run.properties";
    /** Virtual start of a first run, so the same seed stamps the same times. */
    static final Instant FIRST_START = Instant.parse("2026-03-02T06:00:00Z");
    private static final long GAP_S = 60;

    /** The state a run on {@code dir} starts from; a folder without the file (or none) starts afresh. */
    static DemoState read(Path dir) {
        if (dir == null || !Files.isRegularFile(dir.resolve(FILE))) {
            return new DemoState(0, FIRST_START);
        }
        Path file = dir.resolve(FILE);
        Properties p = new Properties();
        try (Reader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            p.load(r);
            int parts = Integer.parseInt(p.getProperty("parts_run", "0").trim());
            Instant end = Instant.parse(p.getProperty("virtual_end", FIRST_START.toString()).trim());
            if (parts < 0) {
                throw new NumberFormatException("negative parts_run");
            }
            return new DemoState(parts, end.plusSeconds(GAP_S));
        } catch (IOException | IllegalArgumentException | DateTimeParseException e) {
            throw new UserError(file + ": not a demo state file the demo wrote (" + e.getMessage()
                    + "); remove it to start the part serials and the time afresh", 2);
        }
    }

    /** Records the end of a run of {@code parts} parts at virtual {@code end}. */
    void write(Path dir, int parts, Instant end) {
        if (dir == null) {
            return;
        }
        Properties p = new Properties();
        p.setProperty("parts_run", Integer.toString(partsRun + parts));
        p.setProperty("virtual_end", end.toString());
        try (Writer w = Files.newBufferedWriter(Files.createDirectories(dir).resolve(FILE), StandardCharsets.UTF_8)) {
            p.store(w, "hammerstep-sim demo: where the runs on this --state folder left off");
        } catch (IOException e) {
            throw new UserError(dir.resolve(FILE) + ": cannot record where the run left off: " + e.getMessage(), 1);
        }
    }
}
