package hammerstep.analysis;

import java.util.List;

/**
 * One judged joint as the quality system received it (a line of a results JSONL file).
 *
 * @param line          1-based line number in its file, for messages
 * @param id            the message's stable id, or "" when it has none (replay output)
 * @param position      the position's label in the pattern, or "" when the line carries none
 * @param partSerial    the part's serial, or "" when the line carries none
 * @param finalTorqueNm the joint's final torque per its program's rule
 * @param reasons       NO-GO reason codes, empty for GO
 * @param limits        the windows the joint was judged against
 * @param residualEstimateNm the joint's residual estimate by the default factor
 *                      ({@code residual_estimate.uncalibrated_nm}); NaN when it carries none
 */
public record JointRecord(
        int line,
        String id,
        String program,
        String position,
        String partSerial,
        double finalTorqueNm,
        int blows,
        String verdict,
        List<String> reasons,
        Limits limits,
        double residualEstimateNm) {

    public JointRecord {
        reasons = List.copyOf(reasons);
    }

    /** A joint without a residual estimate. */
    public JointRecord(int line, String id, String program, String position, String partSerial, double finalTorqueNm,
                       int blows, String verdict, List<String> reasons, Limits limits) {
        this(line, id, program, position, partSerial, finalTorqueNm, blows, verdict, reasons, limits, Double.NaN);
    }

    /** The torque window (N·m) and blow-count window a joint was judged against. */
    public record Limits(double torqueMinNm, double torqueMaxNm, int blowsMin, int blowsMax) {

        @Override
        public String toString() {
            return "torque " + fmt(torqueMinNm) + ".." + fmt(torqueMaxNm) + " N·m, blows " + blowsMin + ".." + blowsMax;
        }

        private static String fmt(double v) {
            return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
        }
    }

    /** True when the measurement itself was not valid (a sensor fault): such a joint says nothing of the process. */
    public boolean sensorFault() {
        return reasons.contains("SENSOR_FAULT");
    }
}
