package hammerstep.sim.demo;

import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The demo with a battery running down: the station's tool health notices and warns. */
class SupplyDropDemoTest {

    private static final Path STATION = Path.of("../config/demo/station.yaml");

    @Test
    void aFallingSupplyRaisesToolWeak() throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        int exit = new DemoRunner(new DemoOptions(STATION, 6, 1, true, true, 30, null),
                new PrintStream(bytes, true, StandardCharsets.UTF_8)).run();
        String out = bytes.toString(StandardCharsets.UTF_8);

        assertThat(exit).as(out).isZero();
        assertThat(out).contains("supply: battery voltage now 12.60 V (30 % below nominal)");
        assertThat(out).containsPattern("event WARNING TOOL_WEAK +tool CW-3D-17 on program flange-final");
        // the warning comes only after the supply has fallen, never while it is at nominal
        assertThat(out.indexOf("TOOL_WEAK")).isGreaterThan(out.indexOf("(15 % below nominal)"));
        // one state: the rate falls first; at 30 % below nominal the weak hammer strikes each jaw twice, the
        // counted rate jumps above its baseline while peak and impulse fall: named as well, never "back"
        List<String> health = out.lines().filter(l -> l.contains("event ") && l.contains(" TOOL_"))
                .map(l -> l.replaceAll("^.*event \\w+ +(TOOL_\\w+) +tool CW-3D-17 on program flange-final: (blow \\w+) .*$",
                        "$1 $2")).toList();
        assertThat(health).containsExactly("TOOL_WEAK blow rate", "TOOL_WEAK blow impulse", "TOOL_WEAK blow peak");
        assertThat(out).contains("blow rate fell 17 % below its baseline (2528 → 2093 /min)")
                .contains("blow peak fell 28 % below its baseline (278.6 → 199.8 N·m) as well").doesNotContain("TOOL_OK");
    }

    @Test
    void keepsEveryJointsTraceWhenAsked(@org.junit.jupiter.api.io.TempDir Path dir) throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        int exit = new DemoRunner(new DemoOptions(STATION, 1, 1, true, true, 0, dir),
                new PrintStream(bytes, true, StandardCharsets.UTF_8)).run();

        assertThat(exit).isZero();
        long joints = bytes.toString(StandardCharsets.UTF_8).lines().filter(l -> l.contains(" joint ")).count();
        try (java.util.stream.Stream<Path> files = java.nio.file.Files.list(dir)) {
            assertThat(files.filter(f -> f.toString().endsWith(".hst")).count()).isEqualTo(joints).isPositive();
        }
    }

    @Test
    void aSteadySupplyRaisesNothing() throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        new DemoRunner(new DemoOptions(STATION, 3, 1, true, true), new PrintStream(bytes, true, StandardCharsets.UTF_8)).run();

        assertThat(bytes.toString(StandardCharsets.UTF_8)).doesNotContain("TOOL_WEAK").doesNotContain("supply:");
    }
}
