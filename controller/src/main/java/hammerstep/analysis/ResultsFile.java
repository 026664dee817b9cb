package hammerstep.analysis;

import com.fasterxml.jackson.databind.JsonNode;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Reads joint results from a file of messages ({@link MessageLines}: one JSON object a line, or a topic
 * and the object as {@code mosquitto_sub -v} prints them; a station's results, the demo's
 * {@code --results-out} or a subscriber's raw log), as the quality system receives the joint messages
 * ({@code schema} {@value #JOINT_SCHEMA}). Only joint results are used: messages of other schemas
 * (part, event, status, responses) and commands are skipped and counted; a message repeated under its
 * {@code id} is used once and the repeats counted (the same id with other content is an error); a line
 * that is no whole message and cannot be a joint result is skipped and counted. A line without
 * {@code schema} that carries {@code final_torque_nm} (the output of {@code hammerstep replay}) is read
 * as a joint. A loosening ({@code "direction": "loosen"}) is no tightening of the joint: skipped and
 * counted too. A joint line missing a field is an error naming file and line.
 */
public final class ResultsFile {

    public static final String JOINT_SCHEMA = "hammerstep.joint.v1";
    /** Largest torque a result may carry: beyond any rotary torque transducer (as the trace reader's bound). */
    static final double MAX_TORQUE_NM = 1e6;
    /** Largest blow count a result may carry: far beyond any rundown (a program allows at most a few hundred). */
    static final int MAX_BLOWS = 100_000;

    private ResultsFile() {
    }

    /**
     * The joints of a file in file order, each id once, and what was left out.
     *
     * @param skipped             messages of other kinds, loosenings and commands
     * @param duplicates          messages dropped because their id came earlier (same content)
     * @param unreadable          lines that are no whole message and cannot be a joint result
     * @param firstUnreadableLine the first of those, 0 when none
     */
    public record Contents(Path file, List<JointRecord> joints, int skipped, int duplicates, int unreadable,
                           int firstUnreadableLine) {

        /** What was left out, in words, e.g. "3 repeated messages (same id) dropped"; "" when nothing was. */
        public String leftOut() {
            List<String> parts = new ArrayList<>();
            if (duplicates > 0) {
                parts.add(duplicates + (duplicates == 1 ? " repeated message" : " repeated messages")
                        + " (same id) dropped");
            }
            if (skipped > 0) {
                parts.add(skipped + (skipped == 1 ? " line" : " lines") + " of other messages skipped");
            }
            if (unreadable > 0) {
                parts.add(unreadable + (unreadable == 1 ? " line that is" : " lines that are") + " no message, skipped"
                        + " (first: line " + firstUnreadableLine + ")");
            }
            return String.join(", ", parts);
        }
    }

    public static Contents read(Path file) throws InputException {
        List<JointRecord> joints = new ArrayList<>();
        int[] skipped = {0};
        MessageLines.Tally tally = MessageLines.read(file, (line, node) -> {
            JsonNode schema = node.get("schema");
            boolean joint = schema == null ? node.has("final_torque_nm") : JOINT_SCHEMA.equals(schema.asText());
            JsonNode direction = node.get("direction");
            if (!joint || direction != null && "loosen".equals(direction.asText())) {
                skipped[0]++;
                return;
            }
            joints.add(joint(file, line, node));
        });
        return new Contents(file, joints, skipped[0] + tally.commands(), tally.duplicates(), tally.unreadable(),
                tally.firstUnreadableLine());
    }

    private static JointRecord joint(Path file, int line, JsonNode n) throws InputException {
        String where = file + ":" + line + ": ";
        String program = text(n, "program");
        if (program.isEmpty()) {
            throw new InputException(where + "joint result without 'program'");
        }
        double finalNm = torque(n, "final_torque_nm", where);
        int blows = count(n, "blows", where);
        JsonNode limits = n.get("limits");
        if (limits == null || !limits.isObject()) {
            throw new InputException(where + "joint result without 'limits' (the windows it was judged against)");
        }
        JsonNode torque = limits.get("torque_nm");
        JsonNode blowLimits = limits.get("blows");
        if (torque == null || blowLimits == null) {
            throw new InputException(where + "'limits' needs 'torque_nm' and 'blows', each with 'min' and 'max'");
        }
        JointRecord.Limits l = new JointRecord.Limits(torque(torque, "min", where + "limits.torque_nm: "),
                torque(torque, "max", where + "limits.torque_nm: "),
                count(blowLimits, "min", where + "limits.blows: "),
                count(blowLimits, "max", where + "limits.blows: "));
        if (l.torqueMinNm() > l.torqueMaxNm()) {
            throw new InputException(where + "limits.torque_nm: min " + torque.get("min") + " is above max "
                    + torque.get("max") + ": an inverted window judges nothing");
        }
        if (l.blowsMin() > l.blowsMax()) {
            throw new InputException(where + "limits.blows: min " + blowLimits.get("min") + " is above max "
                    + blowLimits.get("max") + ": an inverted window judges nothing");
        }
        List<String> reasons = new ArrayList<>();
        JsonNode r = n.get("reasons");
        if (r != null && r.isArray()) {
            r.forEach(x -> reasons.add(x.asText()));
        }
        return new JointRecord(line, text(n, "id"), program, text(n, "position"), text(n, "part_serial"),
                finalNm, blows, text(n, "verdict"), reasons, l, residualEstimate(n, where));
    }

    /**
     * The residual estimate audits are fitted against: {@code residual_estimate.uncalibrated_nm}
     * ({@code torque_nm} from a line that has no uncalibrated one); NaN when the joint has none.
     */
    private static double residualEstimate(JsonNode n, String where) throws InputException {
        JsonNode e = n.get("residual_estimate");
        if (e == null || !e.isObject()) {
            return Double.NaN;
        }
        String key = e.has("uncalibrated_nm") ? "uncalibrated_nm" : "torque_nm";
        if (!e.has(key)) {
            return Double.NaN;
        }
        return torque(e, key, where + "residual_estimate: ");
    }

    private static String text(JsonNode n, String key) {
        return MessageLines.text(n, key);
    }

    /** A torque in N·m: finite and within any transducer's range. */
    private static double torque(JsonNode n, String key, String where) throws InputException {
        double d = number(n, key, where);
        if (Math.abs(d) >= MAX_TORQUE_NM) {
            throw new InputException(where + "'" + key + "' " + n.get(key) + " N·m is beyond any torque transducer's range");
        }
        return d;
    }

    /** A count of blows: a whole number from 0 to {@link #MAX_BLOWS}. */
    private static int count(JsonNode n, String key, String where) throws InputException {
        double d = number(n, key, where);
        if (d < 0 || d > MAX_BLOWS || d != Math.rint(d)) {
            throw new InputException(where + "'" + key + "' is " + n.get(key) + ": expected a whole number of blows from 0 to "
                    + MAX_BLOWS);
        }
        return (int) d;
    }

    private static double number(JsonNode n, String key, String where) throws InputException {
        JsonNode v = n.get(key);
        if (v == null || !v.isNumber()) {
            throw new InputException(where + "'" + key + "' must be a number"
                    + (v == null ? " and is missing" : ", got " + v));
        }
        double d = v.asDouble();
        if (!Double.isFinite(d)) {
            throw new InputException(where + "'" + key + "' is not finite");
        }
        return d;
    }
}
