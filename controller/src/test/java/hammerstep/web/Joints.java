package hammerstep.web;

import hammerstep.joint.Direction;
import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.ResultSink;

import java.time.Instant;
import java.util.List;

/** Stored joints for the web view's tests, made up in code. */
final class Joints {

    static final JointProgram FLANGE = new JointProgram("flange-final", "3", new JointProgram.Torque(180, 200, 230),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 4, 30, 7.5),
            new JointProgram.Rundown(10, 200, 5000), 205, 0);
    static final JointProgram SNUG = new JointProgram("flange-snug", "1", new JointProgram.Torque(80, 100, 130),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 1, 30, 7.5),
            new JointProgram.Rundown(10, 200, 5000), 0, 0);
    static final Instant T0 = Instant.parse("2026-03-02T06:00:00Z");

    private Joints() {
    }

    static JointOutcome joint(JointProgram p, String serial, String position, String pass, double finalNm, int blows,
                              List<Reason> reasons, int minute) {
        return joint(p, serial, position, pass, finalNm, blows, reasons, minute, Direction.TIGHTEN);
    }

    static JointOutcome joint(JointProgram p, String serial, String position, String pass, double finalNm, int blows,
                              List<Reason> reasons, int minute, Direction direction) {
        double[] peaks = new double[blows];
        long[] times = new long[blows];
        for (int i = 0; i < blows; i++) {
            peaks[i] = finalNm * (i + 1) / blows;
            times[i] = 10_000_000L * (i + 1);
        }
        JointResult r = new JointResult(p, 0, 10_000_000L * (blows + 1), blows, peaks, times, new double[blows],
                new double[blows], finalNm, 10.0 * (blows + 1), Long.MIN_VALUE, 0, 0,
                reasons.isEmpty() ? Verdict.GO : Verdict.NO_GO, reasons, direction);
        int index = position.isEmpty() ? 1 : position.charAt(position.length() - 1) - '0';
        return new JointOutcome(serial, "FL-4", "flange-4", position, index, pass, 1, r, "TQ-7", null,
                T0.plusSeconds(60L * minute), null);
    }

    static void add(ResultLog log, String id, long seq, JointOutcome j) {
        log.joint(j, new ResultSink.Receipt(id, seq));
    }
}
