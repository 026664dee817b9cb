package hammerstep.sim.physics;

import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The measuring chain's effect on blow peaks: the controller's chain (as replay runs it) on simulated
 * traces, each detected peak against the truth's shaft peak of the same blow, per tool family and
 * sample rate, through the inline-1000 transducer (20 kHz bandwidth, 2nd-order Butterworth, 16-bit).
 * Writes the table of docs/engineer-guide.md ("Sample rate and peaks") to
 * {@code sim/target/peak-error-table.md}.
 */
class PeakErrorTableTest {

    static final List<String> FAMILIES = List.of("cordless-two-dog", "cordless-three-dog", "air-twin-hammer",
            "oil-pulse", "air-rocking-dog", "air-three-jaw", "air-twin-pin-oil-bath");
    /**
     * {@code -Dhammerstep.peakTable=full} measures the table of docs/engineer-guide.md (six rates, two
     * joints, two seeds: about a minute of CPU); by default a quicker subset that the checks need.
     */
    static final boolean FULL = "full".equals(System.getProperty("hammerstep.peakTable"));
    static final double[] RATES = FULL ? new double[] {10_000, 15_000, 20_000, 30_000, 50_000, 100_000}
            : new double[] {10_000, 20_000, 30_000, 100_000};
    static final List<String> JOINTS = FULL ? List.of("iso-hard", "flange-m16") : List.of("iso-hard");
    static final int SEEDS = FULL ? 2 : 1;

    static double recommendedMinHz(String tool) throws Exception {
        return SampleRates.recommendedMinHz(Presets.tool(tool).mechanism());
    }

    /** Mean and worst (most negative) relative peak error of the detected blows, and blows compared. */
    record Cell(double meanError, double worstError, int blows) {
    }

    private static final Map<String, Cell> TABLE = new LinkedHashMap<>();

