package hammerstep.station.loop;

import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;

/**
 * Watches a station at work (a terminal view, a log). Called on the station thread; must return
 * quickly and must not throw. Results arrive after they were stored.
 */
public interface StationListener {

    StationListener NONE = new StationListener() { };

    default void onRundownStart(long nowNs) {
    }

    default void onBlow(int index, double peakNm, long peakNs) {
    }

    default void onTool(boolean enabled, long nowNs) {
    }

    default void onJoint(JointOutcome joint, ResultSink.Receipt receipt) {
    }

    default void onPart(PartOutcome part, ResultSink.Receipt receipt) {
    }

    default void onEvent(StationEvent event, ResultSink.Receipt receipt) {
    }

    /** A result could not be stored; the station now stands in FAULT. */
    default void onStoreFailed(String message) {
    }
}
