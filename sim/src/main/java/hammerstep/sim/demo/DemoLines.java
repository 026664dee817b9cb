package hammerstep.sim.demo;

import hammerstep.joint.JointResult;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;

import java.util.Locale;

/** One line of text per result, as the plain view prints them and the live view lists the last ones. */
final class DemoLines {

    private DemoLines() {
    }

    static String joint(JointOutcome j) {
        JointResult r = j.result();
        return String.format(Locale.ROOT, "joint %-14s %-6s pos %2d %-4s try %d  %-5s %6.1f N·m %3d blows %5.0f/min%s%s",
                j.partSerial(), j.pass(), j.positionIndex(), "(" + j.position() + ")", j.attempt(),
                r.verdict() == hammerstep.joint.Verdict.GO ? "GO" : "NO-GO", r.finalTorqueNm(), r.blows(),
                r.blowRatePerMin(), r.reasons().isEmpty() ? "" : "  " + r.reasons(),
                r.shutoffReached() ? "  shut-off, " + r.blowsAfterShutoff() + " after" : "");
    }

    static String part(PartOutcome p) {
        return String.format(Locale.ROOT, "part  %-14s %-6s %s %s, %d joints", p.partSerial(), p.partModel(),
                p.verdict().equals("GO") ? "GO" : "NO-GO", p.ended(), p.jointIds().size());
    }

    static String event(StationEvent e) {
        return String.format(Locale.ROOT, "event %-7s %-20s %s", e.severity(), e.code(), e.message());
    }
}