    static Cell measure(String tool, double rateHz, TransducerSpec transducer) throws Exception {
        JointProgram program = CrossCheckTest.program();
        double sum = 0;
        double worst = 0;
        int n = 0;
        for (String joint : JOINTS) {
            for (long seed = 1; seed <= SEEDS; seed++) {
                Rig rig = Rig.create(Presets.tool(tool), Presets.joint(joint), transducer, rateHz, seed);
                rig.setBlowThresholdNm(program.blows().countAboveNm());
                double[] measuredNs = new double[1024];
                double[] measuredNm = new double[1024];
                int[] count = {0};
                JointEvents events = new JointEvents() {
                    @Override
                    public void onBlow(int index, double peakNm, long peakNs) {
                        if (count[0] < measuredNm.length) {
                            measuredNm[count[0]] = peakNm;
                            measuredNs[count[0]] = peakNs;
                            count[0]++;
                        }
                    }

                    @Override
                    public void onRundown(JointResult result) {
                    }
                };
                int block = 500;
                JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), rateHz,
                        block, events);
                float[] samples = new float[block];
                feed(rig, monitor, samples, 0.1);
                rig.setTrigger(true);
                feed(rig, monitor, samples, 0.7);
                rig.setTrigger(false);
                feed(rig, monitor, samples, 0.4);
                monitor.finish();
                for (int i = 0; i < Math.min(rig.blows(), Rig.MAX_BLOWS); i++) {
                    if (rig.blowCutShort(i)) {
                        continue;
                    }
                    double truth = rig.blowPeakNm(i);
                    double atNs = rig.blowTimeS(i) * 1e9;
                    int best = -1;
                    for (int m = 0; m < count[0]; m++) {
                        if (Math.abs(measuredNs[m] - atNs) < 2e6 && (best < 0
                                || Math.abs(measuredNs[m] - atNs) < Math.abs(measuredNs[best] - atNs))) {
                            best = m;
                        }
                    }
                    if (best >= 0) {
                        double e = (measuredNm[best] - truth) / truth;
                        sum += e;
                        worst = Math.min(worst, e);
                        n++;
                    }
                }
            }
        }
        return new Cell(n > 0 ? sum / n : Double.NaN, worst, n);
    }

    private static void feed(Rig rig, JointMonitor monitor, float[] block, double seconds) {
        long left = Math.round(seconds * rig.rateHz());
        while (left > 0) {
            int n = (int) Math.min(block.length, left);
            long firstNs = Math.round(rig.samplesElapsed() * 1e9 / rig.rateHz());
            rig.fill(block, 0, n);
            monitor.onSamples(block, 0, n, firstNs);
            left -= n;
        }
    }

    static TransducerSpec withBandwidth(TransducerSpec t, double hz) {
        return new TransducerSpec(t.name() + "@" + hz, t.ratedTorqueNm(), t.shaftStiffness(), t.inertiaKgM2(), hz,
                t.noiseNmRms(), t.offsetNm(), t.gainError(), t.adcBits(), t.adcRangeNm());
    }

    @BeforeAll
    static void measureTheTable() throws Exception {
        for (String tool : FAMILIES) {
            for (double rate : RATES) {
                TABLE.put(tool + "@" + rate, measure(tool, rate, Presets.defaultTransducer()));
            }
        }
        writeTable(Path.of("target", FULL ? "peak-error-table.md" : "peak-error-table-quick.md"));
    }

    private static void writeTable(Path file) throws IOException {
        StringBuilder b = new StringBuilder();
        b.append("| rate |");
        for (String tool : FAMILIES) {
            b.append(" `").append(tool).append("` |");
        }
        b.append("\n|---|");
        b.append("---|".repeat(FAMILIES.size())).append('\n');
        for (double rate : RATES) {
            b.append(String.format(Locale.ROOT, "| %.0f kHz |", rate / 1000));
            for (String tool : FAMILIES) {
                Cell c = TABLE.get(tool + "@" + rate);
                b.append(String.format(Locale.ROOT, " %.1f / %.1f |", 100 * c.meanError(), 100 * c.worstError()));
            }
            b.append('\n');
        }
        b.append("\nblows compared per tool:");
        for (String tool : FAMILIES) {
            b.append(' ').append(tool).append(' ').append(TABLE.get(tool + "@" + RATES[0]).blows()).append(',');
        }
        b.append('\n');
        Files.createDirectories(file.getParent());
        Files.writeString(file, b.toString());
    }

    @Test
    @DisplayName("peaks read low (beyond the transducer's gain error), and the worst error shrinks as the rate rises (sampling a short peak)")
    void peaksReadLowAndTheErrorShrinksWithTheRate() {
        for (String tool : FAMILIES) {
            for (double rate : RATES) {
                Cell c = TABLE.get(tool + "@" + rate);
                assertThat(c.blows()).as(tool + " at " + rate).isGreaterThan(5);
                // inline-1000 reads 0.2 % high by its gain error: nothing above that but noise
                assertThat(c.meanError()).as(tool + " at " + rate).isLessThan(0.005);
            }
            Cell low = TABLE.get(tool + "@" + RATES[0]);
            Cell high = TABLE.get(tool + "@" + RATES[RATES.length - 1]);
            assertThat(high.worstError()).as(tool).isGreaterThan(low.worstError());
            assertThat(high.meanError()).as(tool).isGreaterThanOrEqualTo(low.meanError());
            assertThat(high.worstError()).as(tool + " at 100 kHz").isGreaterThan(-0.02);
        }
    }

    @Test
    @DisplayName("at its recommended minimum rate every family's peaks read within 2 % on average and 5 % at worst")
    void theRecommendedMinimumKeepsEveryFamilyWithinTolerance() throws Exception {
        for (String tool : FAMILIES) {
            Cell c = TABLE.get(tool + "@" + recommendedMinHz(tool));
            assertThat(c.meanError()).as(tool).isGreaterThan(-0.02);
            assertThat(c.worstError()).as(tool).isGreaterThan(-0.05);
        }
    }

    @Test
    @DisplayName("at 20 kHz the top of a metal strike is missed by more than 5 %: the demo's former rate is below the minimum")
    void twentyKilohertzMissesTheTopOfAMetalStrike() throws Exception {
        double worst = 0;
        for (String tool : FAMILIES) {
            if (recommendedMinHz(tool) > 20_000) {
                worst = Math.min(worst, TABLE.get(tool + "@" + 20_000.0).worstError());
            }
        }
        assertThat(worst).isLessThan(-0.05);
    }
}
