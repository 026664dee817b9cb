package hammerstep.web;

import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.results.JointOutcome;
import hammerstep.web.ResultLog.JointRow;

import java.io.IOException;
import java.io.Writer;
import java.util.List;
import java.util.Locale;

/**
 * The results table as CSV (RFC 4180: comma, CRLF, fields with a comma, quote or line break quoted),
 * one joint a row, the columns named as in the joint message. A text field that a spreadsheet would
 * take for a formula (starting with {@code = + - @}, a tab or a carriage return) gets a leading
 * apostrophe: a part serial from a scanner must not run as a formula on the engineer's laptop.
 */
public final class JointCsv {

    static final String HEADER = "seq,id,at,part_serial,part_model,pattern,position,pass,attempt,program,"
            + "program_revision,final_torque_nm,blows,duration_ms,verdict,reasons,torque_min_nm,torque_max_nm,"
            + "blows_min,blows_max,direction,trace";

    private JointCsv() {
    }

    public static void write(List<JointRow> rows, Writer out) throws IOException {
        out.write(HEADER);
        out.write("\r\n");
        for (JointRow r : rows) {
            out.write(row(r));
            out.write("\r\n");
        }
        out.flush();
    }

    static String row(JointRow row) {
        JointOutcome j = row.joint();
        JointResult r = j.result();
        JointProgram p = r.program();
        StringBuilder b = new StringBuilder(200);
        b.append(row.seq()).append(',');
        text(b, row.id());
        text(b, j.at().toString());
        text(b, j.partSerial());
        text(b, j.partModel());
        text(b, j.pattern());
        text(b, j.position());
        text(b, j.pass());
        b.append(j.attempt()).append(',');
        text(b, p.id());
        text(b, p.revision() == null ? "" : p.revision());
        b.append(num(r.finalTorqueNm())).append(',');
        b.append(r.blows()).append(',');
        b.append(num(r.durationMs())).append(',');
        text(b, r.verdict().name());
        text(b, String.join(";", r.reasons().stream().map(Enum::name).toList()));
        b.append(num(p.torque().minNm())).append(',').append(num(p.torque().maxNm())).append(',');
        b.append(p.blows().min()).append(',').append(p.blows().max()).append(',');
        text(b, r.direction().name().toLowerCase(Locale.ROOT));
        b.append(field(j.tracePath() == null ? "" : j.tracePath()));
        return b.toString();
    }

    private static void text(StringBuilder b, String v) {
        b.append(field(v)).append(',');
    }

    /** One text field, quoted and defused as needed. */
    static String field(String v) {
        if (v == null) {
            return "";
        }
        String s = v;
        if (!s.isEmpty() && "=+-@\t\r".indexOf(s.charAt(0)) >= 0) {
            s = "'" + s;
        }
        if (s.indexOf(',') >= 0 || s.indexOf('"') >= 0 || s.indexOf('\n') >= 0 || s.indexOf('\r') >= 0) {
            s = '"' + s.replace("\"", "\"\"") + '"';
        }
        return s;
    }

    static String num(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%.2f", v) : "";
    }
}
