package hammerstep.joint;

import hammerstep.signal.Conditioning;
import org.junit.jupiter.api.Test;

import java.util.Arrays;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * Rundown segmentation sample by sample, on hand-made signals at 1 kHz (one sample per ms), so
 * every threshold and duration is checked at its exact edge.
 */
class MonitorEdgesTest {

    private static final double RATE = 1000;
    /** 10 N·m start, 40 N·m blows released below 20, dead time 3 ms, end after 5 ms, cut at 50 ms. */
    private static final JointProgram P = new JointProgram("edges", "", new JointProgram.Torque(50, 60, 70),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 1, 10, 3), new JointProgram.Rundown(10, 5, 50), 65, 0);

    private final RecordingJointEvents ev = new RecordingJointEvents();
    /** Impulse rejection off: its look-ahead would hold the last samples of each hand-fed block back. */
    private final JointMonitor m = new JointMonitor(P, Conditioning.forReplay(0).withImpulse(0), RATE, 256, ev);

    private long fed;

    /** Blocks that follow each other in time (a block out of time would be a data gap). */
    private void feed(float... x) {
        m.onSamples(x, 0, x.length, Math.round(fed * 1e9 / RATE));
        fed += x.length;
    }

    private static float[] zeros(int n) {
        return new float[n];
    }

    @Test
    void aSampleExactlyAtTheStartLevelStartsARundown() {
        feed(0, 9.99f, 0);
        assertThat(ev.starts).isEmpty();
        assertThat(m.inRundown()).isFalse();
        feed(10f);
        assertThat(ev.starts).hasSize(1);
        assertThat(m.inRundown()).isTrue();
    }

    @Test
    void theRundownEndsAfterExactlyEndAfterSamplesBelow() {
        feed(10, 50, 10, 0, 0, 0, 0);
        // last above at index 2; 4 samples below so far: not yet ended
        assertThat(ev.results).isEmpty();
        feed(0, 0);
        assertThat(ev.results).hasSize(1);
        assertThat(ev.results.get(0).durationMs()).isEqualTo(2.0);
        assertThat(m.inRundown()).isFalse();
    }

    @Test
    void aSampleBackAtTheLevelKeepsTheRundownGoing() {
        feed(10, 50, 0, 0, 0, 0, 10, 0, 0, 0, 0, 0, 0);
        assertThat(ev.results).hasSize(1);
        assertThat(ev.results.get(0).durationMs()).isEqualTo(6.0);
        assertThat(ev.starts).hasSize(1);
    }

    @Test
    void aRundownIsCutAtMaxMsAndTheRestStartsNoNewOne() {
        float[] x = new float[120];
        Arrays.fill(x, 0, 80, 12f);
        feed(x);
        assertThat(ev.results).hasSize(1);
        JointResult r = ev.results.get(0);
        assertThat(r.reasons()).contains(Reason.TIME_LONG);
        assertThat(r.durationMs()).isEqualTo(49.0);
        // after the cut, the quiet wait: signal above for 30 more samples, then below; no second start
        assertThat(ev.starts).hasSize(1);
        feed(zeros(10));
        feed(12f);
        assertThat(ev.starts).hasSize(2);
    }

    @Test
    void quietWaitNeedsTheFullEndAfterTime() {
        float[] x = new float[60];
        Arrays.fill(x, 12f);
        feed(x);
        // cut at sample 50; signal above until 59; then only 4 samples quiet
        feed(0, 0, 0, 0, 12);
        assertThat(ev.starts).hasSize(1);
        feed(0, 0, 0, 0, 0, 12);
        assertThat(ev.starts).hasSize(2);
    }

    @Test
    void blowsAreCountedAtTheExactCountLevelAndJudged() {
        feed(10, 40, 0, 0, 0, 10, 55, 0, 0, 0, 0, 0, 0, 0, 0);
        JointResult r = ev.results.get(0);
        assertThat(r.blows()).isEqualTo(2);
        assertThat(ev.blows).isEqualTo(2);
        assertThat(r.peaksNm()).containsExactly(40.0, 55.0);
        assertThat(r.peakTimesNs()).containsExactly(1_000_000L, 6_000_000L);
        assertThat(r.finalTorqueNm()).isEqualTo(55.0);
        assertThat(r.verdict()).isEqualTo(Verdict.GO);
    }

    @Test
    void shutoffAtTheExactLevelAndOnlyLaterBlowsCountAfterIt() {
        feed(10, 65, 0, 0, 0, 45, 0, 0, 0, 50, 0, 0, 0, 0, 0, 0);
        assertThat(ev.shutoffs).containsExactly(1_000_000L);
        JointResult r = ev.results.get(0);
        assertThat(r.shutoffReached()).isTrue();
        assertThat(r.blows()).isEqualTo(3);
        assertThat(r.blowsAfterShutoff()).isEqualTo(2);
    }

    @Test
    void finishJudgesARundownUnderWayAndForgetsAnOpenBlow() {
        feed(10, 55, 50);
        assertThat(m.blowsSoFar()).isZero();
        m.finish();
        assertThat(ev.results).hasSize(1);
        assertThat(ev.results.get(0).blows()).isEqualTo(1);
        assertThat(m.inRundown()).isFalse();
        m.finish();
        assertThat(ev.results).hasSize(1);
        // the next rundown starts clean
        feed(10, 30, 0, 0, 0, 0, 0, 0);
        assertThat(ev.results.get(1).blows()).isZero();
        assertThat(ev.results.get(1).reasons()).contains(Reason.TORQUE_LOW, Reason.BLOWS_FEW);
    }

    @Test
    void aBlowOpenWhenARundownIsCutDoesNotLeakIntoTheNext() {
        float[] x = new float[50];
        Arrays.fill(x, 45f);
        feed(x);
        feed(45f);
        // cut with one long blow open; quiet; a new rundown whose first sample is below the count level
        feed(zeros(6));
        feed(10, 15, 0, 0, 0, 0, 0, 0);
        assertThat(ev.results).hasSize(2);
        assertThat(ev.results.get(1).blows()).isZero();
    }

    @Test
    void tooLongABlockIsRefused() {
        assertThatThrownBy(() -> feed(zeros(257))).isInstanceOf(IllegalArgumentException.class);
        assertThat(m.program()).isSameAs(P);
        assertThat(m.conditioner().rateHz()).isEqualTo(RATE);
    }
}
