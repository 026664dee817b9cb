package hammerstep.results;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class ResultMessagesTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    @Test
    void jointMessageCarriesIdentityContextFiguresAndLimits() throws Exception {
        byte[] bytes = ResultMessages.joint(Samples.STATION, "id-1", 7, Samples.joint(3, true));
        MessageSchemas.assertValid(bytes);
        JsonNode m = JSON.readTree(bytes);
        assertThat(m.get("schema").asText()).isEqualTo("hammerstep.joint.v1");
        assertThat(m.get("seq").asLong()).isEqualTo(7);
        assertThat(m.get("station").asText()).isEqualTo("hub-fit-1");
        assertThat(m.get("time").asText()).isEqualTo("2026-03-04T05:06:10.089Z");
        assertThat(m.get("program").asText()).isEqualTo("hub-final");
        assertThat(m.get("program_revision").asText()).isEqualTo("sha256:0f3c9a");
        assertThat(m.get("calibration_due").asText()).isEqualTo("2026-09-30");
        assertThat(m.get("position_index").asInt()).isEqualTo(3);
        assertThat(m.get("final_torque_nm").asDouble()).isEqualTo(203.4);
        assertThat(m.get("limits").get("torque_nm").get("max").asDouble()).isEqualTo(230.0);
        assertThat(m.get("verdict").asText()).isEqualTo("GO");
    }

    @Test
    void noGoJointListsItsReasons() throws Exception {
        byte[] bytes = ResultMessages.joint(Samples.STATION, "id-2", 1, Samples.joint(1, false));
        MessageSchemas.assertValid(bytes);
        assertThat(JSON.readTree(bytes).get("reasons").toString()).isEqualTo("[\"TORQUE_LOW\",\"BLOWS_FEW\"]");
    }

    @Test
    void partAndEventMessagesMatchTheirSchemas() throws Exception {
        byte[] part = ResultMessages.part(Samples.STATION, "p-1", 1, Samples.part(List.of("a", "b")));
        MessageSchemas.assertValid(part);
        assertThat(JSON.readTree(part).get("joints").size()).isEqualTo(2);
        MessageSchemas.assertValid(ResultMessages.event(Samples.STATION, "e-1", 1, Samples.event()));
    }

    @Test
    void schemaRejectsAJointWithoutSeq() {
        String bad = new String(ResultMessages.joint(Samples.STATION, "id-3", 1, Samples.joint(1, true)))
                .replace("\"seq\":1,", "");
        assertThat(MessageSchemas.problems(bad.getBytes())).isNotEmpty();
    }

    @Test
    void schemaRejectsAnUnknownVerdict() {
        String bad = new String(ResultMessages.joint(Samples.STATION, "id-4", 1, Samples.joint(1, true)))
                .replace("\"verdict\":\"GO\"", "\"verdict\":\"MAYBE\"");
        assertThat(MessageSchemas.problems(bad.getBytes())).isNotEmpty();
    }
}
