package hammerstep.joint;

import hammerstep.signal.Conditioning;
import hammerstep.signal.PulseTrain;
import hammerstep.signal.PulseTrain.Strike;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/** The split replay must give exactly what one monitor gives over the whole trace. */
class SplitReplayTest {

    private static final double RATE = 5_000;
    private static final int BLOCK = 1024;
    private static final JointProgram PROGRAM = Programs.hubFinal();

    /** A shift of rundowns every few seconds on a noisy, offset, slowly drifting zero. */
    private static float[] shift(long seed, double durationS, double offsetNm, double noiseNm) {
        Random r = new Random(seed);
        List<Strike> strikes = new ArrayList<>();
        for (double t = 1.0; t < durationS - 5; t += 3.0 + 4.0 * r.nextDouble()) {
            List<Strike> rundown = PulseTrain.randomRundown(r, t, 4 + r.nextInt(12), 60, 215, 900, 2200);
            strikes.addAll(rundown);
            t = rundown.get(rundown.size() - 1).startS();
        }
        float[] x = PulseTrain.render(RATE, durationS, strikes, offsetNm, noiseNm, seed);
        for (int i = 0; i < x.length; i++) {
            x[i] += (float) (0.2 * Math.sin(2 * Math.PI * i / RATE / 97.0)); // zero drifting with the temperature
        }
        return x;
    }

    private static List<JointResult> single(float[] x, Conditioning c) {
        List<JointResult> results = new ArrayList<>();
        JointMonitor m = new JointMonitor(PROGRAM, c, RATE, BLOCK, results::add);
        float[] block = new float[BLOCK];
        for (int s = 0; s < x.length; s += BLOCK) {
            int k = Math.min(BLOCK, x.length - s);
            System.arraycopy(x, s, block, 0, k);
            m.onSamples(block, 0, k, (long) (s * (1e9 / RATE)));
        }
        m.finish();
        return results;
    }

    private static SplitReplay.Outcome split(float[] x, Conditioning c, int workers, double primeS, double handoverS)
            throws InterruptedException {
        SplitReplay replay = new SplitReplay(PROGRAM, c, RATE, BLOCK, primeS, handoverS);
        return replay.run((from, into, length) -> System.arraycopy(x, (int) from, into, 0, length), x.length, workers);
    }

    private static void assertSame(List<JointResult> actual, List<JointResult> expected) {
        assertThat(expected).hasSizeGreaterThan(20);
        assertThat(actual).hasSameSizeAs(expected);
        for (int i = 0; i < expected.size(); i++) {
            assertThat(actual.get(i)).as("rundown %d", i).usingRecursiveComparison().isEqualTo(expected.get(i));
        }
    }

    @ParameterizedTest(name = "{0} workers")
    @ValueSource(ints = {2, 3, 4})
    @DisplayName("noisy drifting zero: every segment handed over, results identical to one monitor")
    void noisyShift(int workers) throws InterruptedException {
        float[] x = shift(11 + workers, 400, 0.6, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, workers, SplitReplay.PRIME_S, SplitReplay.HANDOVER_S);
        assertSame(out.results(), single(x, c));
        assertThat(out.handovers()).isEqualTo(workers - 1);
        assertThat(out.fallbacks()).isZero();
    }

    @Test
    @DisplayName("with the low-pass filter and the flat-line check on, results stay identical")
    void filtered() throws InterruptedException {
        float[] x = shift(5, 400, -0.4, 0.1);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM).withLowPass(800).withFlatLine(50);
        SplitReplay.Outcome out = split(x, c, 2, SplitReplay.PRIME_S, SplitReplay.HANDOVER_S);
        assertSame(out.results(), single(x, c));
        assertThat(out.handovers()).isEqualTo(1);
    }

    @Test
    @DisplayName("a priming too short for the zero to agree: the first worker carries on alone, results identical")
    void fallsBackWhenStatesNeverAgree() throws InterruptedException {
        float[] x = shift(7, 200, 0.8, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, 2, 0.5, 2.0);
        assertThat(out.fallbacks()).isEqualTo(1);
        assertSame(out.results(), single(x, c));
    }

    @Test
    @DisplayName("zero past its limit (ZERO_DRIFT) in every segment: results identical")
    void zeroAtLimit() throws InterruptedException {
        float[] x = shift(9, 300, 3.5, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, 3, SplitReplay.PRIME_S, SplitReplay.HANDOVER_S);
        assertSame(out.results(), single(x, c));
        assertThat(out.handovers()).isEqualTo(2);
    }

    @Test
    @DisplayName("one worker is the plain monitor")
    void oneWorker() throws InterruptedException {
        float[] x = shift(3, 150, 0.2, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, 1, SplitReplay.PRIME_S, SplitReplay.HANDOVER_S);
        assertSame(out.results(), single(x, c));
        assertThat(out.workers()).isEqualTo(1);
    }

    @Test
    @DisplayName("segments shorter than four overlaps are not worth a worker")
    void workersFor() {
        SplitReplay replay = new SplitReplay(PROGRAM, JointMonitor.replayConditioning(PROGRAM), 50_000, 4096);
        long overlap = (long) ((SplitReplay.PRIME_S + SplitReplay.HANDOVER_S) * 50_000);
        assertThat(replay.workersFor(overlap, 2)).isEqualTo(1);
        assertThat(replay.workersFor(9 * overlap, 2)).isEqualTo(2);
        assertThat(replay.workersFor(50_000_000, 8)).isEqualTo(4);
    }
}
