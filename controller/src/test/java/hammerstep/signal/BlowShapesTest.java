package hammerstep.signal;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class BlowShapesTest {

    private static final double RATE = 50_000;
    private static final double PERIOD_NS = 1e9 / RATE;

    /** Feeds {@code x} in blocks of {@code block}; returns the shapes and the slot of the last lobe. */
    private static BlowShapes feed(float[] x, int block, double countAbove, double floor, float sense) {
        BlowShapes s = new BlowShapes(countAbove, floor, sense, RATE);
        for (int off = 0; off < x.length; off += block) {
            s.process(x, off, Math.min(block, x.length - off), (long) (off * PERIOD_NS));
        }
        s.flush();
        return s;
    }

    /** Time of the first sample at or above {@code level}, as the detector computes it. */
    private static long crossing(float[] x, double level, int block) {
        for (int i = 0; i < x.length; i++) {
            if (Math.abs(x[i]) >= level) {
                int off = i / block * block;
                return (long) (off * PERIOD_NS) + (long) ((i - off) * PERIOD_NS);
            }
        }
        throw new AssertionError("no crossing");
    }

    @Test
    void aHalfSineOnAStuckNutIsElasticWithMeanOverPeakTwoOverPi() {
        // an elastic strike on a torsional spring follows a half-sine (dynamics textbook): mean = 2/π × peak
        float[] x = BlowForms.elastic(400, 100, 10);
        BlowShapes s = feed(x, 512, 40, 1, 1f);
        int slot = s.find(crossing(x, 40, 512));
        assertThat(slot).isNotNegative();
        assertThat(s.kind(slot)).isEqualTo(BlowShapes.Kind.ELASTIC);
        assertThat(s.meanNm(slot) / s.peakNm(slot)).isCloseTo(2 / Math.PI, within(0.01));
        assertThat(s.slipNm(slot)).isNaN();
        // impulse of a half-sine: 2·P·w/π (w its duration)
        assertThat(s.impulseNms(slot)).isCloseTo(2 * 400 * (100 / RATE) / Math.PI, within(0.01 * 400 * 100 / RATE));
        assertThat(s.durationMs(slot)).isCloseTo(2.0, within(0.03));
    }

    @ParameterizedTest
    @ValueSource(ints = {512, 7, 1})
    void aBlowThatTurnsTheNutGivesTheFrictionTorqueItSlidAgainst(int block) {
        // breakaway 240 N·m, slides at 200 N·m for 40 samples (0.8 ms), falls off over 15 samples
        float[] x = BlowForms.turning(240, 200, 12, 40, 15, 10);
        BlowShapes s = feed(x, block, 40, 20, 1f);
        int slot = s.find(crossing(x, 40, block));
        assertThat(s.kind(slot)).isEqualTo(BlowShapes.Kind.TURNING);
        // the rise above the friction torque and the drop from breakaway weigh in a little: within 2 %
        assertThat(s.slipNm(slot)).isCloseTo(200, within(4.0));
        assertThat(s.kneeNm(slot)).isBetween(170.0, 200.0); // the fall starts gently
        assertThat(s.peakNm(slot)).isCloseTo(240, within(0.5));
        // the lobe's plain mean (impulse ÷ duration) reads well below the friction torque
        assertThat(s.meanNm(slot)).isLessThan(190);
    }

    @Test
    void aFallThatSlowsDownIntoTheFloorHasNoKneeAndReadsNoSlide() {
        // 400 N·m, then halving every sample: 200, 100, 50, 25 above the 20 N·m floor. The fall read over the
        // last three samples is (200 − 25) ÷ 3 = 58 N·m per sample; the very last step (25) is less than half
        // of that, so the walk back from the floor stops at once and the "knee" would be the floor sample
        // itself: a slide read from high on the rise down to the floor at a mean of about 240 N·m (the
        // lobe's upper part), ten times the 25 N·m where the nut would have stuck. (Field case: a twin-pin oil-bath tool on a soft joint, a
        // 16-sample lobe read as a slide at 216 N·m against a breakaway audit of 66 N·m.)
        float[] x = BlowForms.snapBack(400, 8, 0.5, 10);
        BlowShapes s = feed(x, 512, 40, 20, 1f);
        int slot = s.find(crossing(x, 40, 512));
        assertThat(slot).isNotNegative();
        assertThat(s.kind(slot)).isEqualTo(BlowShapes.Kind.ELASTIC);
        assertThat(s.slipNm(slot)).isNaN();
        assertThat(s.kneeNm(slot)).isNaN();
        assertThat(s.peakNm(slot)).isCloseTo(400, within(0.5));
    }

    @Test
    void aLeftHandBlowReadsAsARightHandOne() {
        float[] x = BlowForms.negated(BlowForms.turning(240, 200, 12, 40, 15, 10));
        BlowShapes s = feed(x, 64, 40, 20, -1f);
        int slot = s.find(crossing(x, 40, 64));
        assertThat(s.kind(slot)).isEqualTo(BlowShapes.Kind.TURNING);
        assertThat(s.slipNm(slot)).isCloseTo(200, within(4.0));
    }

    @Test
    void anOilPulseWithItsDecayingTailIsHydraulic() {
        float[] x = BlowForms.hydraulic(220, 30, 15, 10);
        BlowShapes s = feed(x, 512, 40, 20, 1f);
        int slot = s.find(crossing(x, 40, 512));
        assertThat(s.kind(slot)).isEqualTo(BlowShapes.Kind.HYDRAULIC);
    }

    @Test
    void aLobeTooShortOrTooLongHasNoShapeButKeepsItsPeakAndImpulse() {
        float[] spike = BlowForms.elastic(100, 5, 3);
        BlowShapes s = feed(spike, 512, 40, 20, 1f);
        int slot = s.find(crossing(spike, 40, 512));
        assertThat(s.kind(slot)).isEqualTo(BlowShapes.Kind.UNKNOWN);
        assertThat(s.peakNm(slot)).isGreaterThan(90);

        float[] longLobe = BlowForms.elastic(100, BlowShapes.MAX_LOBE + 1000, 3);
        BlowShapes l = feed(longLobe, 1000, 40, 20, 1f);
        int k = l.find(crossing(longLobe, 40, 1000));
        assertThat(l.kind(k)).isEqualTo(BlowShapes.Kind.UNKNOWN);
        assertThat(l.impulseNms(k)).isGreaterThan(0.5 * 2 * 100 * (BlowShapes.MAX_LOBE / RATE) / Math.PI);
    }

    @Test
    void aLobeThatNeverReachesTheCountLevelIsNoBlowAndNothingIsFoundForAnUnknownTime() {
        float[] x = BlowForms.elastic(35, 80, 5);
        BlowShapes s = feed(x, 512, 40, 20, 1f);
        assertThat(s.find(0)).isEqualTo(-1);
        assertThat(s.find(123_456_789L)).isEqualTo(-1);
    }

    @Test
    void resetForgetsTheLobesOfTheRundownBefore() {
        float[] x = BlowForms.elastic(400, 100, 10);
        BlowShapes s = feed(x, 512, 40, 20, 1f);
        long t = crossing(x, 40, 512);
        assertThat(s.find(t)).isNotNegative();
        s.reset();
        assertThat(s.find(t)).isEqualTo(-1);
    }
}
