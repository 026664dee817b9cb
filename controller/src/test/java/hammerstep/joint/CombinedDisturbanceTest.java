package hammerstep.joint;

import hammerstep.signal.Conditioning;
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
 * Disturbances together, at 20, 50 and 100 kHz, in blocks of 512 and 4096: an offset of up to
 * ±8 N·m drifting by 2 N·m, idle noise of 2 N·m rms, and a spike of 100 to 400 N·m (either sign,
 * one or two samples) every 20 to 60 ms wherever it falls: in the idle, between blows, on strikes.
 * The joints match the clean trace, also with 15 N·m of mains hum (and harmonics) where the mains
 * frequency is named. Where the chain cannot cope (a burst of spikes closer than any
 * tool strikes, wider than an impulse; a rail), the result is a sensor fault, never a silent GO.
 */
class CombinedDisturbanceTest {

    static Stream<Arguments> cases() {
        List<Arguments> a = new ArrayList<>();
        for (double rate : new double[] {20_000, 50_000, 100_000}) {
            for (int block : new int[] {512, 4096}) {
                for (long seed = 11; seed <= 13; seed++) {
                    a.add(Arguments.of(rate, block, seed));
                }
            }
        }
        return a.stream();
    }

    @ParameterizedTest(name = "{0} Hz, blocks of {1}, seed {2}")
    @MethodSource("cases")
    void spikesOnADriftingNoisyZeroChangeNothingTheTruthSays(double rate, int block, long seed) {
        Disturbed d = new Disturbed(rate, 3, seed);
        double offset = -8 + 16 * d.random.nextDouble();
        d.drift(offset, offset + (offset > 0 ? -2 : 2));
        d.noise(2.0);
        for (double t = 0.02; t < d.x.length / rate - 0.01; t += 0.02 + 0.04 * d.random.nextDouble()) {
            d.spike(d.index(t), 1 + d.random.nextInt(2), d.spikeNm());
        }
        Conditioning c = JointMonitor.replayConditioning(Disturbed.PROGRAM);
        d.assertMatchesTruth(d.run(c, block), c);
    }

    static Stream<Arguments> humCases() {
        List<Arguments> a = new ArrayList<>();
        for (double rate : new double[] {20_000, 50_000, 100_000}) {
            for (double mains : new double[] {50, 60}) {
                a.add(Arguments.of(rate, mains, (long) (rate / 1000 + mains)));
            }
        }
        return a.stream();
    }

    /**
     * The same with mains hum on top, the mains frequency named: 15 N·m at it, 3 N·m at twice and
     * 5 N·m at three times it.
     */
    @ParameterizedTest(name = "{0} Hz, mains {1} Hz, seed {2}")
    @MethodSource("humCases")
    void humSpikesAndADriftingNoisyZeroTogetherChangeNothingTheTruthSays(double rate, double mains, long seed) {
        Disturbed d = new Disturbed(rate, 3, seed);
        double offset = -8 + 16 * d.random.nextDouble();
        d.drift(offset, offset + (offset > 0 ? -2 : 2));
        d.noise(2.0);
        d.hum(mains, 15, 3, 5);
        for (double t = 0.02; t < d.x.length / rate - 0.01; t += 0.02 + 0.04 * d.random.nextDouble()) {
            d.spike(d.index(t), 1 + d.random.nextInt(2), d.spikeNm());
        }
        Conditioning c = JointMonitor.replayConditioning(Disturbed.PROGRAM).withMains(mains);
        d.assertMatchesTruth(d.run(c, 512), c);
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void whatTheChainCannotCleanIsASensorFaultNeverGo(double rate) {
        // bursts of 0.2 ms pulses of 150 N·m every 2 ms between the blows: wider than an impulse,
        // faster than any tool strikes
        Disturbed d = new Disturbed(rate, 1, 21);
        List<Strike> strikes = d.rundowns.get(0);
        for (int b = 0; b + 1 < strikes.size(); b++) {
            double from = strikes.get(b).startS() + strikes.get(b).spanS();
            for (double t = from; t < strikes.get(b + 1).startS() - 0.001; t += 0.002) {
                d.spike(d.index(t), Math.max(3, d.index(0.0002)), 150);
            }
        }
        Conditioning c = JointMonitor.replayConditioning(Disturbed.PROGRAM);
        assertThat(d.run(c, 512)).isNotEmpty().allSatisfy(r -> {
            assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(r.reasons()).contains(Reason.SENSOR_FAULT);
        });
    }
}
