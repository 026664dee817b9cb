package hammerstep.sequence;

import hammerstep.config.ConfigException;
import hammerstep.config.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Collectors;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

/**
 * The loader itself on the catalogue of broken pattern files: each file names, in its first line
 * ({@code # expect: line:column: message}), the problem a line engineer must be shown, and the
 * loader reports exactly that place and text.
 */
class PatternFileCatalogueTest {

    private static final Path BROKEN = Path.of("src/test/resources/broken/patterns");

    @TempDir
    Path tmp;

    static Stream<Path> brokenPatterns() throws IOException {
        try (Stream<Path> files = Files.list(BROKEN)) {
            // the kind of a file without 'passes' is told by `check`, not by the pattern loader
            return files.filter(f -> f.toString().endsWith(".yaml") && !f.endsWith("missing-passes.yaml"))
                    .sorted().collect(Collectors.toList()).stream();
        }
    }

    @ParameterizedTest
    @MethodSource("brokenPatterns")
    void reportsTheCatalogueProblemAtItsLineAndColumn(Path file) throws IOException {
        String first = Files.readAllLines(file).get(0);
        String expected = file + ":" + first.substring("# expect: ".length());
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> PatternFile.load(file));
        assertThat(e).as(file.toString()).isNotNull();
        assertThat(e.problems()).extracting(Problem::toString).anySatisfy(p -> assertThat(p).startsWith(expected));
    }

    @Test
    void aPatternWithoutPassesIsRefusedByTheLoader() {
        Path file = BROKEN.resolve("missing-passes.yaml");
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> PatternFile.load(file));
        assertThat(e.problems()).extracting(Problem::message).contains("missing key 'passes': expected a list");
    }

    @Test
    void takesOneToOneHundredTwentyEightPositionsAndNoMore() throws Exception {
        Path dir = tmp;
        Files.writeString(dir.resolve("final.yaml"), Files.readString(Path.of("src/test/resources/broken/support/final.yaml")));
        assertThat(PatternFile.load(write(dir, "one.yaml", "1")).size()).isEqualTo(1);
        assertThat(PatternFile.load(write(dir, "max.yaml", "128")).size()).isEqualTo(128);
        String labels129 = Stream.iterate(1, i -> i + 1).limit(129).map(i -> "P" + i)
                .collect(Collectors.joining(", ", "[", "]"));
        String labels128 = Stream.iterate(1, i -> i + 1).limit(128).map(i -> "P" + i)
                .collect(Collectors.joining(", ", "[", "]"));
        assertThat(PatternFile.load(write(dir, "list128.yaml", labels128)).size()).isEqualTo(128);
        ConfigException count = catchThrowableOfType(ConfigException.class,
                () -> PatternFile.load(write(dir, "over.yaml", "129")));
        assertThat(count.problems()).extracting(Problem::message)
                .containsExactly("'positions' is 129: expected a count from 1 to 128 or a list of labels");
        ConfigException list = catchThrowableOfType(ConfigException.class,
                () -> PatternFile.load(write(dir, "list129.yaml", labels129)));
        assertThat(list.problems()).extracting(Problem::message)
                .containsExactly("'positions' has 129 entries: at most 128");
    }

    @Test
    void anEmptyLabelListAndABlankLabelAreRefused() throws Exception {
        Path dir = tmp;
        Files.writeString(dir.resolve("final.yaml"), Files.readString(Path.of("src/test/resources/broken/support/final.yaml")));
        ConfigException empty = catchThrowableOfType(ConfigException.class,
                () -> PatternFile.load(write(dir, "empty.yaml", "[]")));
        assertThat(empty.problems()).extracting(Problem::message)
                .containsExactly("'positions' is empty: expected at least one position");
        ConfigException blank = catchThrowableOfType(ConfigException.class,
                () -> PatternFile.load(write(dir, "blank.yaml", "[A, \" \"]")));
        assertThat(blank.problems()).extracting(Problem::toString).singleElement()
                .satisfies(p -> assertThat(p).contains(":2:16: 'positions[1]': expected a position label"));
    }

    @Test
    void anInlineProgramWithAProblemIsReportedWhereItStands() throws Exception {
        Path dir = tmp;
        Path file = dir.resolve("inline.yaml");
        Files.writeString(file, """
                id: inline
                positions: 2
                passes:
                  - name: snug
                    program: { id: snug, torque: { min: 30, target: 40, max: 60 },
                               blows: { count_above: 20, min: 1, max: 20 },
                               rundown: { start_above: 10, end_after_ms: 100, max_ms: 3000 }, colour: red }
                """);
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> PatternFile.load(file));
        assertThat(e.problems()).extracting(Problem::toString)
                .anySatisfy(p -> assertThat(p).startsWith(file + ":7:79: unknown key 'passes[0].program.colour'"));
    }

    @Test
    void aProgramThatIsNeitherAFileNameNorAMapIsRefused() throws Exception {
        Path dir = tmp;
        Path file = dir.resolve("list.yaml");
        Files.writeString(file, "id: x\npositions: 2\npasses: [{ name: final, program: [a, b] }]\n");
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> PatternFile.load(file));
        assertThat(e.problems()).extracting(Problem::message)
                .containsExactly("'passes[0].program': expected a file name or a map, got a list");
    }

    private static Path write(Path dir, String name, String positions) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, "id: p\npositions: " + positions + "\npasses: [{ name: final, program: final.yaml }]\n");
        return p;
    }
}
