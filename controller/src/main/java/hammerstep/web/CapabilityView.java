package hammerstep.web;

import hammerstep.analysis.CapabilityStudy;
import hammerstep.analysis.JointRecord;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.results.JointFields;
import hammerstep.results.JointOutcome;
import hammerstep.web.ResultLog.JointRow;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

/**
 * Capability for the web view, by the same code as {@code hammerstep stats} ({@link CapabilityStudy}):
 * the joints are turned into the records {@code stats} reads from a results file, so the figures are
 * the same (final torque rounded to 0.01 N·m, as the joint message carries it). A joint whose
 * message id was already taken is a duplicate and is not counted; a loosening is no tightening
 * and is left out, as {@code stats} leaves it out.
 */
public final class CapabilityView {

    private CapabilityView() {
    }

    /** The study over {@code rows} (oldest first), per program and per position. */
    public static CapabilityStudy.Report of(List<JointRow> rows) {
        return CapabilityStudy.of(records(rows), true);
    }

    /** The joints as {@code stats} sees them: duplicates by id and loosenings dropped, order kept. */
    static List<JointRecord> records(List<JointRow> rows) {
        Set<String> seen = new LinkedHashSet<>();
        List<JointRecord> out = new ArrayList<>(rows.size());
        int line = 0;
        for (JointRow row : rows) {
            line++;
            JointOutcome j = row.joint();
            JointResult r = j.result();
            if (r.loosening() || (!row.id().isEmpty() && !seen.add(row.id()))) {
                continue;
            }
            JointProgram p = r.program();
            out.add(new JointRecord(line, row.id(), p.id(), j.position() == null ? "" : j.position(),
                    j.partSerial() == null ? "" : j.partSerial(), JointFields.round(r.finalTorqueNm(), 100),
                    r.blows(), r.verdict().name(),
                    r.reasons().stream().map(Enum::name).toList(),
                    new JointRecord.Limits(p.torque().minNm(), p.torque().maxNm(), p.blows().min(), p.blows().max())));
        }
        return out;
    }
}
