package hammerstep.joint;

import java.util.ArrayList;
import java.util.List;

/** Keeps what a monitor reports. */
final class RecordingJointEvents implements JointEvents {

    final List<JointResult> results = new ArrayList<>();
    final List<Long> starts = new ArrayList<>();
    final List<Long> shutoffs = new ArrayList<>();
    final List<Integer> faults = new ArrayList<>();
    int blows;

    @Override
    public void onRundownStart(long startNs) {
        starts.add(startNs);
    }

    @Override
    public void onBlow(int index, double peakNm, long peakNs) {
        blows++;
    }

    @Override
    public void onShutoff(long crossingNs) {
        shutoffs.add(crossingNs);
    }

    @Override
    public void onFault(int f, long atNs) {
        faults.add(f);
    }

    @Override
    public void onRundown(JointResult result) {
        results.add(result);
    }
}
