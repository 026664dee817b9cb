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
import java.util.concurrent.CountDownLatch;

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

    private static SplitReplay.Outcome split(float[] x, Conditioning c, int workers, double primeS, double windowS)
            throws InterruptedException {
        return split(x, c, workers, primeS, windowS, (from, into, length) -> System.arraycopy(x, (int) from, into, 0, length));
    }

    private static SplitReplay.Outcome split(float[] x, Conditioning c, int workers, double primeS, double windowS,
                                             SplitReplay.Samples source) throws InterruptedException {
        return new SplitReplay(PROGRAM, c, RATE, BLOCK, primeS, windowS).run(source, x.length, workers);
    }

    private static void assertSame(List<JointResult> actual, List<JointResult> expected) {
        assertThat(expected).hasSizeGreaterThan(20);
        assertThat(actual).hasSameSizeAs(expected);
        for (int i = 0; i < expected.size(); i++) {
            // Double.compare: a residual estimate without a value holds NaN, equal to itself here
            assertThat(actual.get(i)).as("rundown %d", i).usingRecursiveComparison()
                    .withComparatorForType(Double::compare, Double.class).isEqualTo(expected.get(i));
        }
    }

    @ParameterizedTest(name = "{0} workers")
    @ValueSource(ints = {2, 3, 4})
    @DisplayName("noisy drifting zero: every segment handed over, results identical to one monitor")
    void noisyShift(int workers) throws InterruptedException {
        float[] x = shift(11 + workers, 400, 0.6, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, workers, SplitReplay.PRIME_S, SplitReplay.WINDOW_S);
        assertSame(out.results(), single(x, c));
        assertThat(out.handovers()).isEqualTo(workers - 1);
    }

    @Test
    @DisplayName("with the low-pass filter and the flat-line check on, results stay identical")
    void filtered() throws InterruptedException {
        float[] x = shift(5, 400, -0.4, 0.1);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM).withLowPass(800).withFlatLine(50);
        SplitReplay.Outcome out = split(x, c, 2, SplitReplay.PRIME_S, SplitReplay.WINDOW_S);
        assertSame(out.results(), single(x, c));
        assertThat(out.handovers()).isEqualTo(1);
    }

    @Test
    @DisplayName("no priming: the first worker runs on into the second segment until the zeros agree, results identical")
    void runsOnUntilTheStatesAgree() throws InterruptedException {
        float[] x = shift(7, 300, 0.8, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, 2, 0, SplitReplay.WINDOW_S);
        assertThat(out.handovers()).isEqualTo(1);
        assertThat(out.samplesPastSegments()).isPositive();
        assertSame(out.results(), single(x, c));
    }

    @Test
    @DisplayName("states never agree within the window: the first worker carries on to the end alone, results identical")
    void carriesOnAloneWhenStatesNeverAgree() throws InterruptedException {
        float[] x = shift(7, 200, 0.8, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, 2, 0, 1.0);
        assertThat(out.handovers()).isZero();
        assertThat(out.samplesPastSegments()).isEqualTo(x.length - x.length / 2 / BLOCK * BLOCK);
        assertSame(out.results(), single(x, c));
    }

    @Test
    @DisplayName("a first worker that reaches the next segment before its states are noted waits for them")
    void waitsForTheLaterWorker() throws InterruptedException {
        float[] x = shift(13, 300, 0.5, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        long cut = x.length / 2 / BLOCK * BLOCK;
        CountDownLatch firstWorkerThere = new CountDownLatch(1);
        // the second worker may not read anything until the first has finished its own segment
        SplitReplay.Samples source = (from, into, length) -> {
            if (from >= cut) {
                firstWorkerThere.countDown();
            }
            if (Thread.currentThread().getName().equals("replay-segment")) {
                try {
                    firstWorkerThere.await();
                } catch (InterruptedException e) {
                    throw new IllegalStateException(e);
                }
            }
            System.arraycopy(x, (int) from, into, 0, length);
        };
        SplitReplay.Outcome out = split(x, c, 2, 0, SplitReplay.WINDOW_S, source);
        assertThat(out.handovers()).isEqualTo(1);
        assertSame(out.results(), single(x, c));
    }

    @Test
    @DisplayName("zero past its limit (ZERO_DRIFT) in every segment: results identical")
    void zeroAtLimit() throws InterruptedException {
        float[] x = shift(9, 300, 3.5, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, 3, SplitReplay.PRIME_S, SplitReplay.WINDOW_S);
        assertSame(out.results(), single(x, c));
        assertThat(out.handovers()).isEqualTo(2);
    }

    @Test
    @DisplayName("one worker is the plain monitor")
    void oneWorker() throws InterruptedException {
        float[] x = shift(3, 150, 0.2, 0.05);
        Conditioning c = JointMonitor.replayConditioning(PROGRAM);
        SplitReplay.Outcome out = split(x, c, 1, SplitReplay.PRIME_S, SplitReplay.WINDOW_S);
        assertSame(out.results(), single(x, c));
        assertThat(out.workers()).isEqualTo(1);
    }

    @Test
    @DisplayName("segments shorter than eight primings are not worth a worker")
    void workersFor() {
        SplitReplay replay = new SplitReplay(PROGRAM, JointMonitor.replayConditioning(PROGRAM), 50_000, 4096);
        long prime = (long) (SplitReplay.PRIME_S * 50_000);
        assertThat(replay.workersFor(8 * prime, 2)).isEqualTo(1);
        assertThat(replay.workersFor(17 * prime, 2)).isEqualTo(2);
        assertThat(replay.workersFor(80 * prime, 8)).isEqualTo(8);
        assertThat(replay.workersFor(41 * prime, 8)).isEqualTo(5);
    }
}
