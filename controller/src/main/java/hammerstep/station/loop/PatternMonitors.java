package hammerstep.station.loop;

import hammerstep.joint.InputStage;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.sequence.Pattern;

import java.util.HashMap;
import java.util.Map;

/** The joint monitors a station needs for its patterns: one per distinct program; used at start and on reload. */
public final class PatternMonitors {

    private PatternMonitors() {
    }

    /** Why the patterns do not fit the station's position lamps, or null. */
    public static String lampProblem(Map<String, Pattern> patterns, int positionLamps) {
        for (Pattern pattern : patterns.values()) {
            if (pattern.size() > positionLamps) {
                return "pattern " + pattern.id() + " has " + pattern.size() + " positions but the station has "
                        + positionLamps + " position lamps";
            }
        }
        return null;
    }

    /**
     * A monitor for every program of {@code patterns}, all fed by the transducer's one input
     * {@code stage} (zero, filter and fault memory carry on across program switches); a program
     * found in {@code before} (equal content and revision) keeps its monitor.
     */
    static Map<JointProgram, JointMonitor> of(Map<String, Pattern> patterns, Map<JointProgram, JointMonitor> before,
                                              InputStage stage, JointEvents events) {
        Map<JointProgram, JointMonitor> next = new HashMap<>();
        for (Pattern pattern : patterns.values()) {
            for (Pattern.Pass pass : pattern.passes()) {
                JointMonitor kept = before.get(pass.program());
                next.computeIfAbsent(pass.program(),
                        p -> kept != null ? kept : new JointMonitor(p, stage, events));
            }
        }
        return next;
    }

    /** The program of the first pass of the first pattern: the monitor that watches while no part is in work. */
    static JointProgram firstProgram(Map<String, Pattern> patterns) {
        return patterns.values().iterator().next().passes().get(0).program();
    }
}
