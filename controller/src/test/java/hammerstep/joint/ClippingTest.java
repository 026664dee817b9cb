package hammerstep.joint;

import hammerstep.signal.Conditioning;
import hammerstep.signal.SignalFaults;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * A signal clipped at the ADC's or the amplifier's rail reads the rail as its peak. A pulse that
 * flattens there, whether or not the range is known, is {@code OVER_RANGE}: a sensor fault, never GO.
 * A known range (the station's full scale, a trace's {@code range_nm}, replay's {@code --over-range})
 * catches a pulse reaching it even without a flat top.
 */
class ClippingTest {

    private static final Conditioning BARE_CSV = JointMonitor.replayConditioning(Disturbed.PROGRAM);

    private static void clip(float[] x, float rail) {
        for (int i = 0; i < x.length; i++) {
            x[i] = Math.max(-rail, Math.min(rail, x[i]));
        }
    }

    @ParameterizedTest(name = "{0} Hz, rail at {1} N·m, noise {2} N·m rms")
    @CsvSource({
            "20000, 205, 0.0", "50000, 205, 0.0", "100000, 205, 0.0",
            "20000, 190, 1.0", "50000, 200, 3.0", "100000, 200, 0.5"})
    void aPulseFlattenedAtARailIsASensorFaultNeverGo(double rate, float rail, double noise) {
        int faulted = 0;
        for (long seed = 1; seed <= 4; seed++) {
            Disturbed d = new Disturbed(rate, 2, seed);
            d.noise(noise);
            // the rail clips noise and all: the amplifier's output cannot pass it
            clip(d.x, rail);
            List<JointResult> results = d.run(BARE_CSV, 512);
            List<JointResult> truth = d.truth(BARE_CSV);
            assertThat(results).hasSize(2);
            for (int k = 0; k < 2; k++) {
                JointResult r = results.get(k);
                double[] peaks = hammerstep.signal.PulseTrain.truePeaks(rate, d.clean, 0, d.rundowns.get(k));
                double highest = java.util.Arrays.stream(peaks).max().orElseThrow();
                if (highest > 1.04 * rail) {
                    // clipped by more than the tolerance: must be a sensor fault
                    assertThat(r.faults() & SignalFaults.OVER_RANGE).as("over-range, truth %s", highest).isNotZero();
                    assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
                    assertThat(r.reasons()).contains(Reason.SENSOR_FAULT);
                    faulted++;
                } else if ((r.faults() & SignalFaults.OVER_RANGE) == 0) {
                    // clipped within the tolerance, or not at all: judged as the truth
                    assertThat(r.verdict()).isEqualTo(truth.get(k).verdict());
                    for (int b = 0; b < peaks.length; b++) {
                        assertThat(r.peaksNm()[b]).isCloseTo(peaks[b],
                                org.assertj.core.api.Assertions.within(Math.max(0.04 * peaks[b], 10.0)));
                    }
                } else {
                    assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
                }
            }
        }
        assertThat(faulted).as("rundowns clipped beyond the tolerance").isPositive();
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void theSameTraceBelowTheRailIsNoFault(double rate) {
        // the check above could fail: without clipping the same joints carry no fault
        Disturbed d = new Disturbed(rate, 2, 1);
        d.noise(1.0);
        clip(d.x, 400);
        assertThat(d.run(BARE_CSV, 512)).allSatisfy(r -> assertThat(r.faults()).isZero());
    }

    @ParameterizedTest(name = "{0} Hz")
    @ValueSource(doubles = {20_000, 50_000, 100_000})
    void equalSamplesAtAReboundTroughBelowTheStrikeAreNoRail(double rate) {
        // int16 storage in steps of about 0.009 N·m: with 0.4 N·m of noise, three samples at a slow
        // rebound trough can read the same count (seen in an archive of 100 000 stored traces)
        Disturbed d = new Disturbed(rate, 1, 3);
        d.noise(0.4);
        int troughs = 0;
        for (int i = 1; i + 3 < d.x.length; i++) {
            if (d.clean[i] < -28 && d.clean[i] <= d.clean[i - 1] && d.clean[i] < d.clean[i + 1]
                    && strikeBefore(d.clean, i, 4096)) {
                d.x[i + 1] = d.x[i];
                d.x[i + 2] = d.x[i];
                troughs++;
            }
        }
        assertThat(troughs).as("rebound troughs made flat").isGreaterThanOrEqualTo(3);
        // in blocks that hold the strike before each trough, as a replay of a trace reads them
        assertThat(d.run(BARE_CSV, 4096)).singleElement()
                .satisfies(r -> assertThat(r.faults() & SignalFaults.OVER_RANGE).isZero());
        // the same flat samples at the strike's crest are a rail
        Disturbed crest = new Disturbed(rate, 1, 3);
        crest.noise(0.4);
        clip(crest.x, 150);
        assertThat(crest.run(BARE_CSV, 4096)).singleElement()
                .satisfies(r -> assertThat(r.faults() & SignalFaults.OVER_RANGE).isNotZero());
    }

    /** True when the block of {@code i} holds a larger sample before the trough at {@code i} (the strike). */
    private static boolean strikeBefore(float[] x, int i, int block) {
        for (int k = i / block * block; k < i; k++) {
            if (x[k] > -x[i] + 10) {
                return i + 3 < (i / block + 1) * block;
            }
        }
        return false;
    }

    @ParameterizedTest(name = "range {0} N·m")
    @ValueSource(doubles = {200, 220})
    void aKnownRangeCatchesAPulseReachingItWithoutAFlatTop(double range) {
        Disturbed d = new Disturbed(50_000, 1, 4);
        d.noise(0.5);
        assertThat(d.run(BARE_CSV, 512)).singleElement()
                .satisfies(r -> assertThat(r.faults() & SignalFaults.OVER_RANGE).isZero());
        assertThat(d.run(BARE_CSV.withRange(range), 512)).singleElement().satisfies(r -> {
            assertThat(r.faults() & SignalFaults.OVER_RANGE).isNotZero();
            assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
        });
    }
}
