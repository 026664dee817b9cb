package hammerstep.sim.demo;

import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;

import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;

/** What happened in a demo run, counted as results came back from the store; feeds the view and the summary. */
final class DemoTally {

    /** Every part message, the scripted parts' and any other's. */
    int parts;
    /** Part messages of parts that were not in the run's list (a plant's {@code cmd/part}, a part interrupted before). */
    int partsOther;
    final Map<String, Integer> partsBy = new LinkedHashMap<>();
    int joints;
    int jointsGo;
    int reworks;
    int blowsAfterShutoff;
    double maxBlowRatePerMin;
    final Map<Reason, Integer> reasons = new EnumMap<>(Reason.class);
    final Map<String, Integer> events = new TreeMap<>();
    private final Set<String> scripted;
    final double[] currentPeaks = new double[64];
    int currentBlows;

    /** @param scripted the serials of the parts the scripted operator was given */
    DemoTally(Set<String> scripted) {
        this.scripted = Set.copyOf(scripted);
    }

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
    }

    void part(PartOutcome p) {
        parts++;
        if (!scripted.contains(p.partSerial())) {
            partsOther++;
        }
        partsBy.merge(p.verdict() + " " + p.ended(), 1, Integer::sum);
    }

    void event(StationEvent e) {
        events.merge(e.code(), 1, Integer::sum);
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
}
