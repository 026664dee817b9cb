package hammerstep.app;

import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.io.File;

import static org.assertj.core.api.Assertions.assertThat;

/** run, zero and shunt-check end to end on the example station file, with --hardware mock. */
class HardwareCommandsTest {

    static final String STATION = "../config/station.example.yaml";

    @Test
    @DisplayName("run on a machine without GPIO: one line, exit 1")
    void runWithoutGpioSaysSoInOneLine() {
        Assumptions.assumeFalse(new File("/dev/gpiochip0").exists());

        Captured run = Captured.run("run", "--config", STATION);

        assertThat(run.exit()).isEqualTo(1);
        assertThat(run.err().strip()).doesNotContain("\n").startsWith("no GPIO on this machine");
    }

    @Test
    void runOnMockHardwareEndsAfterTheBoundedTime(@org.junit.jupiter.api.io.TempDir java.nio.file.Path dir)
            throws Exception {
        // a copy whose journal is in dir: the example's /var/lib/hammerstep is for a real station
        Captured run = Captured.run("run", "--config", RunDeliveryTest.station(dir, "").toString(),
                "--hardware", "mock", "--exit-after", "0.5");

        assertThat(run.exit()).isZero();
        assertThat(run.err()).isEmpty();
    }

    @Test
    @DisplayName("zero on the mock transducer finds its 1200-count offset: 0.559 N·m of 500")
    void zeroFindsTheSimulatedOffset() {
        Captured run = Captured.run("zero", "--config", STATION, "--hardware", "mock", "--seconds", "0.2");

        // 1200 counts x 500 / (2^23 x 64 x 0.002) = 0.5588 N.m
        assertThat(run.exit()).as(run.out() + run.err()).isZero();
        // the simulation's noise is +-20 counts, so the mean of a few thousand samples is 1200 +- 1
        assertThat(run.out()).containsPattern("zero: (1199|1200|1201) counts = 0\\.55[89]\\d N·m")
                .contains("within ±2 %").containsPattern("transducer.zero_counts: (1199|1200|1201) ");
    }

    @Test
    @DisplayName("shunt-check expects 0.8735 mV/V for 100 kΩ on a 350 Ω arm and measures it on the mock (bridge basics, derived: Vo/E = R / (2R + 4Rs))")
    void shuntCheckAgreesWithTheBridgeFormula() {
        Captured run = Captured.run("shunt-check", "--config", STATION, "--hardware", "mock", "--seconds", "0.2");

        assertThat(run.exit()).as(run.out() + run.err()).isZero();
        assertThat(run.out()).contains("expected: 100000 Ω across a 350 Ω arm gives 0.8735 mV/V = 218.37 N·m of 500 N·m")
                .contains("measured: 0.873").contains("within ±0.5 %");
    }

    @Test
    void aShuntDeviationThatRoundsToZeroCarriesNoSign() {
        assertThat(ShuntCheckCommand.signedPercent(-0.004)).isEqualTo("0.00");
        assertThat(ShuntCheckCommand.signedPercent(0.004)).isEqualTo("0.00");
        assertThat(ShuntCheckCommand.signedPercent(-0.006)).isEqualTo("-0.01");
        assertThat(ShuntCheckCommand.signedPercent(0.25)).isEqualTo("+0.25");
    }

    @Test
    void checkAcceptsTheExampleStation() {
        Captured run = Captured.run("check", STATION, "../config/patterns");

        assertThat(run.exit()).as(run.err()).isZero();
    }
}
