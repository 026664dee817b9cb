package hammerstep.sim.physics;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

/** Blow rates of the tool presets under load (on iso-hard, trigger held 700 ms, truth blows ≥ 100 N·m). */
class BlowRateTest {

    static double blowRatePerMin(String tool, long seed) throws Exception {
        Rig rig = Rig.create(Presets.tool(tool), Presets.joint("iso-hard"), Presets.defaultTransducer(), 20_000, seed);
        rig.setBlowThresholdNm(100);
        float[] block = new float[2000];
        rig.setTrigger(true);
        for (int i = 0; i < 7; i++) {
            rig.fill(block, 0, block.length);
        }
        int n = rig.blows();
        assertThat(n).as(tool + " blows").isGreaterThan(5);
        return (n - 1) * 60.0 / (rig.blowTimeS(n - 1) - rig.blowTimeS(0));
    }

    private static double mean(String tool) throws Exception {
        return (blowRatePerMin(tool, 1) + blowRatePerMin(tool, 2) + blowRatePerMin(tool, 3)) / 3;
    }

    @Test
    @DisplayName("cordless two-dog under load: about 2200 blows/min ±15 % (fact of the trade, field measurement)")
    void cordlessTwoDogStrikesAboutTwentyTwoHundredTimesAMinute() throws Exception {
        assertThat(mean("cordless-two-dog")).isBetween(2200 * 0.85, 2200 * 1.15);
    }

    @Test
    @DisplayName("twin-hammer air tool under load: about 1100 blows/min ±15 % (fact of the trade, field measurement)")
    void twinHammerStrikesAboutElevenHundredTimesAMinute() throws Exception {
        assertThat(mean("air-twin-hammer")).isBetween(1100 * 0.85, 1100 * 1.15);
    }

    @Test
    @DisplayName("three dogs strike more often than two, skip mode less (120° and 240° against 180° of relative travel)")
    void threeDogAndSkipModeFollowFromTheGeometry() throws Exception {
        double two = mean("cordless-two-dog");
        double three = mean("cordless-three-dog");
        double skip = mean("cordless-skip-dog");
        // at equal spindle speed the ratios would be 1.5 and 0.75; the extra work per blow slows the spindle
        assertThat(three / two).isBetween(1.1, 1.5);
        assertThat(skip / two).isBetween(0.5, 0.85);
    }

    @Test
    void everyPresetStaysBelowThirtyThreeHundredBlowsAMinute() throws Exception {
        for (String tool : Presets.TOOLS) {
            assertThat(blowRatePerMin(tool, 1)).as(tool).isLessThan(3300);
        }
    }
}
