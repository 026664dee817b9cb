package hammerstep.joint;

import hammerstep.signal.PulseTrain;
import hammerstep.signal.PulseTrain.Strike;
import hammerstep.signal.SignalFaults;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Electrical noise is not a blow: pulses narrower than any strike (strike pulses last 1 to 5 ms,
 * memory of transducer practice) that follow each other sooner than any tool strikes raise
 * {@code NOISE}, which makes the rundown NO-GO with {@code SENSOR_FAULT}. The program's dead time is
 * 7.5 ms (4000 blows a minute at most), so "sooner than any tool" is under 11.25 ms. The pulses here
 * last 0.2 ms: shorter ones (0.1 ms and less) are impulses the conditioner removes before detection
 * ({@code InterferenceSpikeTest}).
 */
class NoiseDetectionTest {

    private static final double RATE = 50_000;

    private static List<Strike> pulses(int count, double everyS, double widthS) {
        List<Strike> s = new ArrayList<>();
        for (int i = 0; i < count; i++) {
            s.add(new Strike(0.1 + i * everyS, widthS, 150 + i, 0, 0, 0));
        }
        return s;
    }

    private static RecordingJointEvents run(List<Strike> strikes) {
        JointProgram p = Programs.withoutShutoff(Programs.hubFinal());
        float[] x = PulseTrain.render(RATE, 1.0, strikes, 0, 0, 1);
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(p, JointMonitor.replayConditioning(p), RATE, 256, ev);
        for (int off = 0; off < x.length; off += 256) {
            m.onSamples(x, off, Math.min(256, x.length - off), (long) (off * 1e9 / RATE));
        }
        m.finish();
        return ev;
    }

    @Test
    void narrowSpikesCrowdedFasterThanAnyToolAreNoiseReportedOnceAndNeverGo() {
        RecordingJointEvents ev = run(pulses(12, 0.009, 0.0002));
        assertThat(ev.faults).as("one NOISE report per rundown").containsExactly(SignalFaults.NOISE);
        assertThat(ev.results).singleElement().satisfies(r -> {
            assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(r.reasons()).contains(Reason.SENSOR_FAULT);
            assertThat(r.faults() & SignalFaults.NOISE).isNotZero();
        });
    }

    @Test
    void twoCrowdedSpikesAreNotYetNoise() {
        // the first pulse has no predecessor, so three pulses give two crowded ones
        RecordingJointEvents ev = run(pulses(3, 0.009, 0.0002));
        assertThat(ev.faults).isEmpty();
        RecordingJointEvents four = run(pulses(4, 0.009, 0.0002));
        assertThat(four.faults).containsExactly(SignalFaults.NOISE);
    }

    @Test
    void narrowPulsesAtAToolsPaceAreNotNoise() {
        // a stiff re-hit can make a strike this narrow; 27 ms apart is an ordinary blow rate
        RecordingJointEvents ev = run(pulses(12, 0.027, 0.0002));
        assertThat(ev.faults).isEmpty();
        assertThat(ev.results).singleElement().satisfies(r -> assertThat(r.faults() & SignalFaults.NOISE).isZero());
    }

    @Test
    void strikesOfNormalWidthAtTheFastestPaceAreNotNoise() {
        RecordingJointEvents ev = run(pulses(12, 0.009, 0.002));
        assertThat(ev.faults).isEmpty();
        assertThat(ev.results).singleElement().satisfies(r -> assertThat(r.blows()).isEqualTo(12));
    }
}
