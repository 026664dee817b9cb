package hammerstep.sim.physics;

import org.junit.jupiter.api.Test;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** The study's arithmetic: the audit fit and the error statistics. */
class ResidualStudyReportTest {

    @Test
    void auditFitRecoversFactorAndOffsetOfAnExactLine() throws Exception {
        ResidualStudy.Program p = ResidualStudy.calibration().get(0);
        List<ResidualStudy.Run> audits = List.of(run(p, 1, 0.6 * 300 + 20, 300), run(p, 2, 0.6 * 400 + 20, 400),
                run(p, 3, 0.6 * 500 + 20, 500));
        double[] fit = ResidualStudyReport.fit(ResidualStudyReport.Figure.MAX_PEAK, audits);
        assertThat(fit[0]).isCloseTo(0.6, within(1e-9));
        assertThat(fit[1]).isCloseTo(20.0, within(1e-6));
        // no spread in the figure: a factor alone
        double[] flat = ResidualStudyReport.fit(ResidualStudyReport.Figure.MAX_PEAK, List.of(run(p, 1, 200, 400),
                run(p, 2, 210, 400)));
        assertThat(flat[0]).isCloseTo(0.5125, within(1e-9));
        assertThat(flat[1]).isZero();
    }

    @Test
    void errorsAreRelativeToTheTruthAndTwoSigmaIsTwiceTheSampleSd() throws Exception {
        ResidualStudy.Program p = ResidualStudy.calibration().get(0);
        // truth ÷ peak: 0.5, 0.5, 1.1, 0.9 → calibration ratio 0.75; the fifth run has no peak
        List<ResidualStudy.Run> runs = List.of(run(p, 1, 200, 400), run(p, 2, 300, 600), run(p, 3, 220, 200),
                run(p, 4, 180, 200), run(p, 5, 300, Double.NaN));
        ResidualStudyReport report = new ResidualStudyReport(runs);
        assertThat(report.ratio(ResidualStudyReport.Figure.MAX_PEAK)).isCloseTo(0.75, within(1e-12));
        ResidualStudyReport.Stats s = report.withoutAudits(ResidualStudyReport.Figure.MAX_PEAK, runs);
        assertThat(s.n()).isEqualTo(4);
        assertThat(s.none()).isEqualTo(1);
        double r = report.ratio(ResidualStudyReport.Figure.MAX_PEAK);
        double[] e = {r * 400 / 200 - 1, r * 600 / 300 - 1, r * 200 / 220 - 1, r * 200 / 180 - 1};
        double mean = (e[0] + e[1] + e[2] + e[3]) / 4;
        double v = 0;
        for (double x : e) {
            v += (x - mean) * (x - mean);
        }
        assertThat(s.mean()).isCloseTo(mean, within(1e-12));
        assertThat(s.twoSigma()).isCloseTo(2 * Math.sqrt(v / 3), within(1e-12));
    }

    private static ResidualStudy.Run run(ResidualStudy.Program p, long seed, double truth, double maxPeak) {
        return new ResidualStudy.Run(p, seed, truth, 1, 5, 5, maxPeak, maxPeak, maxPeak, maxPeak, maxPeak, Double.NaN,
                Double.NaN, Double.NaN, "none");
    }
}
