package hammerstep.sim.demo;

import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;

import java.util.ArrayDeque;
import java.util.Deque;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.TreeMap;

/** What happened in a demo run, counted as results came back from the store; feeds the view and the summary. */
final class DemoTally {

    int parts;
    final Map<String, Integer> partsBy = new LinkedHashMap<>();
    int joints;
    int jointsGo;
    int reworks;
    int blowsAfterShutoff;
    double maxBlowRatePerMin;
    final Map<Reason, Integer> reasons = new EnumMap<>(Reason.class);
    final Map<String, Integer> events = new TreeMap<>();
    final Deque<String> recent = new ArrayDeque<>();
    final double[] currentPeaks = new double[64];
    int currentBlows;

    void joint(JointOutcome j) {
        JointResult r = j.result();
        joints++;
        if (r.verdict() == Verdict.GO) {
            jointsGo++;
        }
        if (j.attempt() > 1) {
            reworks++;
        }
        for (Reason reason : r.reasons()) {
            reasons.merge(reason, 1, Integer::sum);
        }
        blowsAfterShutoff += r.blowsAfterShutoff();
        maxBlowRatePerMin = Math.max(maxBlowRatePerMin, r.blowRatePerMin());
        remember(DemoLines.joint(j));
    }

    void part(PartOutcome p) {
        parts++;
        partsBy.merge(p.verdict() + " " + p.ended(), 1, Integer::sum);
        remember(DemoLines.part(p));
    }

    void event(StationEvent e) {
        events.merge(e.code(), 1, Integer::sum);
        remember(DemoLines.event(e));
    }

    void blow(int index, double peakNm) {
        if (index == 0) {
            currentBlows = 0;
        }
        if (currentBlows < currentPeaks.length) {
            currentPeaks[currentBlows] = peakNm;
        }
        currentBlows++;
    }

    private void remember(String line) {
        recent.addLast(line);
        while (recent.size() > 8) {
            recent.removeFirst();
        }
    }
}
