package hammerstep.signal;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

class CalibrationTest {

    private static final Calibration BRIDGE_24_BIT = new Calibration(2.0, 500.0, 128, 5.0, 5.0, 24);

    @Test
    @DisplayName("24-bit ADC at gain 128 on a 2 mV/V bridge reads about 2 147 484 counts at full scale (strain-gauge bridge basics: r = counts·Vref / (2^(N−1)·G·Vexc), derived)")
    void fullScaleCountsOfRatiometricBridge() {
        // 2^23 · 128 · 0.002 = 2 147 483.6
        assertThat(BRIDGE_24_BIT.countsAtFullScale()).isCloseTo(2_147_484, within(0.5));
    }

    @Test
    @DisplayName("ratiometric ADC: torque = counts · full scale / (2^(N−1) · G · S), whatever the excitation (bridge basics)")
    void excitationCancelsWhenRatiometric() {
        Calibration at10V = new Calibration(2.0, 500.0, 128, 10.0, 10.0, 24);
        double expected = 500.0 / (Math.pow(2, 23) * 128 * 0.002);
        assertThat(BRIDGE_24_BIT.nmPerCount()).isCloseTo(expected, within(1e-15));
        assertThat(at10V.nmPerCount()).isCloseTo(expected, within(1e-15));
    }

    @Test
    @DisplayName("non-ratiometric: r = V / (G · Vexc) with V = counts · Vref / 2^(N−1) (bridge basics)")
    void separateReferenceScalesTheCount() {
        // 2.5 V reference, 5 V excitation, gain 64, 1.5 mV/V, 200 N·m, 24 bits.
        Calibration c = new Calibration(1.5, 200.0, 64, 5.0, 2.5, 24);
        int counts = 1_000_000;
        double volts = counts * 2.5 / Math.pow(2, 23);
        double ratio = volts / (64 * 5.0);
        double expectedNm = ratio / 0.0015 * 200.0;
        float[] out = new float[1];
        c.toTorque(new int[] {counts}, 0, 1, 0, out, 0);
        assertThat((double) out[0]).isCloseTo(expectedNm, within(expectedNm * 1e-6));
    }

    @Test
    void subtractsTheZeroCountBeforeScaling() {
        float[] out = new float[2];
        BRIDGE_24_BIT.toTorque(new int[] {1000, 3000}, 0, 2, 1000, out, 0);
        assertThat(out[0]).isZero();
        assertThat((double) out[1]).isCloseTo(2000 * BRIDGE_24_BIT.nmPerCount(), within(1e-4));
    }

    @Test
    @DisplayName("shunt of 100 kΩ across one arm of a 350 Ω bridge: Vo/E = R / (2R + 4Rs) = 0.8735 mV/V (bridge basics, derived)")
    void shuntCalibrationOutput() {
        assertThat(Calibration.shuntOutputMvPerV(350, 100_000)).isCloseTo(0.8735, within(0.00005));
        // on a 2 mV/V, 500 N·m transducer that reads as 0.8735 / 2 · 500 N·m
        assertThat(BRIDGE_24_BIT.shuntTorqueNm(350, 100_000)).isCloseTo(218.37, within(0.01));
    }

    @Test
    void rejectsImpossibleFigures() {
        assertThatThrownBy(() -> new Calibration(0, 500, 128, 5, 5, 24)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> new Calibration(2, 500, 128, 5, 5, 40)).isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void railIsTheLargestTwosComplementCount() {
        assertThat(BRIDGE_24_BIT.maxCount()).isEqualTo(8_388_607);
        assertThat(new Calibration(2, 500, 1, 5, 5, 12).maxCount()).isEqualTo(2047);
    }
}
