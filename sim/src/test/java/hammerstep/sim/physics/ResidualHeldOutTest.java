package hammerstep.sim.physics;

import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The held-out study in small (docs/residual-estimate.md): the controller's residual estimate against the
 * simulator's breakaway residual on held-out tools, joints and friction laws it was not tuned on, one rundown per
 * program. Fails when the error grows past the figure the note reports for this subset, with a margin.
 */
class ResidualHeldOutTest {

    /** |mean| + 2σ of the estimate's error on this subset, measured when the note was written (docs/residual-estimate.md). */
    static final double MEASURED_BOUND = 0.272;
    /** Margin over the measured figure before the test fails. */
    static final double MARGIN = 0.03;
    /** Max peak's calibration-set ratio truth ÷ peak (the study's full run, docs/residual-estimate.md). */
    static final double MAX_PEAK_RATIO = 0.722;

    @Test
    void heldOutEstimateStaysWithinTheReportedErrorAndSaysWhenItHasNoValue() throws Exception {
        List<ResidualStudy.Run> runs = new ArrayList<>();
        List<ResidualStudy.Run> hydraulic = new ArrayList<>();
        for (ResidualStudy.Program p : ResidualStudy.heldOut()) {
            if (p.family().equals("oil pulse")) {
                if (p.joint().equals("iso-hard")) {
                    hydraulic.add(ResidualStudy.rundown(p, 1));
                }
                continue;
            }
            runs.add(ResidualStudy.rundown(p, 1));
        }
        for (ResidualStudy.Run r : hydraulic) {
            assertThat(r.estimateNm()).as("oil-pulse rundown %s", r.program().name()).isNaN();
            assertThat(r.noValue()).isEqualTo("HYDRAULIC_PULSES");
        }
        List<Double> estimate = new ArrayList<>();
        List<Double> peak = new ArrayList<>();
        for (ResidualStudy.Run r : runs) {
            if (!Double.isNaN(r.estimateNm())) {
                estimate.add(r.estimateNm() / r.truthNm() - 1);
                peak.add(MAX_PEAK_RATIO * r.maxPeakNm() / r.truthNm() - 1);
            } else {
                assertThat(r.noValue()).as("a run without an estimate says why").isNotNull();
            }
        }
        ResidualStudyReport.Stats e = ResidualStudyReport.Stats.of(estimate, runs.size() - estimate.size());
        ResidualStudyReport.Stats p = ResidualStudyReport.Stats.of(peak, 0);
        System.out.printf(Locale.ROOT, "held-out subset: %d runs, %d with an estimate: estimate %+.1f %% ± %.1f %% (bound %.1f %%),"
                        + " max peak on the same runs %+.1f %% ± %.1f %%%n", runs.size(), e.n(), 100 * e.mean(),
                100 * e.twoSigma(), 100 * e.bound(), 100 * p.mean(), 100 * p.twoSigma());
        assertThat(e.n()).as("runs with an estimate").isGreaterThanOrEqualTo(runs.size() / 3);
        assertThat(e.bound()).as("|mean| + 2σ of the estimate's error").isLessThan(MEASURED_BOUND + MARGIN);
        assertThat(e.bound()).as("the estimate beats the scaled max peak").isLessThan(p.bound());
    }
}
