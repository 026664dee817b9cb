package hammerstep.joint;

import hammerstep.signal.Conditioning;
import hammerstep.signal.PulseTrain;
import hammerstep.signal.PulseTrain.Strike;
import hammerstep.signal.SignalFaults;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class JointMonitorTest {

    private static final double RATE = 50_000;

    /** Strikes every 27 ms (about 2200 per minute) with peaks given in order. */
    private static List<Strike> strikes(double startS, double... peaks) {
        List<Strike> s = new ArrayList<>();
        for (int i = 0; i < peaks.length; i++) {
            s.add(new Strike(startS + i * 0.027, 0.002, peaks[i], 0.3, 0.2, 0));
        }
        return s;
    }

    private static double[] ramp(double from, double to, int n) {
        double[] p = new double[n];
        for (int i = 0; i < n; i++) {
            p[i] = from + (to - from) * i / Math.max(1, n - 1);
        }
        return p;
    }

    private static RecordingJointEvents run(JointProgram p, float[] x, int block) {
        return run(p, JointMonitor.replayConditioning(p), x, block);
    }

    private static RecordingJointEvents run(JointProgram p, Conditioning c, float[] x, int block) {
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(p, c, RATE, block, ev);
        for (int off = 0; off < x.length; off += block) {
            m.onSamples(x, off, Math.min(block, x.length - off), (long) (off * 1e9 / RATE));
        }
        m.finish();
        return ev;
    }

    @Test
    void goodRundownIsGoWithItsFigures() {
        JointProgram p = Programs.withoutShutoff(Programs.hubFinal());
        float[] x = PulseTrain.render(RATE, 1.0, strikes(0.1, ramp(80, 210, 8)), 0.3, 0.2, 1);
        RecordingJointEvents ev = run(p, x, 512);
        assertThat(ev.results).hasSize(1);
        JointResult r = ev.results.get(0);
        assertThat(r.blows()).isEqualTo(8);
        assertThat(r.finalTorqueNm()).isCloseTo(210, within(2.0));
        assertThat(r.verdict()).isEqualTo(Verdict.GO);
        assertThat(r.reasons()).isEmpty();
        assertThat(r.blowRatePerMin()).isCloseTo(60 / 0.027, within(20.0));
        // from the first sample above 10 N·m to the last: 7 intervals plus the last strike, whose
        // re-contact hump (42 N·m, from 3.0 to 3.67 ms after its start) is above 10 N·m until about 3.6 ms
        assertThat(r.durationMs()).isCloseTo(7 * 27 + 3.55, within(0.5));
    }

    @Test
    void finalTorqueFollowsTheProgramRule() {
        float[] x = PulseTrain.render(RATE, 1.0, strikes(0.1, 150, 220, 190, 200, 185), 0, 0, 1);
        JointProgram base = Programs.withoutShutoff(Programs.hubFinal());
        assertThat(run(Programs.with(base, FinalTorque.MAX_PEAK), x, 512).results.get(0).finalTorqueNm())
                .isCloseTo(220, within(1.0));
        assertThat(run(Programs.with(base, FinalTorque.LAST_PEAK), x, 512).results.get(0).finalTorqueNm())
                .isCloseTo(185, within(1.0));
        assertThat(run(Programs.with(base, FinalTorque.MEAN_LAST_3), x, 512).results.get(0).finalTorqueNm())
                .isCloseTo((190 + 200 + 185) / 3.0, within(1.0));
    }

    @Test
    void lowAndHighTorqueAndBlowCountsGiveTheirReasons() {
        JointProgram p = Programs.withoutShutoff(Programs.hubFinal());
        JointResult low = run(p, PulseTrain.render(RATE, 1, strikes(0.1, ramp(60, 150, 6)), 0, 0, 1), 512).results.get(0);
        assertThat(low.reasons()).containsExactly(Reason.TORQUE_LOW);
        assertThat(low.verdict()).isEqualTo(Verdict.NO_GO);
        JointResult high = run(p, PulseTrain.render(RATE, 1, strikes(0.1, ramp(80, 260, 6)), 0, 0, 1), 512).results.get(0);
        assertThat(high.reasons()).containsExactly(Reason.TORQUE_HIGH);
        JointResult few = run(p, PulseTrain.render(RATE, 1, strikes(0.1, 150, 160, 200), 0, 0, 1), 512).results.get(0);
        assertThat(few.reasons()).containsExactly(Reason.BLOWS_FEW);
        JointResult many = run(p, PulseTrain.render(RATE, 2, strikes(0.1, ramp(50, 200, 32)), 0, 0, 1), 512).results.get(0);
        assertThat(many.reasons()).containsExactly(Reason.BLOWS_MANY);
    }

    @Test
    void rehitWhenTheMinimumIsReachedWithinTheRehitBlows() {
        JointProgram p = Programs.withoutShutoff(Programs.hubFinal());
        JointResult r = run(p, PulseTrain.render(RATE, 1, strikes(0.1, 195, 200, 205, 210), 0, 0, 1), 512).results.get(0);
        assertThat(r.reasons()).containsExactly(Reason.REHIT);
        JointResult third = run(p, PulseTrain.render(RATE, 1, strikes(0.1, 100, 150, 195, 200), 0, 0, 1), 512).results.get(0);
        assertThat(third.reasons()).isEmpty();
    }

    @Test
    void rundownLongerThanMaxIsCutAndTimeLong() {
        JointProgram p = Programs.withMaxMs(Programs.withoutShutoff(Programs.hubFinal()), 100);
        float[] x = PulseTrain.render(RATE, 1.5, strikes(0.1, ramp(80, 210, 10)), 0, 0, 1);
        RecordingJointEvents ev = run(p, x, 512);
        // the rest of the over-long rundown starts no second rundown
        assertThat(ev.results).hasSize(1);
        assertThat(ev.results.get(0).reasons()).contains(Reason.TIME_LONG);
        assertThat(ev.results.get(0).durationMs()).isLessThanOrEqualTo(100.0);
    }

    @Test
    void shutoffFiresAtTheCrossingAndCountsLaterBlows() {
        JointProgram p = Programs.hubFinal();
        float[] x = PulseTrain.render(RATE, 1, strikes(0.1, 100, 150, 190, 208, 212, 215), 0, 0, 1);
        RecordingJointEvents ev = run(p, x, 256);
        assertThat(ev.shutoffs).hasSize(1);
        // the 4th strike (peak 208) starts at 0.1 + 3·0.027 s and crosses 205 N·m near its top
        double crossingS = ev.shutoffs.get(0) * 1e-9;
        assertThat(crossingS).isBetween(0.181, 0.183);
        JointResult r = ev.results.get(0);
        assertThat(r.shutoffReached()).isTrue();
        assertThat(r.blowsAfterShutoff()).isEqualTo(2);
    }

    @Test
    void separateRundownsAreJudgedSeparately() {
        List<Strike> s = new ArrayList<>(strikes(0.1, ramp(80, 200, 6)));
        s.addAll(strikes(0.8, ramp(80, 205, 7)));
        float[] x = PulseTrain.render(RATE, 1.5, s, 0.2, 0.2, 4);
        RecordingJointEvents ev = run(Programs.withoutShutoff(Programs.hubFinal()), x, 500);
        assertThat(ev.results).extracting(JointResult::blows).containsExactly(6, 7);
        assertThat(ev.starts).hasSize(2);
    }

    @ParameterizedTest(name = "block of {0} samples")
    @ValueSource(ints = {1, 7, 64, 500, 4096})
    void resultsDoNotDependOnTheBlockSize(int block) {
        List<Strike> s = new ArrayList<>(strikes(0.1, ramp(80, 200, 9)));
        s.addAll(strikes(0.9, ramp(120, 230, 5)));
        float[] x = PulseTrain.render(RATE, 1.6, s, 0, 0.3, 9);
        JointProgram p = Programs.hubFinal();
        // auto-zero acts per block, so it is off here (an idle band of 0 never sees a quiet block)
        Conditioning noZero = Conditioning.forReplay(0);
        RecordingJointEvents reference = run(p, noZero, x, 4096);
        RecordingJointEvents ev = run(p, noZero, x, block);
        assertThat(ev.results).hasSize(2);
        for (int i = 0; i < 2; i++) {
            JointResult a = reference.results.get(i);
            JointResult b = ev.results.get(i);
            assertThat(b.blows()).isEqualTo(a.blows());
            assertThat(b.peaksNm()).containsExactly(a.peaksNm());
            assertThat(b.durationMs()).isCloseTo(a.durationMs(), within(1e-6));
            assertThat(b.blowsAfterShutoff()).isEqualTo(a.blowsAfterShutoff());
        }
    }

    @Test
    void sensorFaultDuringARundownIsNeverGo() {
        JointProgram p = Programs.withoutShutoff(Programs.hubFinal());
        float[] x = PulseTrain.render(RATE, 1, strikes(0.1, ramp(80, 210, 8)), 0, 0.2, 1);
        x[(int) (0.15 * RATE)] = Float.NaN;
        RecordingJointEvents ev = run(p, x, 512);
        JointResult r = ev.results.get(0);
        assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
        assertThat(r.reasons()).contains(Reason.SENSOR_FAULT);
        assertThat(r.faults() & SignalFaults.NOT_FINITE).isNotZero();
        assertThat(ev.faults).contains(SignalFaults.NOT_FINITE);
    }

    @Test
    void saturatedSignalIsASensorFault() {
        JointProgram p = Programs.withoutShutoff(Programs.hubFinal());
        float[] x = PulseTrain.render(RATE, 1, strikes(0.1, ramp(80, 260, 8)), 0, 0.2, 1);
        for (int i = 0; i < x.length; i++) {
            x[i] = Math.min(x[i], 250f);
        }
        JointResult r = run(p, JointMonitor.replayConditioning(p).withOverRange(250), x, 512).results.get(0);
        assertThat(r.reasons()).contains(Reason.SENSOR_FAULT);
    }

    @Test
    void offsetIsRemovedBeforeJudging() {
        JointProgram p = Programs.withoutShutoff(Programs.hubFinal());
        float[] x = PulseTrain.render(RATE, 1, strikes(0.2, ramp(80, 200, 8)), 1.5, 0.1, 1);
        JointResult r = run(p, x, 500).results.get(0);
        assertThat(r.finalTorqueNm()).isCloseTo(200, within(0.5));
    }
}
