package hammerstep.sequence;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;

import java.util.List;

/** Programs, patterns and judged results built in code for sequence tests. */
final class TestPrograms {

    static final JointProgram SNUG = program("snug", 40, 50, 70, Double.NaN);
    static final JointProgram FINAL = program("final", 180, 200, 230, 205);

    private TestPrograms() {
    }

    static JointProgram program(String id, double min, double target, double max, double shutoff) {
        return new JointProgram(id, "", new JointProgram.Torque(min, target, max), FinalTorque.MAX_PEAK,
                new JointProgram.Blows(20, 10, 1, 40, 7.5), new JointProgram.Rundown(10, 100, 4000), shutoff, 0);
    }

    static Pattern.Pass pass(String name, JointProgram program, int[] order, int attempts, Acknowledge ack, AfterNoGo after) {
        return new Pattern.Pass(name, program, order, attempts, ack, after);
    }

    /** Four positions, snug then final, cross order; rework as given on both passes. */
    static Pattern fourBolt(int attempts, Acknowledge ack, AfterNoGo after) {
        return new Pattern("flange-4", "", List.of("A", "B", "C", "D"), List.of(
                pass("snug", SNUG, Order.cross(4), attempts, ack, after),
                pass("final", FINAL, Order.cross(4), attempts, ack, after)));
    }

    static JointResult go(JointProgram p) {
        double t = p.torque().targetNm();
        return new JointResult(p, 0, 1, 6, new double[] {t}, new long[] {1}, new double[] {2}, new double[] {0.1},
                t, 50, Long.MIN_VALUE, 0, 0, Verdict.GO, List.of());
    }

    static JointResult noGo(JointProgram p) {
        double t = p.torque().minNm() * 0.5;
        return new JointResult(p, 0, 1, 3, new double[] {t}, new long[] {1}, new double[] {2}, new double[] {0.1},
                t, 50, Long.MIN_VALUE, 0, 0, Verdict.NO_GO, List.of(Reason.TORQUE_LOW));
    }
}
