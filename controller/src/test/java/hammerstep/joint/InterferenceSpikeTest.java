package hammerstep.joint;

import hammerstep.signal.Conditioning;
import hammerstep.signal.PulseTrain;
import hammerstep.signal.PulseTrain.Strike;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Electrical impulses (welders, contactors, drives switching): one or two samples, or up to
 * 0.05 ms, of 100 to 400 N·m of either sign, at 20, 50 and 100 kHz, placed in the idle before a
 * rundown, between blows, on a strike's peak and just before a strike (where a spike above the blow
 * level would start the blow early and shift its dead time). Each case must match the clean trace:
 * blow count exact, each peak within max(4 %, 10 N·m), verdict as the truth; the joint result counts
 * the impulses that fell inside its rundown. Strike pulses last 0.5 ms and more (about 1 to 5 ms;
 * transducer practice, memory), so real strikes, and hydraulic pulses of several ms, are left alone.
 */
class InterferenceSpikeTest {

    enum Place { IDLE, BETWEEN_BLOWS, ON_STRIKE, BEFORE_STRIKE }

    static Stream<Arguments> cases() {
        List<Arguments> a = new ArrayList<>();
        for (double rate : new double[] {20_000, 50_000, 100_000}) {
            for (Place place : Place.values()) {
                for (long seed = 1; seed <= 4; seed++) {
                    a.add(Arguments.of(rate, place, seed));
                }
            }
        }
        return a.stream();
    }

    /** The widths an impulse takes at a rate: 1 or 2 samples, or 0.05 ms where that is more. */
    private static int width(Disturbed d) {
        int longest = Math.max(2, (int) Math.round(0.05e-3 * d.rateHz));
        return 1 + d.random.nextInt(longest);
    }

    @ParameterizedTest(name = "{0} Hz, {1}, seed {2}")
    @MethodSource("cases")
    void impulsesChangeNothingTheTruthSays(double rate, Place place, long seed) {
        Disturbed d = new Disturbed(rate, 3, seed);
        d.noise(0.5);
        int inside = 0;
        for (List<Strike> rundown : d.rundowns) {
            for (int b = 0; b < rundown.size(); b++) {
                Strike s = rundown.get(b);
                int w = width(d);
                switch (place) {
                    case IDLE -> {
                        if (b == 0) {
                            d.spike(d.index(s.startS() - 0.3), w, d.spikeNm());
                        }
                    }
                    case BETWEEN_BLOWS -> {
                        if (b + 1 < rundown.size()) {
                            double gap = s.startS() + s.spanS();
                            double next = rundown.get(b + 1).startS();
                            if (next - gap > 0.001) {
                                d.spike(d.index(0.5 * (gap + next)), w, d.spikeNm());
                                inside++;
                            }
                        }
                    }
                    case ON_STRIKE -> {
                        // anywhere on the main lobe's middle half, its crest included
                        int at = d.index(s.startS() + s.widthS() * (0.25 + 0.5 * d.random.nextDouble()));
                        d.spike(at, w, d.spikeNm());
                        inside++;
                    }
                    case BEFORE_STRIKE -> {
                        // positive, above the blow level, 1 to 3 samples before the strike's first sample
                        int at = d.index(s.startS()) - w - 1 - d.random.nextInt(2);
                        d.spike(at, w, 100 + 300 * d.random.nextDouble());
                        inside++;
                    }
                    default -> throw new IllegalStateException();
                }
            }
        }
        Conditioning c = JointMonitor.replayConditioning(Disturbed.PROGRAM);
        List<JointResult> results = d.run(c, 512);
        d.assertMatchesTruth(results, c);
        int counted = results.stream().mapToInt(JointResult::rejectedImpulses).sum();
        if (place == Place.IDLE) {
            assertThat(counted).as("impulses in the idle belong to no joint").isZero();
        } else if (place == Place.BEFORE_STRIKE) {
            // counted per block: one just before a rundown's first strike may fall in the block before
            assertThat(counted).as("impulses counted in the joints").isBetween(inside - d.rundowns.size(), inside);
        } else {
            assertThat(counted).as("impulses counted in the joints").isEqualTo(inside);
        }
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void withoutRejectionTheSameSpikesBreakTheCount(double rate) {
        // the check above could fail: the same kind of trace, rejection off, miscounts
        Disturbed d = new Disturbed(rate, 1, 7);
        for (Strike s : d.rundowns.get(0)) {
            d.spike(d.peakIndex(s) + d.index(0.012), 1, 250);
        }
        List<JointResult> off = d.run(JointMonitor.replayConditioning(Disturbed.PROGRAM).withImpulse(0), 512);
        assertThat(off.get(0).blows()).isGreaterThan(d.rundowns.get(0).size());
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void strikesOfHalfAMillisecondAndHydraulicPulsesAreUntouched(double rate) {
        List<Strike> strikes = new ArrayList<>();
        double t = 0.3;
        for (int i = 0; i < 8; i++) {
            // 0.5 ms strikes of 400 N·m with rebound and ringing; then 1 ms strikes with a re-contact hump
            // as well (a 0.5 ms strike's hump lasts 0.17 ms, itself as short as an impulse: see design.md);
            // then hydraulic pulses of 6 to 8 ms
            double w = i < 3 ? 0.0005 : i < 5 ? 0.001 : 0.0005 + 0.001 * i;
            strikes.add(new Strike(t, w, i < 5 ? 400 : 150 + 10 * i, 0.5, i < 3 ? 0 : 0.4, 0.3));
            t += 0.03;
        }
        float[] clean = PulseTrain.render(rate, t + 0.5, strikes, 0, 0, 1);
        float[] in = clean.clone();
        hammerstep.signal.Conditioner c = new hammerstep.signal.Conditioner(
                JointMonitor.replayConditioning(Disturbed.PROGRAM), rate);
        float[] out = new float[512];
        int delay = c.delaySamples();
        for (int off = 0; off < in.length; off += 512) {
            int n = Math.min(512, in.length - off);
            c.process(in, off, n, out, false);
            for (int i = 0; i < n; i++) {
                int src = off + i - delay;
                if (src >= 0) {
                    assertThat(out[i]).as("sample %d", src).isEqualTo(clean[src]);
                }
            }
        }
        assertThat(c.rejectedImpulses()).isZero();
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void aSpikeAloneInTheIdleStartsNoRundownAndIsCounted(double rate) {
        Disturbed d = new Disturbed(rate, 1, 3);
        for (int k = 0; k < 20; k++) {
            d.spike(d.index(0.01 + 0.02 * k), 1 + k % 2, k % 2 == 0 ? 400 : -400);
        }
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(Disturbed.PROGRAM, JointMonitor.replayConditioning(Disturbed.PROGRAM),
                rate, 512, ev);
        int idle = d.index(0.45);
        for (int off = 0; off < idle; off += 512) {
            m.onSamples(d.x, off, Math.min(512, idle - off), (long) (off * 1e9 / rate));
        }
        assertThat(ev.starts).isEmpty();
        assertThat(m.conditioner().rejectedImpulses()).isEqualTo(20);
    }
}
