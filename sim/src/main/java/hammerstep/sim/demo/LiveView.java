package hammerstep.sim.demo;

import hammerstep.results.StationId;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.sim.station.SimulatedStation;
import hammerstep.sim.station.VirtualLamps;
import hammerstep.station.LampMode;
import hammerstep.station.TowerLamp;
import hammerstep.station.setup.StationConfig;

import java.io.PrintStream;
import java.util.Locale;

/**
 * A terminal view redrawn in place (ANSI): the pattern's position lamps, the tower lamps, the blows
 * of the joint under way and the last results. Redraws at most 15 times a second of wall time.
 */
final class LiveView implements DemoView {

    private static final long FRAME_NS = 66_000_000L;
    private static final String RESET = "\u001b[0m";

    private final PrintStream out;
    private String title = "";
    private long lastFrameWallNs;

    LiveView(PrintStream out) {
        this.out = out;
    }

    @Override
    public void start(StationId id, StationConfig config, int parts) {
        title = "hammerstep demo  " + id + "  " + parts + (parts == 1 ? " part" : " parts");
        out.print("\u001b[2J");
    }

    @Override
    public void line(long nowNs, String text) {
    }

    @Override
    public void frame(SimulatedStation station, DemoTally tally) {
        long now = System.nanoTime();
        if (now - lastFrameWallNs < FRAME_NS) {
            return;
        }
        lastFrameWallNs = now;
        draw(station, tally);
    }

    @Override
    public void end(SimulatedStation station, DemoTally tally) {
        draw(station, tally);
        out.println();
    }

    private void draw(SimulatedStation station, DemoTally tally) {
        Sequence seq = station.agent().sequence();
        VirtualLamps lamps = station.hardware().lamps();
        StringBuilder b = new StringBuilder(2048);
        b.append("\u001b[H").append(title).append(String.format(Locale.ROOT, "   t = %.1f s", station.nowNs() * 1e-9))
                .append("\u001b[K\n\n");
        Pattern pattern = seq.pattern();
        b.append(String.format(Locale.ROOT, "part  %-16s", seq.part() == null ? "-" : seq.part().serial()));
        b.append(pattern == null ? "" : "pattern " + pattern.id() + ", pass " + seq.pass().name()
                + " (" + (seq.passIndex() + 1) + "/" + pattern.passes().size() + ")");
        b.append("   ").append(seq.phase()).append("\u001b[K\n\n");
        b.append("positions ");
        for (int i = 0; i < lamps.positionLamps(); i++) {
            LampMode mode = seq.positionLamp(i);
            boolean lit = lamps.positionLit(i);
            String label = pattern != null && i < pattern.size() ? pattern.positions().get(i) : Integer.toString(i + 1);
            b.append(lit ? "\u001b[1;34m" : "\u001b[2m").append('[').append(lit ? '#' : ' ').append(']')
                    .append(label).append(mode == LampMode.BLINKING ? "*" : " ").append(RESET).append(' ');
        }
        b.append("\u001b[K\n");
        b.append("tower     ");
        for (TowerLamp t : TowerLamp.values()) {
            boolean lit = lamps.towerLit(t);
            String colour = switch (t) {
                case BLUE -> "\u001b[1;44;97m";
                case GREEN -> "\u001b[1;42;30m";
                case YELLOW -> "\u001b[1;43;30m";
                case RED -> "\u001b[1;41;97m";
                default -> "\u001b[1;47;30m";
            };
            b.append(lit ? colour : "\u001b[2m").append(' ').append(t.name(), 0, 1).append(' ').append(RESET)
                    .append(seq.tower(t) == LampMode.BLINKING ? "*" : " ").append(' ');
        }
        b.append("  tool ").append(station.hardware().relayOn() ? "ENABLED " : "disabled").append("\u001b[K\n\n");
        b.append("blows  ");
        int n = Math.min(tally.currentBlows, tally.currentPeaks.length);
        for (int k = Math.max(0, n - 14); k < n; k++) {
            b.append(String.format(Locale.ROOT, "%4.0f ", tally.currentPeaks[k]));
        }
        b.append(n > 0 ? " N·m (" + tally.currentBlows + ")" : "").append("\u001b[K\n\n");
        b.append(String.format(Locale.ROOT, "parts %d   joints %d (%d GO)   reworks %d", tally.parts, tally.joints,
                tally.jointsGo, tally.reworks)).append("\u001b[K\n");
        for (String line : tally.recent) {
            b.append(line).append("\u001b[K\n");
        }
        b.append("\u001b[J");
        out.print(b);
        out.flush();
    }
}
