package hammerstep.signal;

import hammerstep.signal.PulseTrain.Strike;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class PulseDetectorTest {

    private static final double RATE = 50_000;
    private static final double DEAD_MS = 7.5;

    private static RecordingPulses detect(float[] x, int block) {
        RecordingPulses rec = new RecordingPulses();
        PulseDetector d = new PulseDetector(40, 20, DEAD_MS, RATE, rec);
        for (int off = 0; off < x.length; off += block) {
            int n = Math.min(block, x.length - off);
            d.process(x, off, n, (long) (off * 1e9 / RATE));
        }
        d.flush();
        return rec;
    }

    @Test
    @DisplayName("half-sine strike of known peak: one blow, peak within sampling error, width and impulse of the half-sine (analytic: ∫ P·sin(πt/w) dt = 2Pw/π)")
    void measuresAHalfSineStrike() {
        List<Strike> s = List.of(new Strike(0.010, 0.002, 150, 0, 0, 0));
        float[] x = PulseTrain.render(RATE, 0.05, s, 0, 0, 1);
        RecordingPulses rec = detect(x, 512);
        assertThat(rec.pulses).hasSize(1);
        RecordingPulses.Pulse p = rec.pulses.get(0);
        assertThat(p.peakNm()).isCloseTo(150, within(0.05));
        assertThat(p.peakNs() * 1e-9).isCloseTo(0.011, within(1.0 / RATE));
        // above 40 N·m from asin(40/150)/π·w to the fall below 20 N·m at (1 − asin(20/150)/π)·w
        double widthMs = 2.0 * (1 - Math.asin(20.0 / 150) / Math.PI - Math.asin(40.0 / 150) / Math.PI);
        assertThat(p.widthMs()).isCloseTo(widthMs, within(2 * 1000 / RATE));
        // the detector integrates samples at or above the release level: nearly the whole lobe
        double lobe = 2 * 150 * 0.002 / Math.PI;
        assertThat(p.impulseNms()).isCloseTo(lobe, within(lobe * 0.03));
    }

    @Test
    void reboundHumpAndRingingOfOneStrikeCountOnce() {
        List<Strike> s = List.of(new Strike(0.010, 0.0025, 120, 0.5, 0.6, 0.3),
                new Strike(0.040, 0.001, 200, 0.4, 0.5, 0.3));
        float[] clean = PulseTrain.render(RATE, 0.08, s, 0, 0, 1);
        RecordingPulses rec = detect(clean, 256);
        assertThat(rec.pulses).hasSize(2);
        double[] truth = PulseTrain.truePeaks(RATE, clean, 0, s);
        assertThat(rec.pulses.get(0).peakNm()).isCloseTo(truth[0], within(1e-4));
        assertThat(rec.pulses.get(1).peakNm()).isCloseTo(truth[1], within(1e-4));
    }

    @Test
    void hysteresisKeepsNoiseAtTheThresholdFromSplittingABlow() {
        // a lobe that sits at the count level with noise dithering across it counts once
        float[] x = new float[5000];
        java.util.Random r = new java.util.Random(3);
        for (int i = 1000; i < 1400; i++) {
            x[i] = (float) (41 + 3 * r.nextGaussian());
        }
        assertThat(detect(x, 128).pulses).hasSize(1);
    }

    @Test
    void aSecondStrikeAfterTheDeadTimeIsANewBlow() {
        // 4000 blows/min: 15 ms apart, twice the dead time
        List<Strike> s = List.of(new Strike(0.010, 0.002, 100, 0, 0, 0), new Strike(0.025, 0.002, 100, 0, 0, 0));
        assertThat(detect(PulseTrain.render(RATE, 0.05, s, 0, 0, 1), 100).pulses).hasSize(2);
    }

    @Test
    void aBlowSpanningBlocksIsMeasuredWhole() {
        List<Strike> s = List.of(new Strike(0.0100, 0.003, 180, 0.3, 0.3, 0.2));
        float[] x = PulseTrain.render(RATE, 0.03, s, 0, 0, 1);
        RecordingPulses one = detect(x, x.length);
        RecordingPulses many = detect(x, 7);
        assertThat(many.pulses).isEqualTo(one.pulses);
    }

    @Test
    void pulsesBelowTheCountLevelAreNotBlows() {
        List<Strike> s = List.of(new Strike(0.010, 0.002, 39.9, 0, 0, 0));
        assertThat(detect(PulseTrain.render(RATE, 0.03, s, 0, 0, 1), 512).pulses).isEmpty();
    }
}
