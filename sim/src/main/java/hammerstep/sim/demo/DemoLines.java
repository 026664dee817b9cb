package hammerstep.sim.demo;

import hammerstep.joint.JointResult;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;

import java.util.Locale;

/**
 * One line of text per result, as the plain view prints them and the live view lists the last ones.
 * Verdicts are spelt as the results carry them ({@code GO}, {@code NO_GO}).
 */
final class DemoLines {

    private DemoLines() {
    }

    static String joint(JointOutcome j) {
        JointResult r = j.result();
        return String.format(Locale.ROOT, "joint %-14s %-6s pos %2d %-4s try %d  %-5s %6.1f N·m %s %s%s%s",
                j.partSerial(), j.pass(), j.positionIndex(), "(" + j.position() + ")", j.attempt(),
                verdict(r.verdict()), r.finalTorqueNm(), blows(r.blows()), rate(r), r.reasons().isEmpty() ? ""
                        : "  " + r.reasons(),
                r.shutoffReached() ? "  shut-off, " + r.blowsAfterShutoff() + " after" : "");
    }

    /** The joint in the few columns the live view has: serial, pass, position, try, verdict, torque, blows, rate. */
    static String jointShort(JointOutcome j) {
        JointResult r = j.result();
        return String.format(Locale.ROOT, "%s %s %s #%d %-5s %5.1f N·m %s %s%s", j.partSerial(), j.pass(), j.position(),
                j.attempt(), verdict(r.verdict()), r.finalTorqueNm(), blows(r.blows()), rate(r),
                r.reasons().isEmpty() ? "" : " " + String.join(",", r.reasons().stream().map(Enum::name).toList()));
    }

    static String part(PartOutcome p) {
        return String.format(Locale.ROOT, "part  %-14s %-6s %s %s, %s", p.partSerial(), p.partModel(),
                p.verdict().equals("GO") ? "GO" : "NO_GO", p.ended(), DemoText.count(p.jointIds().size(), "joint"));
    }

    static String event(StationEvent e) {
        return String.format(Locale.ROOT, "event %-7s %-20s %s", e.severity(), e.code(), e.message());
    }

    static String verdict(Verdict v) {
        return v == Verdict.GO ? "GO" : "NO_GO";
    }

    /** "  1 blow ", " 12 blows": the count right-aligned, the word in the same columns either way. */
    private static String blows(int n) {
        return String.format(Locale.ROOT, "%3d %-5s", n, n == 1 ? "blow" : "blows");
    }

    /** The blow rate, or "-/min" for a joint of one blow, which has none. */
    private static String rate(JointResult r) {
        return r.blows() < 2 ? "    -/min" : String.format(Locale.ROOT, "%5.0f/min", r.blowRatePerMin());
    }
}
