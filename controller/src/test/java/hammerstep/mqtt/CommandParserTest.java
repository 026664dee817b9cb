package hammerstep.mqtt;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

class CommandParserTest {

    private final CommandParser parser = new CommandParser(4096, 300);

    private CommandParser.Result parse(String name, String json, Long expiry) {
        return parser.parse(name, json.getBytes(StandardCharsets.UTF_8), expiry);
    }

    @Test
    void readsAPartCommand() {
        CommandParser.Result r = parse("part", "{\"serial\":\"WH-0009\",\"model\":\"hub-5\"}", 30L);
        assertThat(r.command()).isEqualTo(new Command.StartPart("WH-0009", "hub-5"));
    }

    @Test
    void statusNeedsNoExpiryAndMayBeEmpty() {
        assertThat(parser.parse("status", new byte[0], null).command()).isEqualTo(new Command.Status());
    }

    @Test
    void endPartTakesAnOptionalReason() {
        assertThat(parse("end-part", "{}", 10L).command()).isEqualTo(new Command.EndPart("ended by the plant"));
        assertThat(parse("end-part", "{\"reason\":\"scrap\"}", 10L).command()).isEqualTo(new Command.EndPart("scrap"));
    }

    @ParameterizedTest(name = "{0} {1} -> {3}")
    @CsvSource(delimiter = '|', value = {
        "part|{\"serial\":\"A\"}|30|INVALID",
        "part|{\"serial\":\"A B\",\"model\":\"m\"}|30|INVALID",
        "part|{\"serial\":\"A\",\"model\":\"m\",\"extra\":1}|30|INVALID",
        "part|{\"serial\":1,\"model\":\"m\"}|30|INVALID",
        "part|[1,2]|30|MALFORMED",
        "part|{\"serial\":\"A\",\"serial\":\"B\",\"model\":\"m\"}|30|MALFORMED",
        "part|not json|30|MALFORMED",
        "part|{\"serial\":\"A\",\"model\":\"m\"}||EXPIRY_REQUIRED",
        "part|{\"serial\":\"A\",\"model\":\"m\"}|3600|INVALID",
        "reload|{\"now\":true}|30|INVALID",
        "status|{\"x\":1}||INVALID",
        "explode|{}|30|UNKNOWN_COMMAND",
    })
    void refusesWithACode(String name, String json, Long expiry, String code) {
        CommandParser.Result r = parse(name, json, expiry);
        assertThat(r.ok()).isFalse();
        assertThat(r.errorCode()).isEqualTo(code);
        assertThat(r.message()).isNotBlank();
    }

    @Test
    void refusesAnOversizedCommandBeforeReadingIt() {
        assertThat(parser.parse("part", new byte[4097], 30L).errorCode()).isEqualTo("TOO_LARGE");
    }

    @ParameterizedTest
    @ValueSource(longs = {1, 2, 3, 4, 5, 6, 7, 8})
    void randomBytesNeverThrowAndNeverYieldAStateChangingCommandWithoutItsFields(long seed) {
        Random rnd = new Random(seed);
        String[] names = {"part", "end-part", "reload", "status", "x"};
        for (int i = 0; i < 2000; i++) {
            byte[] b = new byte[rnd.nextInt(64)];
            rnd.nextBytes(b);
            if (rnd.nextBoolean() && b.length > 2) {
                b[0] = '{';
                b[b.length - 1] = '}';
            }
            CommandParser.Result r = parser.parse(names[rnd.nextInt(names.length)], b, rnd.nextBoolean() ? 30L : null);
            assertThat(r.ok() || r.errorCode() != null).isTrue();
            if (r.command() instanceof Command.StartPart p) {
                assertThat(p.serial()).isNotBlank();
            }
        }
    }
}
