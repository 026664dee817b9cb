package hammerstep.signal;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.Arrays;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Conditioning and detection at the exact edges of their thresholds, and in every position of a block. */
class SignalEdgesTest {

    private static final Conditioning WATCHFUL = new Conditioning(5.0, 2.0, 1000.0, 100.0, 10.0, 0.0);

    private static float[] quiet(int n) {
        float[] x = new float[n];
        for (int i = 0; i < n; i++) {
            x[i] = (i % 2 == 0) ? 0.01f : -0.01f;
        }
        return x;
    }

    @ParameterizedTest(name = "spike at index {0}")
    @ValueSource(ints = {0, 1, 2, 3, 4, 5, 6, 8, 9})
    void everySampleOfABlockIsWatched(int index) {
        // 10 samples: two groups of four and a tail of two
        Conditioner c = new Conditioner(WATCHFUL, 1000);
        float[] out = new float[10];
        float[] x = quiet(10);
        x[index] = 100f;
        assertThat(c.process(x, 0, 10, out, false) & SignalFaults.OVER_RANGE).as("high").isNotZero();
        x[index] = -100f;
        assertThat(c.process(x, 0, 10, out, false) & SignalFaults.OVER_RANGE).as("low").isNotZero();
        x[index] = 99.9f;
        assertThat(c.process(x, 0, 10, out, false) & SignalFaults.OVER_RANGE).as("just below").isZero();
        x[index] = Float.NaN;
        assertThat(c.process(x, 0, 10, out, false) & SignalFaults.NOT_FINITE).as("NaN").isNotZero();
        assertThat(out[index]).as("held at the last good value (for index 0, the previous block's last)").isEqualTo(index == 0 ? -0.01f : out[index - 1]);
        x[index] = Float.NEGATIVE_INFINITY;
        assertThat(c.process(x, 0, 10, out, false) & SignalFaults.NOT_FINITE).as("-inf").isNotZero();
        x[index] = 5f;
        c.process(x, 0, 10, out, false);
        assertThat(out[index]).as("output of the sample").isEqualTo(5f);
    }

    @Test
    void heldValueAfterAGapCarriesTheLastGoodSampleAcrossBlocks() {
        Conditioner c = new Conditioner(WATCHFUL, 1000);
        float[] out = new float[4];
        c.process(new float[] {1f, 2f, 3f, 4f}, 0, 4, out, false);
        c.process(new float[] {Float.NaN, Float.NaN, 6f, 7f}, 0, 4, out, false);
        assertThat(out).containsExactly(4f, 4f, 6f, 7f);
    }

    @Test
    void offsetsAreReadFromTheGivenPosition() {
        Conditioner c = new Conditioner(WATCHFUL, 1000);
        float[] out = new float[3];
        c.process(new float[] {50f, 1f, 2f, 3f, 50f}, 1, 3, out, false);
        assertThat(out).containsExactly(1f, 2f, 3f);
        assertThat(c.faults()).isZero();
    }

    @Test
    void zeroTracksOnlyQuietBlocksAndTheMeanOfAllSamples() {
        Conditioner c = new Conditioner(WATCHFUL, 1000);
        float[] out = new float[7];
        // 7 samples: the tail after the group of four counts toward the mean
        c.process(new float[] {1f, 1f, 1f, 1f, 1.7f, 1.7f, 1.7f}, 0, 7, out, true);
        assertThat(c.zeroNm()).isEqualTo((4 * 1.0 + 3 * 1.7f) / 7, org.assertj.core.api.Assertions.within(1e-6));
        // a sample 5 N·m or more from the block's mean is not quiet: the zero stays
        double z = c.zeroNm();
        c.process(new float[] {0f, 6f, 0f, 0f, 0f, 0f, 0f}, 0, 7, out, true); // 6 − 6/7 ≥ 5
        assertThat(c.zeroNm()).isEqualTo(z);
        c.process(new float[] {0f, 5.8f, 0f, 0f, 0f, 0f, 0f}, 0, 7, out, true); // 5.8 − 5.8/7 < 5
        assertThat(c.zeroNm()).isNotEqualTo(z);
    }

    @Test
    void zeroAtTheLimitIsStillAbsorbed() {
        Conditioner c = new Conditioner(WATCHFUL, 1000);
        float[] two = new float[8];
        Arrays.fill(two, 2.0f);
        assertThat(c.process(two, 0, 8, new float[8], true) & SignalFaults.ZERO_DRIFT).isZero();
        assertThat(c.zeroNm()).isEqualTo(2.0);
        Conditioner d = new Conditioner(WATCHFUL, 1000);
        Arrays.fill(two, -2.5f);
        assertThat(d.process(two, 0, 8, new float[8], true) & SignalFaults.ZERO_DRIFT).isNotZero();
        assertThat(d.zeroNm()).isEqualTo(-2.0);
    }

    @Test
    void setZeroRefusesAnOffsetPastTheLimit() {
        Conditioner c = new Conditioner(WATCHFUL, 1000);
        float[] big = new float[8];
        Arrays.fill(big, 3f);
        c.process(big, 0, 8, new float[8], true);
        assertThat(c.faults() & SignalFaults.ZERO_DRIFT).isNotZero();
        assertThat(c.setZero(2.5)).isFalse();
        assertThat(c.setZero(-2.0)).isTrue();
        assertThat(c.zeroNm()).isEqualTo(-2.0);
        assertThat(c.faults() & SignalFaults.ZERO_DRIFT).isZero();
        assertThat(c.settings()).isEqualTo(WATCHFUL);
    }

