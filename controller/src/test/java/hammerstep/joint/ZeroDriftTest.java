package hammerstep.joint;

import hammerstep.signal.Conditioning;
import hammerstep.signal.SignalFaults;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Offset and drift with realistic idle noise (up to 3 N·m rms, blocks of 512 and of replay's 4096):
 * within the zero limit (±10 N·m where the range is unknown, 2 % of a known range) the auto-zero
 * follows and the joints match the clean trace; the first zero comes from the idle before the first
 * rundown; past the limit the result is {@code ZERO_DRIFT}, a sensor fault, never GO. The drifts run
 * 3 N·m over the 3 s trace, about 1 N·m/s: far faster than a warming bridge drifts (minutes), and
 * what the zero's 1 s time constant follows with a lag of about 1 N·m.
 */
class ZeroDriftTest {

    private static final Conditioning BARE_CSV = JointMonitor.replayConditioning(Disturbed.PROGRAM);

    @ParameterizedTest(name = "offset {0} → {1} N·m, noise {2} N·m rms, blocks of {3}")
    @CsvSource({
            "2.5, 2.5, 0.5, 512",
            "-2.5, -2.5, 1.5, 4096",
            "9.0, 9.0, 3.0, 512",
            "-9.0, -9.0, 3.0, 4096",
            "6.5, 9.5, 3.0, 512",
            "-6.0, -9.0, 3.0, 4096",
            "-1.5, 1.5, 1.5, 4096"})
    void offsetAndDriftWithinTheLimitAreFollowed(double from, double to, double noise, int block) {
        for (long seed = 1; seed <= 3; seed++) {
            Disturbed d = new Disturbed(50_000, 3, seed);
            d.noise(noise);
            d.drift(from, to);
            List<JointResult> results = d.run(BARE_CSV, block);
            d.assertMatchesTruth(results, BARE_CSV);
            assertThat(results).allSatisfy(r -> assertThat(r.faults()).isZero());
        }
    }

    @ParameterizedTest(name = "offset {0} N·m")
    @ValueSource(doubles = {12.0, -14.0})
    void pastTheLimitIsZeroDriftNeverGo(double offset) {
        Disturbed d = new Disturbed(50_000, 2, 5);
        d.noise(1.0);
        d.drift(offset, offset);
        List<JointResult> results = d.run(BARE_CSV, 4096);
        assertThat(results).isNotEmpty().allSatisfy(r -> {
            assertThat(r.faults() & SignalFaults.ZERO_DRIFT).isNotZero();
            assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(r.reasons()).contains(Reason.SENSOR_FAULT);
        });
    }

    @ParameterizedTest(name = "range {0} N·m, offset {1} N·m")
    @CsvSource({"1000, 18.0", "1000, -18.0", "250, 4.5"})
    void aKnownRangeSetsTheLimitAtTwoPercent(double range, double offset) {
        Conditioning c = BARE_CSV.withRange(range);
        assertThat(c.zeroLimitNm()).isEqualTo(0.02 * range);
        Disturbed d = new Disturbed(50_000, 2, 6);
        d.noise(1.0);
        d.drift(offset, offset);
        d.assertMatchesTruth(d.run(c, 512), c);
        Disturbed past = new Disturbed(50_000, 1, 6);
        past.drift(1.2 * offset, 1.2 * offset);
        assertThat(past.run(c, 512)).singleElement().satisfies(r -> assertThat(r.verdict()).isEqualTo(Verdict.NO_GO));
    }

    @ParameterizedTest(name = "offset {0} N·m")
    @ValueSource(doubles = {9.0, -9.0})
    void theFirstZeroIsTheIdleBeforeTheFirstRundown(double offset) {
        // one block of idle, then the rundown: the zero the peaks are read against is that idle's
        Disturbed d = new Disturbed(50_000, 1, 8);
        d.noise(3.0);
        d.drift(offset, offset);
        int from = d.index(d.rundowns.get(0).get(0).startS()) - 600;
        float[] late = java.util.Arrays.copyOfRange(d.x, from, d.x.length);
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(Disturbed.PROGRAM, BARE_CSV, 50_000, 512, ev);
        for (int off = 0; off < late.length; off += 512) {
            m.onSamples(late, off, Math.min(512, late.length - off), (long) (off * 1e9 / 50_000));
        }
        m.finish();
        assertThat(m.conditioner().zeroNm()).isCloseTo(offset, org.assertj.core.api.Assertions.within(1.0));
        assertThat(ev.results).singleElement().satisfies(r -> {
            assertThat(r.blows()).isEqualTo(d.rundowns.get(0).size());
            assertThat(r.faults()).isZero();
        });
    }
}
