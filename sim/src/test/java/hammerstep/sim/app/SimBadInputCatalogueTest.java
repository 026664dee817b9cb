package hammerstep.sim.app;

import hammerstep.testing.StandardStreams;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The simulator's part of the catalogue of bad inputs (the controller's is {@code BadInputCatalogueTest}):
 * {@code simulate} arguments and preset files, presets outside their folders, FIFOs and oversized
 * files, and the demo station file's {@code simulation} section, which {@code hammerstep-sim check}
 * must refuse exactly as the demo does. Each is refused with exit 2 and its expected line, no line
 * longer than 300 characters and no stack trace.
 */
class SimBadInputCatalogueTest {

    record Bad(String name, List<String> args, String expect) {
        @Override
        public String toString() {
            return name;
        }
    }

    private static Path dir;
    private static boolean fifos = true;

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    @BeforeAll
    static void writeTheCatalogue() throws Exception {
        dir = Files.createTempDirectory("sim-bad-inputs");
        Path demo = Path.of("../config/demo");
        try (Stream<Path> s = Files.walk(demo)) {
            for (Path p : s.toList()) {
                Path to = dir.resolve(demo.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(to);
                } else {
                    Files.copy(p, to, StandardCopyOption.REPLACE_EXISTING);
                }
            }
        }
        String station = Files.readString(demo.resolve("station.yaml"));
        station("misspelt-tool", station.replace("tool: cordless-three-dog", "tool: cordless-3dog"));
        station("batery-v", station.replace("battery_v: 18.0", "batery_v: 18.0"));
        station("rate-too-low", station.replaceFirst("(?m)^  rate_hz: [0-9]+", "  rate_hz: 10"));
        station("block-huge", station.replace("block_samples: 16 ", "block_samples: 1e9"));
        station("no-positions", station.replace("positions: 8,", "positions: 0,"));
        station("skip-certain", station.replace("skip: 0.04", "skip: 2"));
        station("no-parts", station.replace("  parts:\n    - { model: PS-40D, serial_prefix: \"PS40D-2611-\", first: 301 }\n"
                + "    - { model: PS-40S, serial_prefix: \"PS40S-2611-\", first: 88 }\n", "  parts: []\n"));
        station("bad-date", station.replace("calibration_due: 2026-09-30", "calibration_due: tomorrow"));
        station("unknown-joint", station.replace("joint: flange-m16", "joint: flange-m61"));
        station("missing-transducer", station.replace("transducer: inline-1000", "transducer: ./no-such-transducer.yaml"));
        station("operator-key", station.replace("reaction_ms: 450", "reaction_time: 450"));
        station("long-serial", station.replace("transducer_serial: HB-TQ-0417", "transducer_serial: " + "T".repeat(5000)));
        Files.createDirectories(dir.resolve("elsewhere"));
        Files.writeString(dir.resolve("elsewhere/joint.yaml"), Files.readString(Path.of("../config/sim/joints/iso-hard.yaml"))
                .replace("full_torque_nm: 200", "full_torque_nm: 200\nstifness: 3"));
        Files.writeString(dir.resolve("elsewhere/tool.yaml"), Files.readString(Path.of("../config/sim/tools/oil-pulse.yaml"))
                .replace("type: air", "type: steam"));
        Files.writeString(dir.resolve("elsewhere/transducer.yaml"), Files.readString(Path.of("../config/sim/transducers/inline-300.yaml"))
                .replace("rated_torque_nm: 300", "rated_torque_nm: -300"));
        Files.writeString(dir.resolve("elsewhere/good-joint.yaml"), Files.readString(Path.of("../config/sim/joints/iso-hard.yaml")));
        Files.writeString(dir.resolve("huge-joint.yaml"), "name: huge\n# " + "x".repeat(2 << 20) + "\n");
        Files.createDirectories(dir.resolve("tools"));
        for (String f : List.of("fifo-station.yaml", "tools/fifo.yaml", "fifo-joint.yaml")) {
            Process p = new ProcessBuilder("mkfifo", dir.resolve(f).toString()).start();
            fifos &= p.waitFor(10, TimeUnit.SECONDS) && p.exitValue() == 0;
        }
    }

    private static void station(String name, String text) throws IOException {
        Files.writeString(dir.resolve(name + ".yaml"), text);
    }

