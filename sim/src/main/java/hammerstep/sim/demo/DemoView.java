package hammerstep.sim.demo;

import hammerstep.results.JointOutcome;
import hammerstep.results.StationId;
import hammerstep.sim.station.SimulatedStation;
import hammerstep.station.setup.StationConfig;

/** How a demo run shows itself: called on the demo's one thread. */
interface DemoView {

    /** The run is about to start: shows itself at once (the broker may take seconds to come up). */
    void start(StationId id, StationConfig config, int parts);

    /** What the run is doing before its first cycle or after its last ("starting the embedded broker"). */
    void status(String text);

    /** A result came back from the store (or an event); {@code nowNs} is virtual time. */
    void line(long nowNs, String text);

    /** A joint result came back from the store; {@code nowNs} is virtual time. */
    default void joint(long nowNs, JointOutcome joint) {
        line(nowNs, DemoLines.joint(joint));
    }

    /** After each station cycle; a view redraws at its own pace. */
    void frame(SimulatedStation station, DemoTally tally);

    void end(SimulatedStation station, DemoTally tally);
}
