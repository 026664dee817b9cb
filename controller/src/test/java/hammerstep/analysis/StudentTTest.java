package hammerstep.analysis;

import org.hipparchus.distribution.continuous.TDistribution;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class StudentTTest {

    @ParameterizedTest(name = "t({0}, {1} dof) = {2}")
    @DisplayName("quantiles match the printed Student t table (any statistics handbook, e.g. NIST/SEMATECH e-Handbook 1.4.7.2; 3 decimals)")
    @CsvSource({
            "0.975, 1, 12.706",
            "0.975, 2, 4.303",
            "0.975, 3, 3.182",
            "0.975, 10, 2.228",
            "0.975, 30, 2.042",
            "0.95, 5, 2.015",
            "0.995, 20, 2.845"
    })
    void matchesTheTable(double p, int dof, double table) {
        assertThat(StudentT.quantile(p, dof)).isCloseTo(table, within(0.0006));
    }

    @ParameterizedTest(name = "p={0}, dof={1}")
    @DisplayName("cdf and quantile agree with Hipparchus (test oracle)")
    @CsvSource({"0.975, 1", "0.975, 3", "0.9, 7", "0.6, 2", "0.999, 40", "0.025, 12", "0.975, 250"})
    void agreesWithHipparchus(double p, int dof) {
        TDistribution oracle = new TDistribution(dof);

        assertThat(StudentT.quantile(p, dof)).isCloseTo(oracle.inverseCumulativeProbability(p), within(1e-8));
        assertThat(StudentT.cdf(1.3, dof)).isCloseTo(oracle.cumulativeProbability(1.3), within(1e-10));
    }
}
