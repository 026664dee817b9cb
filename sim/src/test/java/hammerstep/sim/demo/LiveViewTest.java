package hammerstep.sim.demo;

import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The live view drawn into a string as a terminal of a given size would show it. */
class LiveViewTest {

    private static final Path STATION = Path.of("../config/demo/station.yaml");

    /** Runs {@code parts} parts with a live view of this size; returns each frame's lines as the screen shows them. */
    private static List<List<String>> frames(int columns, int rows, int parts) throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        PrintStream out = new PrintStream(bytes, true, StandardCharsets.UTF_8);
        long[] wall = {0};
        // every call of the wall clock is 5 ms later: a frame every 14 station cycles or so
        LiveView view = new LiveView(out, () -> new TerminalSize(columns, rows), () -> wall[0] += 5_000_000L);
        int exit = new DemoRunner(new DemoOptions(STATION, parts, 3, true, false), out, view).run();
        String text = bytes.toString(StandardCharsets.UTF_8);
        assertThat(exit).as(text).isZero();
        String screen = text.substring(0, text.indexOf("\nsummary"));
        List<List<String>> frames = new ArrayList<>();
        for (String frame : screen.split("\u001b\\[H")) {
            if (frame.startsWith("\u001b[2J") || frame.isEmpty()) {
                continue;
            }
            String shown = LiveView.visible(frame.replace("\u001b[J", ""));
            frames.add(List.of(shown.replaceAll("\n+$", "").split("\n", -1)));
        }
        return frames;
    }

    @Test
    void everyFrameFitsAnEightyByTwentyFourTerminal() throws Exception {
        List<List<String>> frames = frames(80, 24, 1);

        assertThat(frames).hasSizeGreaterThan(50);
        for (List<String> f : frames) {
            assertThat(f).as(String.join("\n", f)).hasSizeLessThanOrEqualTo(24);
            assertThat(f).as(String.join("\n", f)).allSatisfy(l -> assertThat(l.length()).isLessThanOrEqualTo(80));
        }
        List<String> last = frames.get(frames.size() - 1);
        assertThat(last).hasSize(24);
        assertThat(last.get(0)).startsWith("hammerstep demo  harrow-bend/skid-1/flange-2");
        assertThat(last).contains(LiveView.LEGEND);
        assertThat(last).anySatisfy(l -> assertThat(l).startsWith("positions [ ]1  [ ]2"));
        assertThat(last).anySatisfy(l -> assertThat(l).isEqualTo("done      1 part of 1, 17 joints: 16 GO, 1 NO_GO, 1 rework"));
        assertThat(frames).anySatisfy(f -> assertThat(f).anySatisfy(
                l -> assertThat(l).contains("tool enabled once the socket is on D")));
        assertThat(frames).anySatisfy(f -> assertThat(f).anySatisfy(
                l -> assertThat(l).startsWith("positions [#]D1* [ ]D2 ").endsWith("[ ]D8  ")));
        assertThat(frames.get(0)).containsExactly("hammerstep demo  harrow-bend/skid-1/flange-2  1 part", "starting");
    }

    @Test
    void aSmallerTerminalIsToldAndNothingWraps() throws Exception {
        List<List<String>> frames = frames(60, 10, 1);

        for (List<String> f : frames) {
            assertThat(f).hasSizeLessThanOrEqualTo(10).allSatisfy(l -> assertThat(l.length()).isLessThanOrEqualTo(60));
            assertThat(f.get(0)).startsWith("terminal 60x10 is smaller than the 72x11 this view needs");
        }
    }

    @Test
    void aPartWaitingForTheFixtureIsShownBesideThePartInWork() {
        assertThat(LiveView.queued(new hammerstep.station.PartIdentity("PS40D-2611-0302", "PS-40D")))
                .isEqualTo("  next PS40D-2611-0302 waits for the fixture");
        assertThat(LiveView.queued(null)).isEmpty();
    }

    @Test
    void cutsALineByWhatShowsAndClosesItsColour() {
        String line = "ab\u001b[1;34mcdef\u001b[0mgh";

        assertThat(LiveView.cutVisible(line, 4)).isEqualTo("ab\u001b[1;34mcd\u001b[0m");
        assertThat(LiveView.visible(LiveView.cutVisible(line, 100))).isEqualTo("abcdefgh");
    }
}
