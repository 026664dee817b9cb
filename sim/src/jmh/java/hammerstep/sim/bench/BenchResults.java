package hammerstep.sim.bench;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.StationId;

import java.time.Instant;
import java.time.LocalDate;
import java.util.List;

/** An invented joint result of typical size (12 blows) for the delivery benchmarks. */
final class BenchResults {

    static final StationId STATION = new StationId("plant-north", "axle-2", "hub-fit-1");

    private BenchResults() {
    }

    static JointOutcome joint() {
        JointProgram p = new JointProgram("hub-final", "sha256:0f3c9a", new JointProgram.Torque(180, 200, 230),
                FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 30, 4, 30, 7.5),
                new JointProgram.Rundown(10, 200, 5000), 205, 2);
        double[] peaks = new double[12];
        long[] times = new long[12];
        for (int i = 0; i < peaks.length; i++) {
            peaks[i] = 60 + i * 12.5;
            times[i] = i * 27_000_000L;
        }
        JointResult r = new JointResult(p, 0, 330_000_000, peaks.length, peaks, times, new double[12],
                new double[12], 197.5, 330.0, Long.MIN_VALUE, 0, 0, Verdict.GO, List.of());
        return new JointOutcome("WH-1000", "hub-5", "wheel-5", "P1", 1, "final", 1, r, "TQ-7731",
                LocalDate.of(2026, 9, 30), Instant.now(), null);
    }

    /** The {@code seq} of a joint message, read without a JSON parser. */
    static long seqOf(byte[] payload) {
        int n = payload.length;
        for (int i = 0; i + 6 < n; i++) {
            if (payload[i] == '"' && payload[i + 1] == 's' && payload[i + 2] == 'e' && payload[i + 3] == 'q'
                    && payload[i + 4] == '"' && payload[i + 5] == ':') {
                long v = 0;
                for (int j = i + 6; j < n && payload[j] >= '0' && payload[j] <= '9'; j++) {
                    v = v * 10 + (payload[j] - '0');
                }
                return v;
            }
        }
        return -1;
    }
}
