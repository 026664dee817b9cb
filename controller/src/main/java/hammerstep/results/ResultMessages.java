package hammerstep.results;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;

import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Writes the JSON messages the quality system receives (schemas in {@code docs/schema/}). Every
 * message starts with {@code schema}, {@code id}, {@code seq}, the station's identity and the UTC
 * {@code time}; field names are snake_case and a joint carries the figures of
 * {@link JointFields}. Thread-safe.
 */
public final class ResultMessages {

    private static final ObjectMapper JSON = new ObjectMapper().disable(SerializationFeature.FAIL_ON_EMPTY_BEANS);
    private static final DateTimeFormatter UTC =
            DateTimeFormatter.ofPattern("yyyy-MM-dd'T'HH:mm:ss.SSS'Z'").withZone(ZoneOffset.UTC);

    private ResultMessages() {
    }

    /** A joint message: identity and context, then the figures, verdict, reasons and limits. */
    public static byte[] joint(StationId station, String id, long seq, JointOutcome j) {
        Map<String, Object> m = head(MessageKind.JOINT.schema(), id, seq, station, j.at());
        m.put("part_serial", j.partSerial());
        m.put("part_model", j.partModel());
        m.put("pattern", j.pattern());
        m.put("position", j.position());
        m.put("position_index", j.positionIndex());
        m.put("pass", j.pass());
        m.put("attempt", j.attempt());
        Map<String, Object> figures = JointFields.of(j.result());
        m.put("program", figures.remove("program"));
        m.put("program_revision", j.result().program().revision());
        m.put("transducer_serial", j.transducerSerial());
        m.put("calibration_due", j.calibrationDue() == null ? null : j.calibrationDue().toString());
        m.putAll(figures);
        if (j.tracePath() != null) {
            m.put("trace", j.tracePath());
        }
        return bytes(m);
    }

    /** A part message: how the part ended, its verdict and the ids of its joints in order. */
    public static byte[] part(StationId station, String id, long seq, PartOutcome p) {
        Map<String, Object> m = head(MessageKind.PART.schema(), id, seq, station, p.at());
        m.put("part_serial", p.partSerial());
        m.put("part_model", p.partModel());
        m.put("pattern", p.pattern());
        m.put("verdict", p.verdict());
        m.put("ended", p.ended());
        m.put("started", p.started() == null ? null : time(p.started()));
        m.put("joint_count", p.jointIds().size());
        m.put("joints", p.jointIds());
        return bytes(m);
    }

    /** An event message: severity, code, one line for a person and the part it concerns, if any. */
    public static byte[] event(StationId station, String id, long seq, StationEvent e) {
        Map<String, Object> m = head(MessageKind.EVENT.schema(), id, seq, station, e.at());
        m.put("severity", e.severity().name());
        m.put("code", e.code());
        m.put("message", e.message());
        m.put("part_serial", e.partSerial());
        return bytes(m);
    }

    /** The fields every message starts with, in order. */
    public static Map<String, Object> head(String schema, String id, long seq, StationId station, Instant at) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("schema", schema);
        m.put("id", id);
        m.put("seq", seq);
        m.put("site", station.site());
        m.put("line", station.line());
        m.put("station", station.station());
        m.put("time", time(at));
        return m;
    }

    /** UTC with milliseconds, e.g. {@code 2026-03-04T05:06:07.089Z}. */
    public static String time(Instant at) {
        return UTC.format(at);
    }

    public static byte[] bytes(Map<String, Object> message) {
        try {
            return JSON.writeValueAsBytes(message);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot write a message of plain values", e);
        }
    }
}
