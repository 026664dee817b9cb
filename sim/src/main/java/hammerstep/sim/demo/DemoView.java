package hammerstep.sim.demo;

import hammerstep.results.StationId;
import hammerstep.sim.station.SimulatedStation;
import hammerstep.station.setup.StationConfig;

/** How a demo run shows itself: called on the demo's one thread. */
interface DemoView {

    void start(StationId id, StationConfig config, int parts);

    /** A result came back from the store (or an event); {@code nowNs} is virtual time. */
    void line(long nowNs, String text);

    /** After each station cycle; a view redraws at its own pace. */
    void frame(SimulatedStation station, DemoTally tally);

    void end(SimulatedStation station, DemoTally tally);
}
