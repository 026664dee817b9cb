package hammerstep.station.loop;

import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;

import java.util.ArrayList;
import java.util.List;

/** Records what the station loop reports, in order; for tests that drive the loop on their own thread. */
public final class RecordingListener implements StationListener {

    public final List<JointOutcome> joints = new ArrayList<>();
    public final List<PartOutcome> parts = new ArrayList<>();
    public final List<StationEvent> events = new ArrayList<>();
    public final List<String> storeFailures = new ArrayList<>();

    @Override
    public void onJoint(JointOutcome joint, ResultSink.Receipt receipt) {
        joints.add(joint);
    }

    @Override
    public void onPart(PartOutcome part, ResultSink.Receipt receipt) {
        parts.add(part);
    }

    @Override
    public void onEvent(StationEvent event, ResultSink.Receipt receipt) {
        events.add(event);
    }

    @Override
    public void onStoreFailed(String message) {
        storeFailures.add(message);
    }
}
