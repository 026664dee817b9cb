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

    private static JointOutcome withResidual(hammerstep.joint.ResidualEstimate e) {
        hammerstep.joint.JointResult r = Samples.result(true);
        hammerstep.joint.JointResult with = new hammerstep.joint.JointResult(r.program(), r.startNs(), r.endNs(),
                r.blows(), r.peaksNm(), r.peakTimesNs(), r.widthsMs(), r.impulsesNms(), r.finalTorqueNm(),
                r.durationMs(), r.shutoffAtNs(), r.blowsAfterShutoff(), r.faults(), r.verdict(), r.reasons(),
                r.direction(), r.rejectedImpulses(), e);
        JointOutcome j = Samples.joint(2, true);
        return new JointOutcome(j.partSerial(), j.partModel(), j.pattern(), j.position(), j.positionIndex(), j.pass(),
                j.attempt(), with, j.transducerSerial(), j.calibrationDue(), j.at(), j.tracePath());
    }

    @Test
    void jointMessageCarriesTheResidualEstimateWithItsBandOrTheReasonThereIsNone() throws Exception {
        hammerstep.joint.ResidualEstimate e = new hammerstep.joint.ResidualEstimate(231.4, 224.23, 238.57, 231.4,
                206.61, 3, 9, false, null);
        byte[] bytes = ResultMessages.joint(Samples.STATION, "id-5", 2, withResidual(e));
        MessageSchemas.assertValid(bytes);
        JsonNode est = JSON.readTree(bytes).get("residual_estimate");
        assertThat(est.get("torque_nm").asDouble()).isEqualTo(231.4);
        assertThat(est.get("low_nm").asDouble()).isEqualTo(224.23);
        assertThat(est.get("high_nm").asDouble()).isEqualTo(238.57);
        assertThat(est.get("slide_nm").asDouble()).isEqualTo(206.61);
        assertThat(est.get("blows_used").asInt()).isEqualTo(3);
        assertThat(est.get("calibrated").asBoolean()).isFalse();
        assertThat(est.has("reason")).isFalse();

        byte[] none = ResultMessages.joint(Samples.STATION, "id-6", 3, withResidual(hammerstep.joint.ResidualEstimate
                .none(hammerstep.joint.ResidualEstimate.Reason.NO_TURNING_BLOW, 0)));
        MessageSchemas.assertValid(none);
        assertThat(JSON.readTree(none).get("residual_estimate").toString())
                .isEqualTo("{\"reason\":\"NO_TURNING_BLOW\",\"turning_blows\":0}");
        // without an estimate of its own, a result carries no field at all
        assertThat(JSON.readTree(ResultMessages.joint(Samples.STATION, "id-7", 4, Samples.joint(1, true)))
                .has("residual_estimate")).isFalse();
    }

    @Test
    void schemaRejectsAResidualEstimateWithNeitherValueNorReason() {
        String bad = new String(ResultMessages.joint(Samples.STATION, "id-8", 1, withResidual(
                hammerstep.joint.ResidualEstimate.none(hammerstep.joint.ResidualEstimate.Reason.NO_TURNING_BLOW, 0))))
                .replace("\"reason\":\"NO_TURNING_BLOW\",", "");
        assertThat(MessageSchemas.problems(bad.getBytes())).isNotEmpty();
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
