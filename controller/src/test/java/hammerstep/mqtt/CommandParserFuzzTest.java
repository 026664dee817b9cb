package hammerstep.mqtt;

import com.code_intelligence.jazzer.api.FuzzedDataProvider;
import com.code_intelligence.jazzer.junit.FuzzTest;
import org.junit.jupiter.api.Tag;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Coverage-guided fuzzing of the command parser (Jazzer). In every build it runs in regression
 * mode: the inputs under {@code src/test/resources/hammerstep/mqtt/CommandParserFuzzTestInputs/}
 * and an empty one; tagged {@code jazzer}, the build runs it in a JVM of its own. To fuzz for real
 * (about 1.6 GB of memory): {@code JAZZER_FUZZ=1 mvn -o -pl controller test-compile
 * surefire:test@jazzer -Dtest=CommandParserFuzzTest}; a finding is written there as a new input.
 */
@Tag("jazzer")
class CommandParserFuzzTest {

    private static final String[] NAMES = {"part", "end-part", "reload", "status"};
    private final CommandParser parser = new CommandParser(4096, 300);

    @FuzzTest(maxDuration = "60s")
    void everyPayloadGetsACommandOrACodedRefusalAndNothingThrows(FuzzedDataProvider data) {
        String name = data.consumeBoolean() ? NAMES[data.consumeInt(0, NAMES.length - 1)] : data.consumeString(80);
        Long expiry = data.consumeBoolean() ? null : data.consumeLong(-10, 1000);
        byte[] payload = data.consumeRemainingAsBytes();
        CommandParser.Result r = parser.parse(name, payload, expiry);
        if (r.ok()) {
            assertThat(r.command()).isNotNull();
            assertThat(r.errorCode()).isNull();
            assertThat(payload.length).isLessThanOrEqualTo(4096);
        } else {
            assertThat(r.errorCode()).isIn("TOO_LARGE", "UNKNOWN_COMMAND", "MALFORMED", "EXPIRY_REQUIRED", "INVALID");
            assertThat(r.message()).isNotBlank().hasSizeLessThan(400);
        }
    }
}
