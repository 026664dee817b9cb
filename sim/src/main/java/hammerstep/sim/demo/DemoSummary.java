package hammerstep.sim.demo;

import hammerstep.sim.station.RigToolModel;
import hammerstep.sim.station.SimulatedStation;

import java.io.PrintStream;
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
        out.println(String.format(Locale.ROOT, "  parts            %d of %d%s", tally.parts, partsAsked,
                finished ? "" : " (not finished)"));
        for (Map.Entry<String, Integer> e : tally.partsBy.entrySet()) {
            out.println(String.format(Locale.ROOT, "    %-22s %d", e.getKey(), e.getValue()));
        }
        out.println(String.format(Locale.ROOT, "  joints           %d (%d GO, %d NO-GO), %d reworked",
                tally.joints, tally.jointsGo, tally.joints - tally.jointsGo, tally.reworks));
        if (!tally.reasons.isEmpty()) {
            out.println("  NO-GO reasons    " + tally.reasons);
        }
        if (!tally.events.isEmpty()) {
            out.println("  events           " + tally.events);
        }
        out.println(String.format(Locale.ROOT, "  operator         %d mistakes", station.operator().mistakes()));
        out.println(String.format(Locale.ROOT, "  blows after shut-off  %d measured, %d in the model",
                tally.blowsAfterShutoff, tool.blowsAfterRelayOff()));
        long latency = station.agent().maxShutoffToRelayNs();
        out.println(String.format(Locale.ROOT, "  shut-off to relay     %s (virtual time, within one block)",
                latency < 0 ? "-" : String.format(Locale.ROOT, "%.2f ms at most", latency * 1e-6)));
        out.println(String.format(Locale.ROOT, "  fastest blow rate     %.0f per minute", tally.maxBlowRatePerMin));
        out.println(String.format(Locale.ROOT, "  time             %.1f s simulated in %.1f s", station.nowNs() * 1e-9,
                wallNs * 1e-9));
    }
}