    @AfterAll
    static void removeTheCatalogue() throws IOException {
        try (Stream<Path> s = Files.walk(dir)) {
            s.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }

    private static Bad bad(String name, String expect, String... args) {
        return new Bad(name, List.of(args), expect);
    }

    static List<Bad> catalogue() {
        String d = "{d}/";
        List<Bad> c = new ArrayList<>();
        // the demo's simulation section, through check and through the demo itself
        for (String cmd : List.of("check", "demo")) {
            List<String> pre = cmd.equals("check") ? List.of("check") : List.of("demo", "--plain", "--fast", "--parts", "1", "--config");
            c.add(bad(cmd + ": simulation.tool misspelt", d + "misspelt-tool.yaml:24:9: 'simulation.tool': no tool preset of that name",
                    args(pre, d + "misspelt-tool.yaml")));
            c.add(bad(cmd + ": simulation.batery_v", d + "batery-v.yaml:25:3: unknown key 'simulation.batery_v'", args(pre, d + "batery-v.yaml")));
            c.add(bad(cmd + ": a FIFO as station file", d + "fifo-station.yaml:0:0: is not a regular file", args(pre, d + "fifo-station.yaml")));
        }
        c.add(bad("check: simulation.rate_hz 10", d + "rate-too-low.yaml:21:12: 'simulation.rate_hz'", "check", d + "rate-too-low.yaml"));
        c.add(bad("check: simulation.block_samples 1e9", d + "block-huge.yaml:22:18: 'simulation.block_samples'", "check", d + "block-huge.yaml"));
        c.add(bad("check: simulation.fixture.positions 0", d + "no-positions.yaml:30:25: 'simulation.fixture.positions'", "check", d + "no-positions.yaml"));
        c.add(bad("check: simulation.operator.mistakes.skip 2", d + "skip-certain.yaml:41:23: 'simulation.operator.mistakes.skip'", "check", d + "skip-certain.yaml"));
        c.add(bad("check: simulation.parts empty", d + "no-parts.yaml:31:10: 'simulation.parts' is empty", "check", d + "no-parts.yaml"));
        c.add(bad("check: simulation.calibration_due not a date", d + "bad-date.yaml:29:20: 'simulation.calibration_due' is \"tomorrow\": expected a date", "check", d + "bad-date.yaml"));
        c.add(bad("check: simulation.joint unknown", d + "unknown-joint.yaml:26:10: 'simulation.joint': no joint preset of that name", "check", d + "unknown-joint.yaml"));
        c.add(bad("check: simulation.transducer file missing", d + "missing-transducer.yaml:27:15: 'simulation.transducer': no such file", "check", d + "missing-transducer.yaml"));
        c.add(bad("check: simulation.operator unknown key", d + "operator-key.yaml:35:5: unknown key 'simulation.operator.reaction_time'", "check", d + "operator-key.yaml"));
        c.add(bad("check: simulation.transducer_serial of 5000 characters", d + "long-serial.yaml:28:22: a value of 5000 characters at 'simulation.transducer_serial'", "check", d + "long-serial.yaml"));
        // presets outside their folders, told by their keys
        c.add(bad("check: a joint preset outside joints/", d + "elsewhere/joint.yaml:8:1: unknown key 'stifness'", "check", d + "elsewhere/joint.yaml"));
        c.add(bad("check: a tool preset outside tools/", d + "elsewhere/tool.yaml:8:9: 'drive.type' is \"steam\"", "check", d + "elsewhere/tool.yaml"));
        c.add(bad("check: a transducer preset outside transducers/", d + "elsewhere/transducer.yaml:4:18: 'rated_torque_nm'", "check", d + "elsewhere/transducer.yaml"));
        c.add(bad("check: a FIFO in tools/", d + "tools/fifo.yaml:0:0: is not a regular file", "check", d + "tools/fifo.yaml"));
        // simulate
        c.add(bad("simulate: --tool misspelt", "cordless-3dog:0:0: no tool preset of that name", "simulate", "--tool", "cordless-3dog", "--joint", "iso-hard", "--out", d + "t.csv", "--truth", d + "t.json"));
        c.add(bad("simulate: --joint a FIFO", d + "fifo-joint.yaml:0:0: is not a regular file", "simulate", "--tool", "oil-pulse", "--joint", d + "fifo-joint.yaml", "--out", d + "t.csv", "--truth", d + "t.json"));
        c.add(bad("simulate: --joint of 2 MB", d + "huge-joint.yaml:0:0: is 2.0 MB, more than the 1.0 MB", "simulate", "--tool", "oil-pulse", "--joint", d + "huge-joint.yaml", "--out", d + "t.csv", "--truth", d + "t.json"));
        c.add(bad("simulate: --rundowns 0", "--rundowns 0: expected 1 to 10000", "simulate", "--tool", "oil-pulse", "--joint", "iso-hard", "--rundowns", "0", "--out", d + "t.csv", "--truth", d + "t.json"));
        c.add(bad("simulate: --rate -5", "--rate -5.0: expected 1000 to 1000000 Hz", "simulate", "--tool", "oil-pulse", "--joint", "iso-hard", "--rate", "-5", "--out", d + "t.csv", "--truth", d + "t.json"));
        c.add(bad("simulate: a joint preset with a bad key", d + "elsewhere/joint.yaml:8:1: unknown key 'stifness'", "simulate", "--tool", "oil-pulse", "--joint", d + "elsewhere/joint.yaml", "--out", d + "t.csv", "--truth", d + "t.json"));
        return c;
    }

    private static String[] args(List<String> pre, String file) {
        List<String> a = new ArrayList<>(pre);
        a.add(file);
        return a.toArray(String[]::new);
    }

    @Test
    void theSimulatorsPartHoldsAtLeastTwentyBadInputs() {
        assertThat(catalogue()).hasSizeGreaterThanOrEqualTo(20);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("catalogue")
    void isRefusedWithItsLineAndExitTwo(Bad bad) {
        assertThat(fifos).as("mkfifo made the FIFOs").isTrue();
        String d = dir.toString();
        String[] args = bad.args().stream().map(a -> a.replace("{d}", d)).toArray(String[]::new);
        String expect = bad.expect().replace("{d}", d);

        int exit = SimMain.run(args);

        String err = streams.err();
        assertThat(exit).as(err).isEqualTo(2);
        assertThat(err.lines()).as(err).anySatisfy(l -> assertThat(l).contains(expect));
        assertThat(err.lines()).allSatisfy(l -> assertThat(l.length()).isLessThanOrEqualTo(300));
        assertThat(err).doesNotContain("Exception").doesNotContain("\tat ");
    }

    @Test
    void aPresetOutsideItsFolderIsValidatedAsOne() {
        assertThat(SimMain.run("check", dir.resolve("elsewhere/good-joint.yaml").toString())).isZero();
        assertThat(streams.err()).isEmpty();
        assertThat(streams.out()).contains("1 file valid");
    }

    @Test
    void theDemoStationFileIsValidWithItsSimulationSection() {
        assertThat(SimMain.run("check", dir.resolve("station.yaml").toString())).isZero();
        assertThat(streams.err()).isEmpty();
    }
}
