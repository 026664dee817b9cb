package hammerstep.signal;

import hammerstep.signal.PulseTrain.Strike;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.List;
import java.util.Random;
import java.util.stream.LongStream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Random pulse trains built with known truth: the detector's count always equals the number of
 * strikes, and each peak matches the noise-free peak within the noise. Seeded, so a failure names
 * its seed and repeats.
 */
class PulseTrainPropertyTest {

    private static final double RATE = 50_000;

    /** 2000 trains by default; mutation testing runs fewer ({@code -Dhammerstep.propertySeeds}). */
    static LongStream seeds() {
        return LongStream.range(0, Long.getLong("hammerstep.propertySeeds", 2000));
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void countEqualsTruthOnRandomTrains(long seed) {
        Random r = new Random(seed);
        int blows = 1 + r.nextInt(30);
        double countAbove = 20 + 40 * r.nextDouble();
        double first = countAbove * (1.2 + r.nextDouble());
        double last = first + 300 * r.nextDouble();
        List<Strike> strikes = PulseTrain.randomRundown(r, 0.02, blows, first, last, 600, 4000);
        double duration = strikes.get(blows - 1).startS() + 0.05;
        double noise = 0.01 * countAbove * r.nextDouble();
        double offset = 0;
        float[] clean = PulseTrain.render(RATE, duration, strikes, offset, 0, seed);
        float[] noisy = PulseTrain.render(RATE, duration, strikes, offset, noise, seed);
        double[] truth = PulseTrain.truePeaks(RATE, clean, offset, strikes);

        RecordingPulses rec = new RecordingPulses();
        PulseDetector d = new PulseDetector(countAbove, 0.5 * countAbove, 7.5, RATE, rec);
        int block = 1 + r.nextInt(2048);
        for (int off = 0; off < noisy.length; off += block) {
            d.process(noisy, off, Math.min(block, noisy.length - off), (long) (off * 1e9 / RATE));
        }
        d.flush();

        assertThat(rec.pulses).as("blows (seed %d)", seed).hasSize(blows);
        for (int k = 0; k < blows; k++) {
            assertThat(rec.pulses.get(k).peakNm()).as("peak %d (seed %d)", k, seed)
                    .isBetween(truth[k] - 5 * noise - 1e-3, truth[k] + 5 * noise + 1e-3);
        }
    }
}
