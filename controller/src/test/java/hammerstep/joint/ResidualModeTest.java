package hammerstep.joint;

import hammerstep.config.YamlDocument;
import hammerstep.signal.BlowForms;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** {@code final_torque: residual_estimate}: a program judging on the residual estimate. */
class ResidualModeTest {

    private static JointProgram program(double min, double max) throws Exception {
        String yaml = "id: on-residual\n"
                + "torque: { min: " + min + ", target: " + (min + max) / 2 + ", max: " + max + " }\n"
                + "final_torque: residual_estimate\n"
                + "blows: { count_above: 40, min: 1, max: 30 }\n"
                + "rundown: { start_above: 10, end_after_ms: 200, max_ms: 5000 }\n"
                + "shutoff_at: 400\n";
        return ProgramFile.read(YamlDocument.parse("on-residual.yaml", yaml.getBytes(StandardCharsets.UTF_8)));
    }

    private static final float[] TURNING = ResidualEstimatorTest.rundown(ResidualEstimatorTest.turning(170, 185, 200));

    @Test
    void theModeIsOffByDefault() throws Exception {
        JointProgram p = ProgramFile.read(YamlDocument.parse("p.yaml", ("id: a\ntorque: { min: 1, target: 2, max: 3 }\n"
                + "blows: { count_above: 1, min: 1, max: 3 }\nrundown: { start_above: 1, end_after_ms: 200, max_ms: 5000 }\n")
                .getBytes(StandardCharsets.UTF_8)));
        assertThat(p.finalTorque()).isEqualTo(FinalTorque.MAX_PEAK);
    }

    @Test
    void aJointIsJudgedOnItsEstimate() throws Exception {
        // slides at 170, 185, 200 N·m: the estimate is about 1.12 × 185 = 207 N·m; peaks reach 240
        JointResult r = ResidualEstimatorTest.judge(program(195, 220), TURNING, 512);
        assertThat(r.residual().present()).isTrue();
        assertThat(r.finalTorqueNm()).isEqualTo(r.residual().torqueNm());
        assertThat(r.finalTorqueNm()).isCloseTo(ResidualEstimator.DEFAULT_FACTOR * 185, within(4.0));
        assertThat(r.verdict()).isEqualTo(Verdict.GO);
        // the same joint against a window its peaks would pass but its estimate does not
        JointResult low = ResidualEstimatorTest.judge(program(225, 260), TURNING, 512);
        assertThat(low.verdict()).isEqualTo(Verdict.NO_GO);
        assertThat(low.reasons()).containsExactly(Reason.TORQUE_LOW);
    }

    @Test
    void aJointWithoutAnEstimateIsNoGoWithTheReasonNeverGo() throws Exception {
        float[] stuck = ResidualEstimatorTest.rundown(BlowForms.elastic(200, 60, 0), BlowForms.elastic(210, 60, 0));
        JointResult r = ResidualEstimatorTest.judge(program(0, 1000), stuck, 512);
        assertThat(r.residual().reason()).isEqualTo(ResidualEstimate.Reason.NO_TURNING_BLOW);
        assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
        assertThat(r.reasons()).containsExactly(Reason.RESIDUAL_UNKNOWN);
        assertThat(r.finalTorqueNm()).isZero();
    }

    @Test
    void onlyThisModeAsksForAnEstimate() {
        JointProgram peaks = Programs.hubFinal();
        assertThat(Evaluator.reasons(peaks, 5, 200, false, 0, 0, false)).isEmpty();
        JointProgram residual = Programs.with(peaks, FinalTorque.RESIDUAL_ESTIMATE);
        assertThat(Evaluator.reasons(residual, 5, 200, false, 0, 0, false)).isEqualTo(List.of(Reason.RESIDUAL_UNKNOWN));
        assertThat(Evaluator.reasons(residual, 5, 200, false, 0, 0, true)).isEmpty();
    }
}
