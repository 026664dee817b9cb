package hammerstep.joint;

import hammerstep.config.ConfigException;
import hammerstep.config.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

/**
 * A catalogue of broken program files under {@code src/test/resources/programs/broken}, each with
 * the message it must produce in its first line ({@code # expect: line:column: message}).
 */
class ProgramFileTest {

    private static final Path DIR = Path.of("src/test/resources/programs");

    @Test
    void readsTheDesignExample() throws ConfigException {
        JointProgram p = ProgramFile.load(DIR.resolve("good.yaml"));
        assertThat(p.id()).isEqualTo("hub-final");
        assertThat(p.torque()).isEqualTo(new JointProgram.Torque(180, 200, 230));
        assertThat(p.finalTorque()).isEqualTo(FinalTorque.MAX_PEAK);
        assertThat(p.blows().countAboveNm()).isEqualTo(40);
        assertThat(p.blows().releaseBelowNm()).isEqualTo(20);
        assertThat(p.blows().min()).isEqualTo(4);
        assertThat(p.blows().max()).isEqualTo(30);
        // default fastest blow rate 4000 per minute: half of a 15 ms interval
        assertThat(p.blows().deadTimeMs()).isEqualTo(7.5);
        assertThat(p.rundown()).isEqualTo(new JointProgram.Rundown(10, 200, 5000));
        assertThat(p.shutoffAtNm()).isEqualTo(205);
        assertThat(p.rehitBlows()).isEqualTo(2);
        assertThat(p.revision()).hasSize(12).matches("[0-9a-f]+");
    }

    @Test
    void aLeftHandThreadIsNamedByItsKey() throws Exception {
        assertThat(ProgramFile.load(DIR.resolve("good.yaml")).leftHand()).isFalse();
        Path a = Files.createTempFile("program", ".yaml");
        try {
            Files.writeString(a, Files.readString(DIR.resolve("good.yaml")) + "\nthread: left\n");
            assertThat(ProgramFile.load(a).leftHand()).isTrue();
            assertThat(ProgramFile.load(a).tighteningSign()).isEqualTo(-1f);
            Files.writeString(a, Files.readString(DIR.resolve("good.yaml")) + "\nthread: right\n");
            assertThat(ProgramFile.load(a).leftHand()).isFalse();
        } finally {
            Files.deleteIfExists(a);
        }
    }

    @Test
    void revisionChangesWithTheContent() throws Exception {
        Path a = Files.createTempFile("program", ".yaml");
        try {
            Files.writeString(a, Files.readString(DIR.resolve("good.yaml")));
            String first = ProgramFile.load(a).revision();
            Files.writeString(a, Files.readString(DIR.resolve("good.yaml")).replace("230.0", "231.0"));
            assertThat(ProgramFile.load(a).revision()).isNotEqualTo(first);
        } finally {
            Files.deleteIfExists(a);
        }
    }

    @Test
    void missingFileIsOneProblem() {
        ConfigException e = catchThrowableOfType(ConfigException.class,
                () -> ProgramFile.load(Path.of("no/such/program.yaml")));
        assertThat(e.problems()).extracting(Problem::toString).containsExactly("no/such/program.yaml:0:0: no such file");
    }

    static Stream<Path> brokenFiles() throws IOException {
        return Files.list(DIR.resolve("broken")).sorted();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("brokenFiles")
    void brokenFileGivesItsMessage(Path file) throws IOException {
        String first = Files.readAllLines(file).get(0);
        assertThat(first).startsWith("# expect: ");
        String expected = file + ":" + first.substring("# expect: ".length());
        List<String> messages = catchThrowableOfType(ConfigException.class, () -> ProgramFile.load(file))
                .problems().stream().map(Problem::toString).toList();
        assertThat(messages).anySatisfy(m -> assertThat(m).startsWith(expected));
    }

    @Test
    void everyProblemOfAFileIsReportedAtOnce() {
        assertThatThrownBy(() -> ProgramFile.read(hammerstep.config.YamlDocument.parse("p.yaml",
                "id: a\ntorque: { min: x, target: 200, max: 100 }\nblows: { count_above: 40, min: 9, max: 3 }\n"
                        + "rundown: { start_above: 10, end_after_ms: 200, max_ms: 5000 }\nextra: 1\n")))
                .isInstanceOfSatisfying(ConfigException.class, e -> assertThat(e.problems()).extracting(Problem::message)
                        .containsExactly("'torque.min': expected a number, got \"x\"",
                                "'blows.min' (9) is above 'blows.max' (3)",
                                "unknown key 'extra' (expected one of: id, torque, final_torque, blows, rundown, shutoff_at, rehit_blows, thread, residual_calibration)"));
    }

    @Test
    void aProgramCarriesTheResidualCalibrationFromAudits() throws Exception {
        JointProgram p = ProgramFile.read(hammerstep.config.YamlDocument.parse("p.yaml", (
                "id: a\ntorque: { min: 180, target: 200, max: 230 }\nblows: { count_above: 40, min: 4, max: 30 }\n"
                        + "rundown: { start_above: 10, end_after_ms: 200, max_ms: 5000 }\n"
                        + "residual_calibration: { factor: 0.97, offset_nm: 4.5, band_nm: 3.2, audits: 5, date: 2026-12-03 }\n")
                .getBytes(java.nio.charset.StandardCharsets.UTF_8)));
        assertThat(p.residualCalibration()).isEqualTo(new ResidualCalibration(0.97, 4.5, 3.2, 5,
                java.time.LocalDate.of(2026, 12, 3)));
        assertThat(p.residualCalibration().apply(200)).isCloseTo(198.5, org.assertj.core.api.Assertions.within(1e-9));
    }
}