    @Test
    void flatLineCountsOnlyExactlyConstantBlocksInARow() {
        Conditioner c = new Conditioner(WATCHFUL, 1000); // 10 ms = 10 samples
        float[] out = new float[5];
        float[] flat = {3f, 3f, 3f, 3f, 3f};
        assertThat(c.process(flat, 0, 5, out, false) & SignalFaults.FLAT_LINE).isZero();
        assertThat(c.process(flat, 0, 5, out, false) & SignalFaults.FLAT_LINE).isNotZero();
        // another constant, different value: the count restarts
        float[] other = {4f, 4f, 4f, 4f, 4f};
        assertThat(c.process(other, 0, 5, out, false) & SignalFaults.FLAT_LINE).isZero();
        assertThat(c.process(other, 0, 5, out, false) & SignalFaults.FLAT_LINE).isNotZero();
        assertThat(c.process(new float[] {4f, 4f, 4f, 4f, 4.001f}, 0, 5, out, false) & SignalFaults.FLAT_LINE).isZero();
    }

    @Test
    void invalidSettingsAreRefused() {
        assertThatThrownBy(() -> new Conditioner(WATCHFUL, 0)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> new Conditioner(WATCHFUL.withLowPass(500), 1000)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> new PulseDetector(40, 41, 5, 1000, (a, b, c, d, e) -> { }))
                .isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void detectorStartsAtTheCountLevelAndReleasesBelowTheReleaseLevel() {
        RecordingPulses rec = new RecordingPulses();
        PulseDetector d = new PulseDetector(40, 20, 3, 1000, rec); // dead time 3 samples
        d.process(new float[] {39.99f, 40f, 20f, 20f, 20f, 19.99f, 0f}, 0, 7, 0);
        assertThat(rec.pulses).hasSize(1);
        RecordingPulses.Pulse p = rec.pulses.get(0);
        assertThat(p.startNs()).isEqualTo(1_000_000L);
        assertThat(p.peakNm()).isEqualTo(40.0);
        // above the release level from sample 1 to 4: width 4 ms; impulse (40 + 3·20) · 1 ms
        assertThat(p.widthMs()).isEqualTo(4.0);
        assertThat(p.impulseNms()).isEqualTo(0.1, org.assertj.core.api.Assertions.within(1e-9));
        assertThat(d.inPulse()).isFalse();
        assertThat(d.sampleIndex()).isEqualTo(7);
    }

    @Test
    void detectorHoldsTheBlowOpenForTheWholeDeadTime() {
        RecordingPulses rec = new RecordingPulses();
        PulseDetector d = new PulseDetector(40, 20, 4, 1000, rec); // dead time 4 samples
        d.process(new float[] {50f, 0f, 0f, 45f}, 0, 4, 0);
        assertThat(d.inPulse()).isTrue();
        d.process(new float[] {0f, 0f}, 0, 2, 4_000_000L);
        assertThat(rec.pulses).hasSize(1);
        assertThat(rec.pulses.get(0).peakNm()).isEqualTo(50.0);
        // the main lobe ended at sample 1: width 1 ms; the hump at sample 3 adds to the impulse
        assertThat(rec.pulses.get(0).widthMs()).isEqualTo(1.0);
        assertThat(rec.pulses.get(0).impulseNms()).isEqualTo(0.095, org.assertj.core.api.Assertions.within(1e-9));
        d.process(new float[] {41f}, 0, 1, 6_000_000L);
        assertThat(d.inPulse()).isTrue();
        d.flush();
        assertThat(rec.pulses).hasSize(2);
        assertThat(rec.pulses.get(1).widthMs()).isEqualTo(1.0);
        d.process(new float[] {41f}, 0, 1, 7_000_000L);
        d.reset();
        assertThat(d.inPulse()).isFalse();
        d.flush();
        assertThat(rec.pulses).hasSize(2);
    }

    @Test
    void faultNamesListTheSetBits() {
        assertThat(SignalFaults.names(0)).isEmpty();
        assertThat(SignalFaults.names(SignalFaults.OVER_RANGE | SignalFaults.NOT_FINITE)).containsExactly("OVER_RANGE", "NOT_FINITE");
        assertThat(SignalFaults.names(SignalFaults.FLAT_LINE | SignalFaults.ZERO_DRIFT)).containsExactly("FLAT_LINE", "ZERO_DRIFT");
    }

    @Test
    void calibrationAcceptsEightToThirtyTwoBits() {
        assertThat(new Calibration(2, 500, 1, 5, 5, 8).maxCount()).isEqualTo(127);
        assertThat(new Calibration(2, 500, 1, 5, 5, 32).maxCount()).isEqualTo(Integer.MAX_VALUE);
        assertThatThrownBy(() -> new Calibration(2, 500, 1, 5, 5, 7)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> new Calibration(2, 500, 1, 5, 5, 33)).isInstanceOf(IllegalArgumentException.class);
        for (double[] bad : new double[][] {{2, 0, 1, 5, 5}, {2, 500, 0, 5, 5}, {2, 500, 1, 0, 5}, {2, 500, 1, 5, 0}, {Double.NaN, 500, 1, 5, 5}}) {
            assertThatThrownBy(() -> new Calibration(bad[0], bad[1], bad[2], bad[3], bad[4], 24))
                    .isInstanceOf(IllegalArgumentException.class);
        }
    }
}
