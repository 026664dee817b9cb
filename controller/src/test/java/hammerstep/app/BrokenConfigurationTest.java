package hammerstep.app;

import hammerstep.testing.StandardStreams;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Every broken configuration file of the catalogues (programs, patterns, station files) through
 * {@code hammerstep check} as a line engineer runs it: exit 2, the file's own first line
 * ({@code # expect: line:column: message}) among the printed problems, and nothing that looks like
 * a stack trace or a Java class name.
 */
class BrokenConfigurationTest {

    private static final List<Path> CATALOGUES = List.of(
            Path.of("src/test/resources/programs/broken"),
            Path.of("src/test/resources/broken/patterns"),
            Path.of("src/test/resources/broken/stations"));

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    static Stream<Path> brokenFiles() throws IOException {
        List<Path> files = new ArrayList<>();
        for (Path dir : CATALOGUES) {
            try (Stream<Path> s = Files.list(dir)) {
                s.filter(f -> f.toString().endsWith(".yaml")).sorted().forEach(files::add);
            }
        }
        return files.stream();
    }

    @Test
    void theCataloguesHoldAtLeastThirtyFilesOfEachOtherKindBesidesPrograms() throws IOException {
        assertThat(brokenFiles().filter(f -> !f.startsWith(CATALOGUES.get(0)))).hasSizeGreaterThanOrEqualTo(30);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("brokenFiles")
    void checkPrintsTheFilesLineAndColumnAndExitsTwo(Path file) throws IOException {
        String first = firstLine(file);
        assertThat(first).as("first line of " + file).startsWith("# expect: ");
        String expected = file + ":" + first.substring("# expect: ".length());

        int exit = Main.run("check", file.toString());

        String printed = streams.err();
        assertThat(exit).isEqualTo(2);
        assertThat(printed.lines()).anySatisfy(l -> assertThat(l).startsWith(expected));
        assertThat(printed.lines()).allSatisfy(l -> assertThat(l).matches("[^:]+:\\d+:\\d+: .+"));
        assertThat(printed).doesNotContain("Exception").doesNotContain("\tat ").doesNotContain("java.");
        assertThat(streams.out()).isEmpty();
    }

    @Test
    void aDirectoryOfBrokenFilesReportsEveryOneAndExitsTwo() {
        int exit = Main.run("check", "src/test/resources/broken/stations");
        assertThat(exit).isEqualTo(2);
        assertThat(streams.err().lines().map(l -> l.substring(0, l.indexOf(".yaml:")))
                .distinct()).hasSizeGreaterThanOrEqualTo(20);
    }

    @Test
    void anInvalidPinIsReportedOnceAndClaimsNoOtherLinesPin() {
        // found by this catalogue: the out-of-range pin's stand-in value (2) used to clash with the trigger's pin 2
        int exit = Main.run("check", "src/test/resources/broken/stations/hardware-pin-out-of-range.yaml");
        assertThat(exit).isEqualTo(2);
        assertThat(streams.err().lines()).singleElement()
                .satisfies(l -> assertThat(l).contains("tool_enable.pin' is 99"));
    }

    @Test
    void theRepositorysOwnConfigurationPassesWithSimulatorPresetsSkippedWithANote() {
        assertThat(Main.run("check", "../config")).isZero();
        assertThat(streams.err()).isEmpty();
        assertThat(streams.out().lines()).contains("../config/sim/joints/iso-hard.yaml: skipped: a simulator joint preset"
                + " ('hammerstep-sim check' validates it)");
        assertThat(streams.out().lines().reduce((a, b) -> b).orElse("")).matches("\\d+ files valid, \\d+ skipped");
    }

    @Test
    void theValidSupportFilesPass() {
        assertThat(Main.run("check", "src/test/resources/broken/support")).isZero();
    }

    private static String firstLine(Path file) throws IOException {
        byte[] b = Files.readAllBytes(file);
        int nl = 0;
        while (nl < b.length && b[nl] != '\n') {
            nl++;
        }
        return new String(b, 0, nl, StandardCharsets.UTF_8);
    }
}
