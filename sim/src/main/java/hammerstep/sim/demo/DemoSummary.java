package hammerstep.sim.demo;

import hammerstep.sim.station.RigToolModel;
import hammerstep.sim.station.ScriptedOperator;
import hammerstep.sim.station.SimulatedStation;

import java.io.PrintStream;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;

/** The figures a demo run ends with. */
final class DemoSummary {

    private final DemoTally tally;
    private final SimulatedStation station;
    private final RigToolModel tool;
    private final int partsAsked;
    private final long wallNs;
    private final boolean finished;

    DemoSummary(DemoTally tally, SimulatedStation station, RigToolModel tool, int partsAsked, long wallNs,
                boolean finished) {
        this.tally = tally;
        this.station = station;
        this.tool = tool;
        this.partsAsked = partsAsked;
        this.wallNs = wallNs;
        this.finished = finished;
    }

    void print(PrintStream out) {
        out.println();
        out.println("summary");
        int scripted = tally.parts - tally.partsOther;
        out.println(String.format(Locale.ROOT, "  parts            %d of %d%s%s", scripted, partsAsked,
                finished ? "" : " (not finished)", tally.partsOther == 0 ? ""
                        : ", and " + tally.partsOther + " more not in the run's list (a plant's cmd/part, or a part"
                        + " interrupted before)"));
        for (Map.Entry<String, Integer> e : tally.partsBy.entrySet()) {
            out.println(String.format(Locale.ROOT, "    %-22s %d", e.getKey(), e.getValue()));
        }
        out.println(String.format(Locale.ROOT, "  joints           %d (%d GO, %d NO_GO), %d reworked",
                tally.joints, tally.jointsGo, tally.joints - tally.jointsGo, tally.reworks));
        if (!tally.reasons.isEmpty()) {
            out.println("  NO_GO reasons    " + counts(tally.reasons)
                    + (tally.reasons.values().stream().mapToInt(Integer::intValue).sum() > tally.joints - tally.jointsGo
                    ? " (a joint may have several)" : ""));
        }
        if (!tally.events.isEmpty()) {
            out.println("  events           " + counts(tally.events));
        }
        int mistakes = station.operator().mistakes();
        Map<String, Integer> byKind = new LinkedHashMap<>();
        for (Map.Entry<ScriptedOperator.Mistake, Integer> e : station.operator().mistakesByKind().entrySet()) {
            byKind.put(e.getKey().key(), e.getValue());
        }
        out.println("  operator         " + DemoText.count(mistakes, "mistake") + (mistakes == 0 ? "" : ": " + counts(byKind)));
        out.println(String.format(Locale.ROOT, "  blows after shut-off  %d measured, %d in the model",
                tally.blowsAfterShutoff, tool.blowsAfterRelayOff()));
        long latency = station.agent().maxShutoffToRelayNs();
        out.println(String.format(Locale.ROOT, "  shut-off to relay     %s (virtual time, within one block)",
                latency < 0 ? "-" : String.format(Locale.ROOT, "%.2f ms at most", latency * 1e-6)));
        out.println(String.format(Locale.ROOT, "  fastest blow rate     %.0f per minute", tally.maxBlowRatePerMin));
        out.println(String.format(Locale.ROOT, "  time             %.1f s simulated in %.1f s", station.nowNs() * 1e-9,
                wallNs * 1e-9));
    }

    /** "TORQUE_LOW 1, BLOWS_FEW 2". */
    static String counts(Map<?, Integer> counts) {
        StringBuilder b = new StringBuilder();
        for (Map.Entry<?, Integer> e : counts.entrySet()) {
            b.append(b.length() == 0 ? "" : ", ").append(e.getKey()).append(' ').append(e.getValue());
        }
        return b.toString();
    }
}
