package hammerstep.sim.broker;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationId;

import java.time.Instant;
import java.time.LocalDate;
import java.util.List;

/** Invented results for the broker tests (demo-style data, not check values). */
final class TestResults {

    static final StationId STATION = new StationId("plant-north", "axle-2", "hub-fit-1");

    private TestResults() {
    }

    static JointOutcome joint(int n) {
        JointProgram p = new JointProgram("hub-final", "sha256:0f3c9a", new JointProgram.Torque(180, 200, 230),
                FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 30, 4, 30, 7.5),
                new JointProgram.Rundown(10, 200, 5000), 205, 2);
        boolean go = n % 7 != 0;
        double[] peaks = go ? new double[] {120.5, 171.25, 196.0, 203.4} : new double[] {101.0, 140.0};
        long[] times = new long[peaks.length];
        for (int i = 0; i < times.length; i++) {
            times[i] = i * 27_000_000L;
        }
        JointResult r = new JointResult(p, 0, 90_000_000, peaks.length, peaks, times, new double[peaks.length],
                new double[peaks.length], peaks[peaks.length - 1], 90.0, Long.MIN_VALUE, 0, 0,
                go ? Verdict.GO : Verdict.NO_GO, go ? List.of() : List.of(Reason.TORQUE_LOW, Reason.BLOWS_FEW));
        int position = 1 + (n - 1) % 5;
        return new JointOutcome("WH-" + (1000 + (n - 1) / 5), "hub-5", "wheel-5", "P" + position, position, "final",
                1, r, "TQ-7731", LocalDate.of(2026, 9, 30), Instant.now(), null);
    }

    static PartOutcome part(String serial, List<String> jointIds) {
        return new PartOutcome(serial, "hub-5", "wheel-5", "GO", "COMPLETE", jointIds, Instant.now(), Instant.now());
    }
}
