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

    /** A listener that tells {@code first}, then {@code second}, of everything. */
    static StationListener both(StationListener first, StationListener second) {
        return new StationListener() {
            @Override
            public void onRundownStart(long nowNs) {
                first.onRundownStart(nowNs);
                second.onRundownStart(nowNs);
            }

            @Override
            public void onBlow(int index, double peakNm, long peakNs) {
                first.onBlow(index, peakNm, peakNs);
                second.onBlow(index, peakNm, peakNs);
            }

            @Override
            public void onTool(boolean enabled, long nowNs) {
                first.onTool(enabled, nowNs);
                second.onTool(enabled, nowNs);
            }

            @Override
            public void onTorque(float[] samples, int offset, int length, long firstSampleNs) {
                first.onTorque(samples, offset, length, firstSampleNs);
                second.onTorque(samples, offset, length, firstSampleNs);
            }

            @Override
            public void onCycle(StationAgent station, long nowNs) {
                first.onCycle(station, nowNs);
                second.onCycle(station, nowNs);
            }

            @Override
            public void onJoint(JointOutcome joint, ResultSink.Receipt receipt) {
                first.onJoint(joint, receipt);
                second.onJoint(joint, receipt);
            }

            @Override
            public void onPart(PartOutcome part, ResultSink.Receipt receipt) {
                first.onPart(part, receipt);
                second.onPart(part, receipt);
            }

            @Override
            public void onEvent(StationEvent event, ResultSink.Receipt receipt) {
                first.onEvent(event, receipt);
                second.onEvent(event, receipt);
            }

            @Override
            public void onStoreFailed(String message) {
                first.onStoreFailed(message);
                second.onStoreFailed(message);
            }
        };
    }

    default void onRundownStart(long nowNs) {
    }

    default void onBlow(int index, double peakNm, long peakNs) {
    }

    default void onTool(boolean enabled, long nowNs) {
    }

    /**
     * Every block of torque samples in N·m as the transducer delivered it (before auto-zero and
     * filter), {@code samples[offset, offset+length)} from {@code firstSampleNs} on: on the sample
     * path, so it must not allocate, and it must not keep the array.
     */
    default void onTorque(float[] samples, int offset, int length, long firstSampleNs) {
    }

    /**
     * At the end of every duty cycle, after tool and lamps: the station as it now stands. On the
     * station thread, every cycle: read what is needed, allocate only when something changed.
     */
    default void onCycle(StationAgent station, long nowNs) {
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
