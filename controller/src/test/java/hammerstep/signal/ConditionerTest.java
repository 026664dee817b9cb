package hammerstep.signal;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.util.Arrays;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class ConditionerTest {

    private static final double RATE = 50_000;
    private static final int BLOCK = 500;

    private static Conditioning settings() {
        return new Conditioning(5.0, 2.0, 1000.0, 600.0, 50.0, 0.0);
    }

    private static float[] noise(double offset, double sd, long seed) {
        Random r = new Random(seed);
        float[] x = new float[BLOCK];
        for (int i = 0; i < BLOCK; i++) {
            x[i] = (float) (offset + sd * r.nextGaussian());
        }
        return x;
    }

    @Test
    void firstQuietBlockSetsTheZeroAndLaterOnesFollowSlowly() {
        Conditioner c = new Conditioner(settings(), RATE);
        float[] out = new float[BLOCK];
        c.process(noise(1.2, 0.05, 1), 0, BLOCK, out, true);
        assertThat(c.zeroNm()).isCloseTo(1.2, within(0.01));
        // a step of the offset to 1.5: one 10 ms block moves the zero by 1 − e^(−10/1000) ≈ 1 %
        c.process(noise(1.5, 0.0, 2), 0, BLOCK, out, true);
        assertThat(c.zeroNm()).isCloseTo(1.2 + 0.3 * (1 - Math.exp(-0.01)), within(0.002));
        assertThat(c.faults()).isZero();
    }

    @Test
    void zeroIsFrozenWhileARundownIsUnderWay() {
        Conditioner c = new Conditioner(settings(), RATE);
        float[] out = new float[BLOCK];
        c.process(noise(0.5, 0.05, 1), 0, BLOCK, out, true);
        double before = c.zeroNm();
        c.process(noise(1.9, 0.05, 2), 0, BLOCK, out, false);
        assertThat(c.zeroNm()).isEqualTo(before);
        assertThat((double) out[0]).isCloseTo(1.4, within(0.3));
    }

    @Test
    void offsetBeyondTheLimitIsReportedNotAbsorbed() {
        Conditioner c = new Conditioner(settings(), RATE);
        float[] out = new float[BLOCK];
        int faults = c.process(noise(3.5, 0.05, 1), 0, BLOCK, out, true);
        assertThat(faults & SignalFaults.ZERO_DRIFT).isNotZero();
        assertThat(c.zeroNm()).isEqualTo(2.0);
        // the zero applies from the next block on; the remainder past the limit stays visible
        faults = c.process(noise(3.5, 0.05, 2), 0, BLOCK, out, true);
        assertThat(faults & SignalFaults.ZERO_DRIFT).isNotZero();
        assertThat((double) out[10]).isCloseTo(1.5, within(0.3));
    }

    @Test
    void zeroDriftClearsWhenTheOffsetComesBack() {
        Conditioner c = new Conditioner(settings().withFlatLine(0), RATE);
        float[] out = new float[BLOCK];
        c.process(noise(3.5, 0.05, 1), 0, BLOCK, out, true);
        int faults = 0;
        for (int k = 0; k < 500; k++) {
            faults = c.process(noise(0.2, 0.05, k), 0, BLOCK, out, true);
        }
        assertThat(faults & SignalFaults.ZERO_DRIFT).isZero();
        assertThat(c.zeroNm()).isCloseTo(0.2, within(0.05));
    }

    @Test
    void constantSignalForTheFlatLineTimeIsAFault() {
        Conditioner c = new Conditioner(settings(), RATE);
        float[] out = new float[BLOCK];
        float[] flat = new float[BLOCK];
        Arrays.fill(flat, 0.37f);
        int faults = 0;
        // 50 ms = 2500 samples = 5 blocks of 500
        for (int k = 0; k < 4; k++) {
            faults = c.process(flat, 0, BLOCK, out, true);
            assertThat(faults & SignalFaults.FLAT_LINE).isZero();
        }
        faults = c.process(flat, 0, BLOCK, out, true);
        assertThat(faults & SignalFaults.FLAT_LINE).isNotZero();
        faults = c.process(noise(0.37, 0.05, 3), 0, BLOCK, out, true);
        assertThat(faults & SignalFaults.FLAT_LINE).isZero();
    }

    @Test
    void overRangeAndNonFiniteSamplesAreFaults() {
        Conditioner c = new Conditioner(settings(), RATE);
        float[] out = new float[BLOCK];
        float[] x = noise(0, 0.05, 1);
        x[100] = 650f;
        assertThat(c.process(x, 0, BLOCK, out, false) & SignalFaults.OVER_RANGE).isNotZero();
        x = noise(0, 0.05, 2);
        x[7] = Float.NaN;
        int faults = c.process(x, 0, BLOCK, out, false);
        assertThat(faults & SignalFaults.NOT_FINITE).isNotZero();
        assertThat(Float.isFinite(out[7])).isTrue();
        assertThat(c.process(noise(0, 0.05, 3), 0, BLOCK, out, false)
                & (SignalFaults.NOT_FINITE | SignalFaults.OVER_RANGE)).isZero();
    }

    @Test
    @DisplayName("2nd-order Butterworth low-pass: gain 1/√(1+(f/fc)^4), 1/√2 at the cut-off (filter design basics, bilinear transform)")
    void lowPassHasTheButterworthResponse() {
        double fc = 2000;
        for (double f : new double[] {200, 2000, 6000}) {
            Conditioner c = new Conditioner(settings().withLowPass(fc).withZeroLimit(0), RATE);
            int n = 50_000;
            float[] x = new float[n];
            for (int i = 0; i < n; i++) {
                x[i] = (float) (10 * Math.sin(2 * Math.PI * f * i / RATE));
            }
            float[] out = new float[n];
            c.process(x, 0, n, out, false);
            double amp = 0;
            for (int i = n / 2; i < n; i++) {
                amp = Math.max(amp, Math.abs(out[i]));
            }
            // the bilinear transform warps frequency: compare with the analog prototype at the warped frequency
            double warped = Math.tan(Math.PI * f / RATE) / Math.tan(Math.PI * fc / RATE);
            double expected = 10 / Math.sqrt(1 + Math.pow(warped, 4));
            assertThat(amp).as("amplitude at %s Hz", f).isCloseTo(expected, within(0.01 * 10));
        }
    }
}
