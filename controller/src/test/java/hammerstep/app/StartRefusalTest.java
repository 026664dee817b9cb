package hammerstep.app;

import hammerstep.testing.StandardStreams;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code check} refuses every station file that {@code run} refuses at start, and {@code run} refuses it
 * the same way: exit 2, one {@code file:line:column: message} naming the line at fault, before anything
 * opens. Each fault is one change to the example station (moved into a temporary folder, its journal
 * there), so the unchanged file passes.
 */
class StartRefusalTest {

    private static final Path TLS = Path.of("src/test/resources/tls");

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    @TempDir
    Path dir;

    /**
     * One fault: {@code from} in the example station is replaced by {@code to} (or {@code to} is appended
     * when {@code from} is empty); the problem is reported on the last line holding {@code lineWith}.
     */
    record Fault(String name, String from, String to, String lineWith, String message) {
        @Override
        public String toString() {
            return name;
        }
    }

    private static final String SSL = "broker:\n  url: ssl://mqtt.plant.example:8883\n";

    static Stream<Fault> faults() {
        return Stream.of(
                new Fault("storage folder under /proc", "dir: outbox", "dir: /proc/hammerstep/outbox",
                        "dir: /proc", "cannot hold the result journal: /proc/hammerstep/outbox is on the proc file system"),
                new Fault("storage folder in a file", "dir: outbox", "dir: notes.txt/outbox", "dir: notes.txt",
                        "notes.txt is a file: no folder can be made in it"),
                new Fault("storage folder is a file", "dir: outbox", "dir: notes.txt", "dir: notes.txt",
                        "notes.txt is a file, not a folder"),
                new Fault("traces folder under /proc", "", "traces: { dir: /proc/self/traces }", "traces:",
                        "cannot hold the stored traces"),
                new Fault("broker port 99999", "", "broker:\n  url: tcp://mqtt.plant.example:99999\n", "url:",
                        "port 99999 is outside 1 to 65535"),
                new Fault("broker url empty", "", "broker:\n  url: \"\"\n", "url:", "'broker.url' is empty"),
                new Fault("broker url without port", "", "broker:\n  url: tcp://mqtt.plant.example\n", "url:",
                        "no port"),
                new Fault("broker url not parseable", "", "broker:\n  url: \"tcp://[mqtt:1883\"\n", "url:",
                        "expected tcp://HOST:PORT or ssl://HOST:PORT"),
                new Fault("CA file that is not a certificate", "", SSL + "  ca_file: notes.txt\n", "ca_file:",
                        "holds no readable PEM certificate"),
                new Fault("client certificate that is not a certificate", "",
                        SSL + "  cert_file: notes.txt\n  key_file: station.key\n", "cert_file:",
                        "holds no readable PEM certificate"),
                new Fault("key of another certificate", "",
                        SSL + "  ca_file: ca.pem\n  cert_file: station.pem\n  key_file: other.key\n", "key_file:",
                        "is not the key of the certificate"),
                new Fault("key that is no PKCS#8 key", "", SSL + "  cert_file: station.pem\n  key_file: private.txt\n",
                        "key_file:", "expected an unencrypted PKCS#8 key"),
                new Fault("fewer position lamps than the pattern's positions", "positions: [21, 23, 24, 25, 26]",
                        "positions: [21, 23, 24]", "positions: [21, 23, 24]",
                        "pattern hub-5 has 5 positions but the station has 3 position lamps"),
                new Fault("two outputs on one pin", "white: 12", "white: 21", "positions: [21",
                        "already used by 'hardware.outputs.tower.white'"),
                new Fault("transducer beyond the ADC's range",
                        "rated_output_mv_per_v: 2.0\n  full_scale_nm: 500\n  excitation_v: 5.0",
                        "rated_output_mv_per_v: 10.0\n  full_scale_nm: 500\n  excitation_v: 12.0", "output: bridge",
                        "beyond its input range"),
                new Fault("hardware without transducer", "\ntransducer:", "\nold_transducer:",
                        "old_transducer:", "unknown key 'old_transducer'"));
    }

    private Path station(Fault f) throws IOException {
        Path file = RunDeliveryTest.station(dir, "");
        Files.writeString(dir.resolve("notes.txt"), "not a certificate, not a folder\n");
        Path priv = dir.resolve("private.txt");
        Files.writeString(priv, "not a key\n");
        Files.setPosixFilePermissions(priv, PosixFilePermissions.fromString("rw-------"));
        for (String name : List.of("ca.pem", "station.pem", "station.key", "other.key")) {
            Files.copy(TLS.resolve(name), dir.resolve(name));
            Files.setPosixFilePermissions(dir.resolve(name), PosixFilePermissions.fromString("rw-------"));
        }
        String text = Files.readString(file);
        if (f.from().isEmpty()) {
            text = text + "\n" + f.to() + "\n";
        } else {
            assertThat(text).as("the example station holds " + f.from()).contains(f.from());
            text = text.replace(f.from(), f.to());
        }
        Files.writeString(file, text);
        return file;
    }

    private static int lineOf(Path file, String lineWith) throws IOException {
        List<String> lines = Files.readAllLines(file);
        for (int i = lines.size() - 1; i >= 0; i--) { // the last: an appended section comes after the comments
            if (lines.get(i).contains(lineWith)) {
                return i + 1;
            }
        }
        throw new AssertionError(lineWith + " not in " + file);
    }

    @Test
    void theExampleStationUnchangedPasses() throws Exception {
        Path file = RunDeliveryTest.station(dir, "");
        assertThat(Main.run("check", file.toString())).as(streams.err()).isZero();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("faults")
    void checkAndRunBothRefuseTheFileWithItsLineAndExitTwo(Fault f) throws Exception {
        Path file = station(f);
        String where = file + ":" + lineOf(file, f.lineWith()) + ":";

        int checked = Main.run("check", file.toString());
        String problems = streams.err();
        assertThat(checked).as(problems).isEqualTo(2);
        assertThat(problems.lines()).anySatisfy(l -> assertThat(l).startsWith(where).contains(f.message()));
        assertThat(problems.lines()).allSatisfy(l -> assertThat(l).matches(".+:\\d+:\\d+: .+"));

        Captured run = Captured.run("run", "--config", file.toString(), "--hardware", "mock", "--exit-after", "0.2");
        assertThat(run.exit()).as(run.err()).isEqualTo(2);
        assertThat(run.err().lines()).anySatisfy(l -> assertThat(l).startsWith(where).contains(f.message()));
        assertThat(run.err()).doesNotContain("Exception").doesNotContain("\tat ");
        assertThat(dir.resolve("outbox")).as("refused before the journal opens").doesNotExist();
    }

    @Test
    void aStationFileForTheSimulatorPassesCheckButRunRefusesItWithItsLine() {
        String demo = "../config/demo/station.yaml";
        assertThat(Main.run("check", demo)).as(streams.err()).isZero();

        Captured run = Captured.run("run", "--config", demo, "--hardware", "mock", "--exit-after", "0.2");
        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err().strip()).startsWith(demo + ":").contains("needs 'hardware' and 'transducer'")
                .contains("hammerstep-sim demo");
    }
}
