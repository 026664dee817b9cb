package hammerstep.sim.demo;

import hammerstep.results.StationId;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
import hammerstep.sim.station.SimulatedStation;
import hammerstep.sim.station.VirtualLamps;
import hammerstep.sim.station.VirtualStation;
import hammerstep.station.LampMode;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;
import hammerstep.station.setup.StationConfig;

import java.io.PrintStream;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Deque;
import java.util.List;
import java.util.Locale;
import java.util.function.LongSupplier;
import java.util.function.Supplier;

/**
 * A terminal view redrawn in place (ANSI), compact enough for 80×24: the pattern's position lamps,
 * the tower lamps, a legend, the blows of the joint under way, the counts and as many of the last
 * results as the terminal has rows for. Every line is cut to the terminal's width, so nothing wraps
 * and the header never scrolls away; a terminal smaller than the view needs is named in the first
 * line. Redraws at most 15 times a second of wall time; the terminal's size is asked every 2 s.
 */
final class LiveView implements DemoView {

    /** The rows the view needs: 8 lines of header and at least 3 results. */
    static final int NEED_ROWS = 11;
    /** The columns the legend and a pattern of up to 8 positions need. */
    static final int NEED_COLUMNS = 72;
    static final String LEGEND = "legend    [#] lamp lit  [ ] dark  * blinking  tower: dim letter = off";

    private static final long FRAME_NS = 66_000_000L;
    private static final long SIZE_EVERY_NS = 2_000_000_000L;
    private static final String RESET = "\u001b[0m";
    private static final String DIM = "\u001b[2m";

    private final PrintStream out;
    private final Supplier<TerminalSize> sizes;
    private final LongSupplier wallNs;
    private final Deque<String> recent = new ArrayDeque<>();
    private TerminalSize size;
    private long sizeAskedNs;
    private String title = "";
    private String status = "";
    private int partsAsked;
    private long lastFrameNs;
    private boolean drawn;

    /**
     * @param sizes  the terminal's size (asked at start and every 2 s)
     * @param wallNs wall time, for pacing the redraws
     */
    LiveView(PrintStream out, Supplier<TerminalSize> sizes, LongSupplier wallNs) {
        this.out = out;
        this.sizes = sizes;
        this.wallNs = wallNs;
    }

    LiveView(PrintStream out) {
        this(out, TerminalSize::detect, System::nanoTime);
    }

    @Override
    public void start(StationId id, StationConfig config, int parts) {
        title = "hammerstep demo  " + id;
        partsAsked = parts;
        size = sizes.get();
        sizeAskedNs = wallNs.getAsLong();
        out.print("\u001b[2J");
        status = "starting";
        drawStatusOnly();
    }

    @Override
    public void status(String text) {
        status = text;
        if (!drawn) {
            drawStatusOnly();
        }
    }

    @Override
    public void line(long nowNs, String text) {
        recent.addLast(String.format(Locale.ROOT, "%7.1f s %s", nowNs * 1e-9, text));
        while (recent.size() > 60) {
            recent.removeFirst();
        }
    }

    @Override
    public void joint(long nowNs, hammerstep.results.JointOutcome joint) {
        line(nowNs, DemoLines.jointShort(joint));
    }

    @Override
    public void frame(SimulatedStation station, DemoTally tally) {
        long now = wallNs.getAsLong();
        if (drawn && now - lastFrameNs < FRAME_NS) {
            return;
        }
        lastFrameNs = now;
        if (now - sizeAskedNs >= SIZE_EVERY_NS) {
            size = sizes.get();
            sizeAskedNs = now;
        }
        draw(render(station, tally, size));
    }

    @Override
    public void end(SimulatedStation station, DemoTally tally) {
        draw(render(station, tally, size));
        out.println();
    }

    private void drawStatusOnly() {
        List<String> lines = new ArrayList<>();
        lines.add(title + "  " + DemoText.count(partsAsked, "part"));
        lines.add(status);
        draw(fit(lines, size));
    }

    private void draw(List<String> lines) {
        StringBuilder b = new StringBuilder(4096).append("\u001b[H");
        for (int i = 0; i < lines.size(); i++) {
            b.append(lines.get(i)).append("\u001b[K");
            if (i < lines.size() - 1) {
                b.append('\n');
            }
        }
        b.append("\u001b[J");
        out.print(b);
        out.flush();
    }

    /** The part named (by the plant's cmd/part or the scanner) that waits for the fixture, if any. */
    static String queued(PartIdentity part) {
        return part == null ? "" : "  next " + part.serial() + " waits for the fixture";
    }

