package hammerstep.sim.demo;

import java.nio.file.Path;

/**
 * What a demo run was asked for. Later options (broker URL, results and summary files, state
 * folder) join this record, so the runner's signature stays put.
 *
 * @param station the station file (config/demo/station.yaml by default)
 * @param parts   parts to run; 0 for the length of the simulation's part streams (one of each)
 * @param seed    seed of every random draw: the same seed gives the same run
 * @param fast    virtual time as fast as the machine goes; otherwise paced to the wall clock
 * @param plain   one line per event instead of the live view
 * @param supplyDropPercent the air pressure or battery voltage falls by this much over the run (0: steady)
 * @param tracesDir keep every joint's trace here (null: as the station file says)
 * @param delivery  results go through a file outbox and MQTT to a subscriber; false keeps them in
 *                  memory (quick runs in unit tests)
 * @param brokerUrl an external broker instead of the embedded one (null: embedded)
 * @param resultsOut every message the subscriber receives, one JSON line each (null: none)
 * @param summaryOut the counts the station produced, as JSON (null: none)
 * @param stateDir  the outbox folder, so a restart resumes (null: a temporary folder)
 */
public record DemoOptions(Path station, int parts, long seed, boolean fast, boolean plain, double supplyDropPercent,
                          Path tracesDir, boolean delivery, String brokerUrl, Path resultsOut, Path summaryOut,
                          Path stateDir) {

    public DemoOptions(Path station, int parts, long seed, boolean fast, boolean plain) {
        this(station, parts, seed, fast, plain, 0, null);
    }

    public DemoOptions(Path station, int parts, long seed, boolean fast, boolean plain, double supplyDropPercent,
                       Path tracesDir) {
        this(station, parts, seed, fast, plain, supplyDropPercent, tracesDir, false, null, null, null, null);
    }
}
