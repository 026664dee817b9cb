package hammerstep.analysis;

import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class EstimateFitTest {

    /*
     * Worked by hand: estimates 80..120, audits 81, 88, 97, 104, 110. x̄ = 100, ȳ = 96, Sxx = 1000, Sxy = 740:
     * b = 0.74, a = 22; residuals -0.2, -0.6, 1.0, 0.6, -0.8, SSE 2.4, s_e = √(2.4/3) = 0.8944; the widest
     * prediction half-width over the audited estimates, at 80 and 120: t(0.975, 3) = 3.1824 (Student's t
     * table) × 0.8944 × √(1 + 1/5 + 400/1000) = 3.6004.
     */
    @Test
    void spreadEstimatesGiveTheLeastSquaresLineAndItsWidestPredictionBand() {
        EstimateFit f = EstimateFit.of(new double[] {80, 90, 100, 110, 120}, new double[] {81, 88, 97, 104, 110}, 0.95);
        assertThat(f.line()).isNotNull();
        assertThat(f.factor()).isCloseTo(0.74, within(1e-12));
        assertThat(f.offsetNm()).isCloseTo(22.0, within(1e-9));
        assertThat(f.seNm()).isCloseTo(0.8944, within(1e-4));
        assertThat(f.bandNm()).isCloseTo(3.6004, within(1e-3));
        assertThat(f.n()).isEqualTo(5);
    }

    /*
     * Estimates of one program cluster: no slope can be told from the scatter, so a factor through zero.
     * Estimates 200, 201, 199, 200, 200 with audits 1.05 times them plus -1, +1, 0, +0.5, -0.5 N·m:
     * factor = Σxy/Σx², audits scatter about 0.8 N·m around it.
     */
    @Test
    void clusteredEstimatesGiveAFactorThroughZero() {
        double[] x = {200, 201, 199, 200, 200};
        double[] d = {-1, 1, 0, 0.5, -0.5};
        double[] y = new double[5];
        double sxy = 0;
        double sxx = 0;
        for (int i = 0; i < 5; i++) {
            y[i] = 1.05 * x[i] + d[i];
            sxy += x[i] * y[i];
            sxx += x[i] * x[i];
        }
        EstimateFit f = EstimateFit.of(x, y, 0.95);
        assertThat(f.line()).isNull();
        assertThat(f.offsetNm()).isZero();
        assertThat(f.factor()).isCloseTo(sxy / sxx, within(1e-12));
        assertThat(f.factor()).isCloseTo(1.05, within(0.001));
        assertThat(f.seNm()).isBetween(0.6, 1.0);
        // t(0.975, 4) = 2.7764 (Student's t table) × s × √(1 + 1/5)
        assertThat(f.bandNm()).isCloseTo(2.7764 * f.seNm() * Math.sqrt(1.2), within(1e-3));
    }

    @Test
    void oneAuditIsNoCalibration() {
        assertThat(EstimateFit.of(new double[] {200}, new double[] {210}, 0.95)).isNull();
    }
}
