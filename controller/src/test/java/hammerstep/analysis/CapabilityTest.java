package hammerstep.analysis;

import org.hipparchus.stat.descriptive.DescriptiveStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class CapabilityTest {

    /*
     * Worked by hand (Cm = (USL - LSL) / 6s, Cmk = min(USL - mean, mean - LSL) / 3s; VDI/VDE 2645-2
     * style machine capability (memory), ISO 22514-3 style indices):
     *   final torques 92, 94, 96, 93, 95 N·m, window 80..100 N·m
     *   mean = 470 / 5 = 94.0
     *   deviations -2, 0, 2, -1, 1; squares 4, 0, 4, 1, 1; sum 10
     *   s = sqrt(10 / (5 - 1)) = sqrt(2.5) = 1.581139
     *   Cm  = 20 / (6 * 1.581139) = 20 / 9.486833 = 2.108185
     *   Cmk = min(100 - 94, 94 - 80) / (3 * 1.581139) = 6 / 4.743416 = 1.264911  (below 1.67)
     */
    @Test
    @DisplayName("Cm and Cmk of a hand-worked example (formulas of VDI/VDE 2645-2 style studies)")
    void matchesHandWorkedExample() {
        Capability c = Capability.of(new double[] {92, 94, 96, 93, 95}, 80, 100);

        assertThat(c.n()).isEqualTo(5);
        assertThat(c.mean()).isCloseTo(94.0, within(1e-12));
        assertThat(c.sd()).isCloseTo(1.581139, within(1e-6));
        assertThat(c.cm()).isCloseTo(2.108185, within(1e-6));
        assertThat(c.cmk()).isCloseTo(1.264911, within(1e-6));
        assertThat(c.cmLow()).isFalse();
        assertThat(c.cmkLow()).isTrue();
    }

    /*
     * By hand: blows 6, 7, 8, 7, 7 against 4..12: mean 7, squares 1, 0, 1, 0, 0 -> s = sqrt(2/4) = 0.707107;
     * Cm = 8 / 4.242641 = 1.885618; Cmk = min(5, 3) / 2.121320 = 1.414214.
     */
    @Test
    @DisplayName("Cm and Cmk of blow counts, worked by hand")
    void blowCountsByHand() {
        Capability c = Capability.of(new double[] {6, 7, 8, 7, 7}, 4, 12);

        assertThat(c.sd()).isCloseTo(0.707107, within(1e-6));
        assertThat(c.cm()).isCloseTo(1.885618, within(1e-6));
        assertThat(c.cmk()).isCloseTo(1.414214, within(1e-6));
    }

    @Test
    void meanOutsideTheWindowGivesNegativeCmk() {
        // mean 102 above USL 100: Cmk = (100 - 102) / 3s < 0
        Capability c = Capability.of(new double[] {101, 102, 103}, 80, 100);

        assertThat(c.cmk()).isNegative();
        assertThat(c.cmkLow()).isTrue();
    }

    @Test
    void oneValueHasNoSpreadAndNoIndices() {
        Capability c = Capability.of(new double[] {90}, 80, 100);

        assertThat(c.mean()).isEqualTo(90);
        assertThat(c.sd()).isNaN();
        assertThat(c.cm()).isNaN();
        assertThat(c.cmLow()).isFalse();
    }

    @Test
    void equalValuesGiveInfiniteIndices() {
        Capability c = Capability.of(new double[] {90, 90, 90}, 80, 100);

        assertThat(c.sd()).isZero();
        assertThat(c.cm()).isInfinite();
        assertThat(c.cmk()).isEqualTo(Double.POSITIVE_INFINITY);
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1, 7, 42, 1234, 99_999})
    @DisplayName("mean and sample standard deviation agree with Hipparchus (test oracle)")
    void agreesWithHipparchus(long seed) {
        Random rnd = new Random(seed);
        int n = 25 + rnd.nextInt(200);
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            v[i] = 200 + 5 * rnd.nextGaussian();
        }
        DescriptiveStatistics oracle = new DescriptiveStatistics(v);

        Capability c = Capability.of(v, 180, 230);

        assertThat(c.mean()).isCloseTo(oracle.getMean(), within(1e-9));
        assertThat(c.sd()).isCloseTo(oracle.getStandardDeviation(), within(1e-9));
        assertThat(c.cm()).isCloseTo(50 / (6 * oracle.getStandardDeviation()), within(1e-9));
    }
}
