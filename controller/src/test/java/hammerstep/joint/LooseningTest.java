package hammerstep.joint;

import hammerstep.signal.Conditioning;
import hammerstep.signal.PulseTrain;
import hammerstep.signal.PulseTrain.Strike;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * Loosening: the tool in reverse strikes the other way. Strike shapes are our own (analytic
 * {@link PulseTrain} lobes); their widths follow common practice (strike pulses last about 1 to 5 ms:
 * transducer practice, memory). Each test names its magnitudes. Tolerance as for every peak: within
 * max(4 %, 10 N·m) of the truth.
 */
class LooseningTest {

    /** The window the case fell into: six reverse strikes of 400 N·m were judged GO at 134 N·m. */
    private static final JointProgram WINDOW = new JointProgram("reverse-case", "", new JointProgram.Torque(120, 135, 150),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 2, 10, 7.5), new JointProgram.Rundown(10, 200, 5000),
            Double.NaN, 0);

    /** Like the demo's final pass: 270 to 320 N·m, blows above 100 N·m, rundown ends after 150 ms quiet. */
    private static final JointProgram FINAL = new JointProgram("final-like", "", new JointProgram.Torque(270, 285, 320),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(100, 50, 2, 40, 7.5), new JointProgram.Rundown(15, 150, 4000),
            Double.NaN, 0);

    /** Cam-and-ball shape: a 2.5 ms strike, rebound lobe 35 %, re-contact hump 25 %, light ringing 10 %. */
    private static Strike cam(double startS, double peakNm) {
        return new Strike(startS, 0.0025, peakNm, 0.35, 0.25, 0.10);
    }

    /** Twin-hammer shape: a 1.2 ms strike, rebound lobe 45 %, small hump 10 %, strong ringing 30 %. */
    private static Strike twin(double startS, double peakNm) {
        return new Strike(startS, 0.0012, peakNm, 0.45, 0.10, 0.30);
    }

    private static List<JointResult> replay(JointProgram p, double rate, float[] x) {
        return replay(p, JointMonitor.replayConditioning(p), rate, x);
    }

    private static List<JointResult> replay(JointProgram p, Conditioning c, double rate, float[] x) {
        RecordingJointEvents events = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(p, c, rate, 1024, events);
        for (int i = 0; i < x.length; i += 1024) {
            int n = Math.min(1024, x.length - i);
            m.onSamples(x, i, n, (long) (i * 1e9 / rate));
        }
        m.finish();
        return events.results;
    }

    /** The lowest clean sample within each strike's span: the true (negative) peak of a reverse strike. */
    private static double[] trueLows(double rate, float[] clean, List<Strike> strikes) {
        double[] lows = new double[strikes.size()];
        for (int k = 0; k < lows.length; k++) {
            Strike s = strikes.get(k);
            int from = (int) Math.floor(s.startS() * rate);
            int to = Math.min(clean.length, (int) Math.ceil((s.startS() + s.spanS()) * rate) + 1);
            double min = Double.POSITIVE_INFINITY;
            for (int i = from; i < to; i++) {
                min = Math.min(min, clean[i]);
            }
            lows[k] = min;
        }
        return lows;
    }

    private static void assertPeaks(double[] measured, double[] truth) {
        assertThat(measured).hasSameSizeAs(truth);
        for (int k = 0; k < truth.length; k++) {
            double tol = Math.max(0.04 * Math.abs(truth[k]), 10.0);
            assertThat(measured[k]).as("peak %d", k).isCloseTo(truth[k], within(tol));
        }
    }

    private static void assertLoosening(JointResult r, int strikes) {
        assertThat(r.direction()).isEqualTo(Direction.LOOSEN);
        assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
        assertThat(r.reasons()).containsExactly(Reason.LOOSENED);
        assertThat(r.blows()).isEqualTo(strikes);
        assertThat(r.finalTorqueNm()).isNegative();
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void sixReverseCamStrikesOf400NmWithReboundLobesAreOneLoosening(double rate) {
        List<Strike> strikes = new ArrayList<>();
        for (int b = 0; b < 6; b++) {
            strikes.add(cam(0.1 + 0.035 * b, -400));
        }
        float[] clean = PulseTrain.render(rate, 0.6, strikes, 0, 0, 1);
        List<JointResult> results = replay(WINDOW, rate, PulseTrain.render(rate, 0.6, strikes, 0, 1.0, 2));
        assertThat(results).hasSize(1);
        assertLoosening(results.get(0), 6);
        double[] truth = trueLows(rate, clean, strikes);
        assertPeaks(results.get(0).peaksNm(), truth);
        double strongest = java.util.Arrays.stream(truth).min().orElseThrow();
        assertThat(results.get(0).finalTorqueNm()).isCloseTo(strongest, within(0.04 * -strongest));
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void reverseTwinHammerStrikesWithRingingAreOneLoosening(double rate) {
        List<Strike> strikes = new ArrayList<>();
        for (int b = 0; b < 9; b++) {
            strikes.add(twin(0.1 + 0.030 * b, -(250 + 15 * b)));
        }
        float[] clean = PulseTrain.render(rate, 0.7, strikes, 0, 0, 1);
        List<JointResult> results = replay(WINDOW, rate, PulseTrain.render(rate, 0.7, strikes, 0, 1.5, 3));
        assertThat(results).hasSize(1);
        assertLoosening(results.get(0), 9);
        assertPeaks(results.get(0).peaksNm(), trueLows(rate, clean, strikes));
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void oneBreakawayStrikeAloneIsALoosening(double rate) {
        // a strong tool breaks a bolt loose with its first reverse strike; then the nut spins free
        List<Strike> strikes = List.of(cam(0.1, -330));
        List<JointResult> results = replay(WINDOW, rate, PulseTrain.render(rate, 0.5, strikes, 0, 1.0, 4));
        assertThat(results).hasSize(1);
        assertLoosening(results.get(0), 1);
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void aTighteningBlowThenReverseStrikesInOneRundownIsALoosening(double rate) {
        List<Strike> strikes = new ArrayList<>();
        strikes.add(cam(0.1, 140));
        for (int b = 0; b < 5; b++) {
            strikes.add(cam(0.16 + 0.035 * b, -380));
        }
        List<JointResult> results = replay(WINDOW, rate, PulseTrain.render(rate, 0.7, strikes, 0, 1.0, 5));
        assertThat(results).hasSize(1);
        assertLoosening(results.get(0), 5);
    }

    /**
     * Demo-like: a tightening whose tool, stopping, throws its hammer back against the jaw behind it:
     * a reverse contact of -195 to -223 N·m about 45 ms after the last blow (as in the demo's traces).
     * It carries far less impulse than the blows: the rundown stays a tightening, GO, its blows intact.
     */
    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void theBackStrikeAfterTheLastBlowLeavesATighteningGo(double rate) {
        for (int seed = 0; seed < 6; seed++) {
            List<Strike> strikes = new ArrayList<>();
            double t = 0.1;
            for (int b = 0; b < 8; b++) {
                strikes.add(cam(t, 150 + 20 * b));
                t += 0.032;
            }
            double last = t - 0.032;
            double back = -(195 + 28 * seed / 5.0);
            strikes.add(new Strike(last + 0.040 + 0.002 * seed, 0.0015, back, 0.3, 0.0, 0.1));
            float[] x = PulseTrain.render(rate, 0.8, strikes, 0, 1.0, 10 + seed);
            double[] truth = PulseTrain.truePeaks(rate, PulseTrain.render(rate, 0.8, strikes, 0, 0, 1), 0,
                    strikes.subList(0, 8));
            List<JointResult> results = replay(FINAL, rate, x);
            assertThat(results).as("back strike %.0f N·m", back).hasSize(1);
            JointResult r = results.get(0);
            assertThat(r.direction()).isEqualTo(Direction.TIGHTEN);
            assertThat(r.verdict()).isEqualTo(Verdict.GO);
            assertThat(r.blows()).isEqualTo(8);
            assertPeaks(r.peaksNm(), truth);
        }
    }

    /** A snug pass: one blow cut at the shut-off, then the tool's back contact, stronger than that blow. */
    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void theBackStrikeAfterASingleSnugBlowLeavesATightening(double rate) {
        JointProgram snug = new JointProgram("snug-like", "", new JointProgram.Torque(120, 200, 320),
                FinalTorque.MAX_PEAK, new JointProgram.Blows(100, 50, 1, 8, 7.5), new JointProgram.Rundown(15, 150, 3000),
                Double.NaN, 0);
        for (int seed = 0; seed < 4; seed++) {
            double back = -(195 + 9 * seed);
            List<Strike> strikes = List.of(new Strike(0.1, 0.0012, 160, 0.3, 0.1, 0.1),
                    new Strike(0.1 + 0.040 + 0.003 * seed, 0.0025, back, 0.3, 0.0, 0.1));
            List<JointResult> results = replay(snug, rate, PulseTrain.render(rate, 0.5, strikes, 0, 1.0, 20 + seed));
            assertThat(results).as("back contact %.0f N·m", back).hasSize(1);
            assertThat(results.get(0).direction()).isEqualTo(Direction.TIGHTEN);
            assertThat(results.get(0).blows()).isEqualTo(1);
            assertThat(results.get(0).verdict()).isEqualTo(Verdict.GO);
        }
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void negativeSpikesOfOneSampleAreNoReverseStrikes(double rate) {
        List<Strike> strikes = new ArrayList<>();
        for (int b = 0; b < 8; b++) {
            strikes.add(cam(0.1 + 0.032 * b, 150 + 20 * b));
        }
        float[] x = PulseTrain.render(rate, 0.8, strikes, 0, 1.0, 7);
        // -350 N·m single-sample spikes between the blows, more of them than blows
        for (int b = 0; b < 9; b++) {
            x[(int) ((0.1 + 0.032 * b + 0.02) * rate)] = -350f;
        }
        List<JointResult> results = replay(FINAL, rate, x);
        assertThat(results).hasSize(1);
        assertThat(results.get(0).direction()).isEqualTo(Direction.TIGHTEN);
        assertThat(results.get(0).blows()).isEqualTo(8);
        assertThat(results.get(0).verdict()).isEqualTo(Verdict.GO);
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void reverseStrikesTooNarrowForAStrikeAreNeverGoNorALoosening(double rate) {
        // six -400 N·m single-sample spikes alone: the impulse rejection removes them, so no rundown
        float[] x = new float[(int) (0.5 * rate)];
        for (int b = 0; b < 6; b++) {
            x[(int) ((0.1 + 0.03 * b) * rate)] = -400f;
        }
        assertThat(replay(WINDOW, rate, x)).isEmpty();
        // with the rejection off they reach the monitor: no strike in either sense, so NO-GO (no blows)
        List<JointResult> results = replay(WINDOW, JointMonitor.replayConditioning(WINDOW).withImpulse(0), rate, x);
        assertThat(results).isNotEmpty().allSatisfy(r -> {
            assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(r.direction()).isEqualTo(Direction.TIGHTEN);
        });
    }

    private static JointProgram leftHand(JointProgram p) {
        return new JointProgram(p.id(), p.revision(), p.torque(), p.finalTorque(), p.blows(), p.rundown(),
                p.shutoffAtNm(), p.rehitBlows(), true);
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void aLeftHandThreadTightensWithNegativeStrikes(double rate) {
        List<Strike> strikes = new ArrayList<>();
        for (int b = 0; b < 8; b++) {
            strikes.add(cam(0.1 + 0.032 * b, -(150 + 20 * b)));
        }
        float[] clean = PulseTrain.render(rate, 0.8, strikes, 0, 0, 1);
        List<JointResult> results = replay(leftHand(FINAL), rate, PulseTrain.render(rate, 0.8, strikes, 0, 1.0, 8));
        assertThat(results).hasSize(1);
        JointResult r = results.get(0);
        assertThat(r.direction()).isEqualTo(Direction.TIGHTEN);
        assertThat(r.verdict()).isEqualTo(Verdict.GO);
        assertThat(r.blows()).isEqualTo(8);
        double[] truth = trueLows(rate, clean, strikes);
        for (int k = 0; k < truth.length; k++) {
            truth[k] = -truth[k];
        }
        assertPeaks(r.peaksNm(), truth);
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void aLeftHandThreadLoosensWithPositiveStrikes(double rate) {
        List<Strike> strikes = new ArrayList<>();
        for (int b = 0; b < 6; b++) {
            strikes.add(twin(0.1 + 0.03 * b, 400));
        }
        float[] clean = PulseTrain.render(rate, 0.6, strikes, 0, 0, 1);
        List<JointResult> results = replay(leftHand(WINDOW), rate, PulseTrain.render(rate, 0.6, strikes, 0, 1.0, 9));
        assertThat(results).hasSize(1);
        assertLoosening(results.get(0), 6);
        // in the program's sense: the reverse strikes' peaks come out negative
        double[] truth = PulseTrain.truePeaks(rate, clean, 0, strikes);
        for (int k = 0; k < truth.length; k++) {
            truth[k] = -truth[k];
        }
        assertPeaks(results.get(0).peaksNm(), truth);
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void aLeftHandProgramCutsTheToolAtItsShutoffInTheTighteningSense(double rate) {
        JointProgram p = new JointProgram("lh", "", new JointProgram.Torque(270, 285, 320), FinalTorque.MAX_PEAK,
                new JointProgram.Blows(100, 50, 2, 40, 7.5), new JointProgram.Rundown(15, 150, 4000), 240, 0, true);
        List<Strike> strikes = new ArrayList<>();
        for (int b = 0; b < 8; b++) {
            strikes.add(cam(0.1 + 0.032 * b, -(150 + 20 * b)));
        }
        RecordingJointEvents events = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(p, JointMonitor.replayConditioning(p), rate, 1 << 20, events);
        float[] x = PulseTrain.render(rate, 0.8, strikes, 0, 0.5, 11);
        m.onSamples(x, 0, x.length, 0);
        m.finish();
        assertThat(events.shutoffs).hasSize(1);
        // strikes of 230 and 250 N·m (the fifth and sixth) straddle the 240 N·m shut-off: crossed in one of them
        assertThat(events.shutoffs.get(0) * 1e-9).isBetween(0.1 + 0.032 * 4, 0.1 + 0.032 * 6);
    }
}
