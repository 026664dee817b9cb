package hammerstep.app;

import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code replay} refuses a sample rate that is no finite number from 100 Hz to 10 MHz, and an
 * over-range, low-pass or flat-line setting that is zero, negative or no number: one line, exit 2,
 * before any trace is read, and never a replay with nonsense start times.
 */
class ReplayOptionsTest {

    private static final String GOOD = "src/test/resources/programs/good.yaml";

    @TempDir
    Path dir;

    private String trace() throws Exception {
        Path p = dir.resolve("t.f32");
        Files.write(p, new byte[4 * 1000]);
        return p.toString();
    }

    @ParameterizedTest(name = "--rate {0}")
    @ValueSource(strings = {"0", "-5", "1e-9", "99.9", "Infinity", "-Infinity", "NaN", "1.1e7", "fast", ""})
    void aRateOutsideOneHundredHzToTenMegahertzIsRefused(String rate) throws Exception {
        Captured c = Captured.run("replay", trace(), "--program", GOOD, "--rate", rate);

        assertThat(c.exit()).isEqualTo(2);
        assertThat(c.err().strip()).isEqualTo("--rate " + rate + ": expected a sample rate in Hz from 100 to 10000000 (10 MHz)");
        assertThat(c.out()).isEmpty();
    }

    @ParameterizedTest(name = "--rate {0}")
    @ValueSource(strings = {"100", "20000", "1e7"})
    void ratesAtAndInsideTheLimitsRun(String rate) throws Exception {
        Captured c = Captured.run("replay", trace(), "--program", GOOD, "--rate", rate);

        assertThat(c.exit()).as(c.err()).isZero();
    }

    @ParameterizedTest(name = "{0} {1}")
    @org.junit.jupiter.params.provider.CsvSource({
            "--over-range, 0, N·m", "--over-range, -300, N·m", "--over-range, NaN, N·m", "--over-range, lots, N·m",
            "--over-range, Infinity, N·m",
            "--low-pass, 0, Hz", "--low-pass, -1000, Hz", "--low-pass, NaN, Hz", "--low-pass, 2k, Hz",
            "--flat-line-ms, 0, ms", "--flat-line-ms, -2, ms"})
    void aZeroNegativeOrNonNumericSettingIsRefused(String option, String value, String unit) throws Exception {
        Captured c = Captured.run("replay", trace(), "--program", GOOD, "--rate", "20000", option, value);

        assertThat(c.exit()).isEqualTo(2);
        assertThat(c.err().strip()).isEqualTo(option + " " + value + ": expected a number of " + unit + " above 0");
        assertThat(c.out()).isEmpty();
    }

    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {"--over-range=1000", "--low-pass=2000", "--flat-line-ms=5"})
    void positiveSettingsRun(String option) throws Exception {
        Captured c = Captured.run("replay", trace(), "--program", GOOD, "--rate", "20000", option);

        assertThat(c.exit()).as(c.err()).isZero();
    }
}