    /**
     * One frame as lines with their colour codes, each at most {@code size.columns()} characters wide
     * on screen, at most {@code size.rows()} of them.
     */
    List<String> render(SimulatedStation station, DemoTally tally, TerminalSize size) {
        drawn = true;
        Sequence seq = station.agent().sequence();
        VirtualStation hardware = station.hardware();
        VirtualLamps lamps = hardware.lamps();
        Pattern pattern = seq.pattern();
        List<String> lines = new ArrayList<>(size.rows());

        lines.add(String.format(Locale.ROOT, "%s  t %.1f s (virtual)", title, station.nowNs() * 1e-9));
        lines.add("part " + (seq.part() == null ? "-" : seq.part().serial() + " (" + seq.part().model() + ")")
                + (pattern == null ? "" : "  pass " + seq.pass().name() + " " + (seq.passIndex() + 1) + "/"
                + pattern.passes().size()) + "  " + seq.phase() + queued(station.agent().queuedPart()));

        StringBuilder p = new StringBuilder("positions ");
        for (int i = 0; i < lamps.positionLamps(); i++) {
            boolean lit = lamps.positionLit(i);
            p.append(lit ? "\u001b[1;34m" : DIM).append('[').append(lit ? '#' : ' ').append(']')
                    .append(label(pattern, i)).append(seq.positionLamp(i) == LampMode.BLINKING ? "*" : " ")
                    .append(RESET).append(' ');
        }
        lines.add(p.toString());

        StringBuilder t = new StringBuilder("tower     ");
        for (TowerLamp lamp : TowerLamp.values()) {
            boolean lit = lamps.towerLit(lamp);
            String colour = switch (lamp) {
                case BLUE -> "\u001b[1;44;97m";
                case GREEN -> "\u001b[1;42;30m";
                case YELLOW -> "\u001b[1;43;30m";
                case RED -> "\u001b[1;41;97m";
                default -> "\u001b[1;47;30m";
            };
            t.append(lit ? colour : DIM).append(' ').append(lamp.name(), 0, 1).append(' ').append(RESET)
                    .append(seq.tower(lamp) == LampMode.BLINKING ? "*" : " ");
        }
        t.append("  ").append(tool(seq, hardware, pattern));
        lines.add(t.toString());
        lines.add(LEGEND);

        StringBuilder blows = new StringBuilder("blows    ");
        int n = Math.min(tally.currentBlows, tally.currentPeaks.length);
        if (n > 0) {
            blows.append(String.format(Locale.ROOT, "%3d:", tally.currentBlows));
            for (int k = Math.max(0, n - 12); k < n; k++) {
                blows.append(String.format(Locale.ROOT, " %3.0f", tally.currentPeaks[k]));
            }
            blows.append(" N·m");
        }
        lines.add(blows.toString());
        lines.add(String.format(Locale.ROOT, "done      %s of %d, %s: %d GO, %d NO_GO, %s",
                DemoText.count(tally.parts, "part"), partsAsked, DemoText.count(tally.joints, "joint"), tally.jointsGo,
                tally.joints - tally.jointsGo, DemoText.count(tally.reworks, "rework")));
        lines.add("-- last results and events (virtual time) --");
        int room = Math.max(0, size.rows() - lines.size());
        int skip = Math.max(0, recent.size() - room);
        int k = 0;
        for (String r : recent) {
            if (k++ >= skip) {
                lines.add(r);
            }
        }
        return fit(lines, size);
    }

    /** The lines cut to the terminal; a first line says so when it is smaller than the view needs. */
    static List<String> fit(List<String> lines, TerminalSize size) {
        List<String> fitted = new ArrayList<>(size.rows());
        if (size.columns() < NEED_COLUMNS || size.rows() < NEED_ROWS) {
            fitted.add(String.format(Locale.ROOT, "terminal %dx%d is smaller than the %dx%d this view needs: lines"
                    + " cut (--plain prints one line per result)", size.columns(), size.rows(), NEED_COLUMNS, NEED_ROWS));
        }
        for (String l : lines) {
            fitted.add(l);
        }
        List<String> cut = new ArrayList<>(size.rows());
        for (int i = 0; i < fitted.size() && i < size.rows(); i++) {
            cut.add(cutVisible(fitted.get(i), size.columns()));
        }
        return cut;
    }

    /** What the tool may do now, as the operator guide says it: enabled, waiting for the socket, or disabled. */
    private static String tool(Sequence seq, VirtualStation hardware, Pattern pattern) {
        if (hardware.relayOn()) {
            return "tool enabled";
        }
        int prompted = seq.prompted();
        if (seq.phase() == Phase.PROMPT && prompted >= 0 && hardware.hasConfirmSensors()
                && hardware.confirmedPosition() != prompted) {
            return "tool enabled once the socket is on " + label(pattern, prompted);
        }
        return "tool disabled";
    }

    private static String label(Pattern pattern, int i) {
        return pattern != null && i < pattern.size() ? pattern.positions().get(i) : Integer.toString(i + 1);
    }

    /** The line cut to {@code width} characters on screen; colour codes take no room and are closed. */
    static String cutVisible(String line, int width) {
        StringBuilder b = new StringBuilder(line.length());
        int visible = 0;
        boolean styled = false;
        for (int i = 0; i < line.length(); i++) {
            char c = line.charAt(i);
            if (c == '\u001b') {
                int end = i + 1;
                while (end < line.length() && !Character.isLetter(line.charAt(end))) {
                    end++;
                }
                String code = line.substring(i, Math.min(end + 1, line.length()));
                b.append(code);
                styled = !code.equals(RESET);
                i = end;
                continue;
            }
            if (visible == width) {
                break;
            }
            b.append(c);
            visible++;
        }
        if (styled) {
            b.append(RESET);
        }
        return b.toString();
    }

    /** The text as it shows on screen: colour and cursor codes removed. */
    static String visible(String text) {
        return text.replaceAll("\u001b\\[[0-9;?]*[A-Za-z]", "");
    }
}
