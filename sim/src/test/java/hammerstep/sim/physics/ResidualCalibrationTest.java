package hammerstep.sim.physics;

import hammerstep.joint.ResidualEstimate;
import hammerstep.joint.ResidualEstimator;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The residual estimate against the simulator's breakaway truth on a few rundowns of the CALIBRATION set
 * (today's presets and friction law; {@link ResidualTable} runs all of it): within the default 95 % band,
 * and no value for the oil-pulse tool. The held-out study is not this test's business.
 */
class ResidualCalibrationTest {

    @ParameterizedTest
    @CsvSource({"cordless-two-dog, iso-hard, 1", "air-three-jaw, flange-m16, 2", "air-twin-hammer, wheel-stud-m14, 3",
            "cordless-skip-dog, iso-soft, 1"})
    void theEstimateLiesWithinItsBandOfTheBreakawayTruth(String tool, String joint, long seed) throws Exception {
        ResidualTable.Row r = ResidualTable.rundown(tool, joint, seed, 1500);
        ResidualEstimate e = r.estimate();
        assertThat(e.present()).as("%s", e.reason()).isTrue();
        assertThat(e.blowsUsed()).isEqualTo(ResidualEstimator.LAST_TURNING);
        assertThat(Math.abs(r.error())).as("error of the estimate").isLessThan(ResidualEstimator.DEFAULT_BAND);
        assertThat(r.truthNm()).isBetween(e.lowNm(), e.highNm());
    }

    @ParameterizedTest
    @CsvSource({"oil-pulse, iso-hard, 1", "oil-pulse, flange-m16, 2"})
    void hydraulicPulsesGiveNoValue(String tool, String joint, long seed) throws Exception {
        ResidualEstimate e = ResidualTable.rundown(tool, joint, seed, 1500).estimate();
        assertThat(e.present()).isFalse();
        assertThat(e.reason()).isEqualTo(ResidualEstimate.Reason.HYDRAULIC_PULSES);
    }
}
