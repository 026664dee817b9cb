package hammerstep.results;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The published schemas keep the contract of docs/integration.md: within v1 fields are only added, and a
 * subscriber ignores the ones it does not know. So a message of each kind with a field added (at the top
 * and inside a nested object) still validates, while the fields v1 requires stay required and typed.
 */
class MessageSchemasTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String STATUS = "{\"schema\":\"hammerstep.status.v1\",\"id\":\"s-1\",\"seq\":1,"
            + "\"site\":\"plant-north\",\"line\":\"axle-2\",\"station\":\"hub-fit-1\",\"time\":\"2026-03-04T05:06:10Z\","
            + "\"state\":\"online\",\"started\":\"2026-03-04T05:00:00Z\",\"version\":\"1.0\",\"storage\":\"OK\","
            + "\"backlog\":0,\"last_seq\":{\"joint\":3,\"part\":1,\"event\":0},"
            + "\"activity\":{\"mode\":\"WAITING\",\"part_serial\":null,\"part_model\":null,\"pattern\":null,"
            + "\"queued_part\":{\"serial\":\"WH-0003\",\"model\":\"hub-5\"}}}";
    private static final String RESPONSE = "{\"schema\":\"hammerstep.response.v1\",\"id\":\"r-1\",\"seq\":1,"
            + "\"site\":\"plant-north\",\"line\":\"axle-2\",\"station\":\"hub-fit-1\",\"time\":\"2026-03-04T05:06:10Z\","
            + "\"command\":\"status\",\"ok\":true,\"code\":\"OK\",\"message\":\"status\",\"status\":" + STATUS + "}";

    /** A valid message of each kind, the path of a nested object in it, and a required field with its type. */
    record Kind(String name, String message, String nested, String required) {
        @Override
        public String toString() {
            return name;
        }
    }

    static Stream<Kind> kinds() {
        String joint = new String(ResultMessages.joint(Samples.STATION, "j-1", 7, Samples.joint(3, true)),
                StandardCharsets.UTF_8);
        String part = new String(ResultMessages.part(Samples.STATION, "p-1", 1, Samples.part(List.of("a", "b"))),
                StandardCharsets.UTF_8);
        String event = new String(ResultMessages.event(Samples.STATION, "e-1", 1, Samples.event()),
                StandardCharsets.UTF_8);
        return Stream.of(new Kind("joint", joint, "/limits/torque_nm", "final_torque_nm"),
                new Kind("part", part, null, "verdict"),
                new Kind("event", event, null, "severity"),
                new Kind("status", STATUS, "/last_seq", "state"),
                new Kind("response", RESPONSE, "/status/activity", "ok"));
    }

    private static ObjectNode parse(String text) throws Exception {
        return (ObjectNode) JSON.readTree(text);
    }

    private static byte[] bytes(ObjectNode n) throws Exception {
        return JSON.writeValueAsBytes(n);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("kinds")
    void theStationsOwnMessageIsValidAndDeclaresEveryField(Kind k) {
        MessageSchemas.assertValid(k.message().getBytes(StandardCharsets.UTF_8));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("kinds")
    void aMessageWithAnUnknownAddedFieldStillValidates(Kind k) throws Exception {
        ObjectNode m = parse(k.message());
        m.put("torque_angle_deg", 41.5);
        m.putObject("future_block").put("anything", true);
        if (k.nested() != null) {
            ((ObjectNode) m.at(k.nested())).put("added_later", "x");
        }
        assertThat(MessageSchemas.problems(bytes(m))).as("a subscriber's validator").isEmpty();
        assertThat(MessageSchemas.undeclared(bytes(m))).as("what the station itself may not send undocumented")
                .contains("/torque_angle_deg", "/future_block");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("kinds")
    void requiredFieldsAndTheirTypesStayStrict(Kind k) throws Exception {
        ObjectNode missing = parse(k.message());
        missing.remove(k.required());
        assertThat(MessageSchemas.problems(bytes(missing))).as("without " + k.required()).isNotEmpty();

        ObjectNode wrongType = parse(k.message());
        wrongType.putArray(k.required());
        assertThat(MessageSchemas.problems(bytes(wrongType))).as(k.required() + " as an array").isNotEmpty();

        ObjectNode wrongSeq = parse(k.message());
        wrongSeq.put("seq", "seven");
        assertThat(MessageSchemas.problems(bytes(wrongSeq))).as("seq as text").isNotEmpty();
    }
}
