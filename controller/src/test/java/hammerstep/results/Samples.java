package hammerstep.results;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;

import java.time.Instant;
import java.time.LocalDate;
import java.util.List;

/** Invented results for tests (demo-style data, not check values). */
public final class Samples {

    public static final StationId STATION = new StationId("plant-north", "axle-2", "hub-fit-1");
    public static final Instant T0 = Instant.parse("2026-03-04T05:06:07.089Z");

    private Samples() {
    }

    public static JointProgram program() {
        return new JointProgram("hub-final", "sha256:0f3c9a", new JointProgram.Torque(180, 200, 230),
                FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 30, 4, 30, 7.5),
                new JointProgram.Rundown(10, 200, 5000), 205, 2);
    }

    public static JointResult result(boolean go) {
        double[] peaks = go ? new double[] {120.5, 171.25, 196.0, 203.4} : new double[] {101.0, 140.0};
        long[] times = go ? new long[] {0, 27_000_000, 54_000_000, 81_000_000} : new long[] {0, 27_000_000};
        return new JointResult(program(), 0, 90_000_000, peaks.length, peaks, times, new double[peaks.length],
                new double[peaks.length], peaks[peaks.length - 1], 90.0, go ? 81_000_000 : Long.MIN_VALUE, 0, 0,
                go ? Verdict.GO : Verdict.NO_GO, go ? List.of() : List.of(Reason.TORQUE_LOW, Reason.BLOWS_FEW));
    }

    public static JointOutcome joint(int position, boolean go) {
        return new JointOutcome("WH-0001", "hub-5", "wheel-5", "P" + position, position, "final", 1, result(go),
                "TQ-7731", LocalDate.of(2026, 9, 30), T0.plusSeconds(position), null);
    }

    public static PartOutcome part(List<String> jointIds) {
        return new PartOutcome("WH-0001", "hub-5", "wheel-5", "GO", "COMPLETE", jointIds, T0, T0.plusSeconds(60));
    }

    public static StationEvent event() {
        return new StationEvent(StationEvent.Severity.WARNING, "CALIBRATION_DUE", "transducer TQ-7731 is due in 7 days",
                null, T0);
    }
}
