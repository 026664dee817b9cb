package hammerstep.joint;

import com.code_intelligence.jazzer.junit.FuzzTest;
import hammerstep.config.ConfigException;
import hammerstep.config.YamlDocument;
import org.junit.jupiter.api.Tag;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Coverage-guided fuzzing of the joint program loader (YAML text to a validated program), Jazzer.
 * In every build it runs in regression mode on the inputs under
 * {@code src/test/resources/hammerstep/joint/ProgramFileFuzzTestInputs/} (tag {@code jazzer}: a JVM
 * of its own); {@code JAZZER_FUZZ=1 mvn -o -pl controller test-compile surefire:test@jazzer
 * -Dtest=ProgramFileFuzzTest} fuzzes for real. Whatever the bytes, the loader gives a program or
 * a {@link ConfigException} whose problems each carry a place and a message, never another
 * exception. (What the messages say is checked on the catalogue of broken files.)
 */
@Tag("jazzer")
class ProgramFileFuzzTest {

    @FuzzTest(maxDuration = "60s")
    void anyBytesGiveAProgramOrProblemsWithMessages(byte[] yaml) {
        try {
            JointProgram p = ProgramFile.read(YamlDocument.parse("fuzz.yaml", yaml));
            assertThat(p.torque().minNm()).isLessThanOrEqualTo(p.torque().maxNm());
        } catch (ConfigException e) {
            assertThat(e.problems()).isNotEmpty().allSatisfy(pr -> {
                assertThat(pr.message()).isNotBlank();
                assertThat(pr.file()).isEqualTo("fuzz.yaml");
            });
        }
    }
}
