package hammerstep.web;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.joint.Direction;
import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.sequence.Pattern;
import hammerstep.signal.SignalFaults;

import java.io.IOException;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The joints and parts the station stored before a restart, read back from its journal's messages
 * into the view's {@link ResultLog} at start, so the results and capability pages show them. A
 * joint message carries the figures the pages show (verdict, reasons, final torque, blows and their
 * peaks, limits, the part, position, pass and attempt, its trace) but not the blows' times nor the
 * rundown's start on the station's clock: the joint page of such a joint draws its stored trace
 * judged again with its program (as {@code replay} does), or, without a trace, the peaks in order.
 * The program is the station's own when its id and revision match, else the station's program of
 * that id with the message's limits, else one made of the message's limits alone. A message id seen
 * twice is read once; a message that cannot be read is skipped and counted.
 */
public final class JournalRows {

    private static final ObjectMapper JSON = new ObjectMapper();

    /** What was read back: joints and parts taken, messages skipped. */
    public record Restored(int joints, int parts, int skipped) {
    }

    private JournalRows() {
    }

    /**
     * Reads the journal's joints and parts (as {@link Outbox#storedAtOpen} hands them, oldest first)
     * into {@code log}; call once at start, before the station stores anything new.
     */
    public static Restored restore(ResultLog log, Outbox outbox, Map<String, Pattern> patterns) {
        List<Outbox.Entry> joints = outbox.storedAtOpen(MessageKind.JOINT);
        List<Outbox.Entry> parts = outbox.storedAtOpen(MessageKind.PART);
        Set<String> seen = new HashSet<>();
        int j = 0;
        int p = 0;
        int skipped = 0;
        for (Outbox.Entry e : joints) {
            if (!seen.add(e.id())) {
                continue;
            }
            try {
                log.restoredJoint(joint(JSON.readTree(e.payload()), patterns), new ResultSink.Receipt(e.id(), e.seq()));
                j++;
            } catch (IOException | RuntimeException ex) {
                skipped++;
            }
        }
        for (Outbox.Entry e : parts) {
            if (!seen.add(e.id())) {
                continue;
            }
            try {
                log.part(part(JSON.readTree(e.payload())), new ResultSink.Receipt(e.id(), e.seq()));
                p++;
            } catch (IOException | RuntimeException ex) {
                skipped++;
            }
        }
        return new Restored(j, p, skipped);
    }

    static JointOutcome joint(JsonNode n, Map<String, Pattern> patterns) {
        JointProgram program = program(n, patterns);
        double[] peaks = numbers(n.path("peaks_nm"));
        int blows = n.path("blows").asInt(peaks.length);
        double durationMs = n.path("duration_ms").asDouble(0);
        long endNs = Math.round(durationMs * 1e6);
        long[] times = new long[peaks.length];
        for (int i = 0; i < peaks.length; i++) {
            // the message keeps no blow times: the peaks in order over the rundown's duration
            times[i] = peaks.length == 1 ? endNs : Math.round(endNs * (double) i / (peaks.length - 1));
        }
        List<Reason> reasons = new ArrayList<>();
        for (JsonNode r : n.path("reasons")) {
            reasons.add(Reason.valueOf(r.asText()));
        }
        int faults = 0;
        for (JsonNode f : n.path("sensor_faults")) {
            faults |= fault(f.asText());
        }
        Direction direction = "loosen".equals(n.path("direction").asText()) ? Direction.LOOSEN : Direction.TIGHTEN;
        JointResult r = new JointResult(program, 0, endNs, blows, peaks, times, new double[peaks.length],
                new double[peaks.length], n.path("final_torque_nm").asDouble(Double.NaN), durationMs, Long.MIN_VALUE,
                n.path("blows_after_shutoff").asInt(0), faults, Verdict.valueOf(n.path("verdict").asText()),
                List.copyOf(reasons), direction, n.path("rejected_impulses").asInt(0));
        String due = text(n, "calibration_due");
        String trace = text(n, "trace");
        return new JointOutcome(text(n, "part_serial"), text(n, "part_model"), text(n, "pattern"), text(n, "position"),
                n.path("position_index").asInt(0), text(n, "pass"), n.path("attempt").asInt(1), r,
                text(n, "transducer_serial"), due == null ? null : LocalDate.parse(due), Instant.parse(text(n, "time")),
                trace);
    }

    static PartOutcome part(JsonNode n) {
        List<String> ids = new ArrayList<>();
        for (JsonNode id : n.path("joints")) {
            ids.add(id.asText());
        }
        String started = text(n, "started");
        return new PartOutcome(text(n, "part_serial"), text(n, "part_model"), text(n, "pattern"), text(n, "verdict"),
                text(n, "ended"), ids, started == null ? null : Instant.parse(started), Instant.parse(text(n, "time")));
    }

    /** The program a stored joint was judged with, as near as the station's files and the message tell. */
    private static JointProgram program(JsonNode n, Map<String, Pattern> patterns) {
        String id = text(n, "program");
        String revision = text(n, "program_revision");
        JsonNode limits = n.path("limits");
        double min = limits.path("torque_nm").path("min").asDouble(Double.NaN);
        double max = limits.path("torque_nm").path("max").asDouble(Double.NaN);
        int bMin = limits.path("blows").path("min").asInt(0);
        int bMax = limits.path("blows").path("max").asInt(0);
        JointProgram same = null;
        for (Pattern p : patterns.values()) {
            for (Pattern.Pass pass : p.passes()) {
                JointProgram q = pass.program();
                if (q.id().equals(id) && (same == null || java.util.Objects.equals(q.revision(), revision))) {
                    same = q;
                }
            }
        }
        if (same != null && java.util.Objects.equals(same.revision(), revision)) {
            return same;
        }
        if (same != null) {
            return new JointProgram(id, revision, new JointProgram.Torque(min, same.torque().targetNm(), max),
                    same.finalTorque(), new JointProgram.Blows(same.blows().countAboveNm(), same.blows().releaseBelowNm(),
                    bMin, bMax, same.blows().deadTimeMs()), same.rundown(), same.shutoffAtNm(), same.rehitBlows(),
                    same.leftHand());
        }
        return new JointProgram(id, revision, new JointProgram.Torque(min, Double.NaN, max), FinalTorque.MAX_PEAK,
                new JointProgram.Blows(Double.NaN, Double.NaN, bMin, bMax, Double.NaN),
                new JointProgram.Rundown(Double.NaN, Double.NaN, Double.NaN), 0, 0);
    }

    private static int fault(String name) {
        for (int bit = 0; bit < 31; bit++) {
            List<String> names = SignalFaults.names(1 << bit);
            if (names.size() == 1 && names.get(0).equals(name)) {
                return 1 << bit;
            }
        }
        return 0;
    }

    private static double[] numbers(JsonNode array) {
        double[] out = new double[array.isArray() ? array.size() : 0];
        for (int i = 0; i < out.length; i++) {
            out[i] = array.get(i).asDouble();
        }
        return out;
    }

    private static String text(JsonNode n, String key) {
        JsonNode v = n.get(key);
        return v == null || v.isNull() ? null : v.asText();
    }
}
