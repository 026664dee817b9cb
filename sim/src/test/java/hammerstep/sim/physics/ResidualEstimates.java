package hammerstep.sim.physics;

import hammerstep.joint.JointResult;
import hammerstep.joint.ResidualEstimate;

/** The controller's residual-torque estimate as a joint result carries it (the study's one link to the estimator). */
final class ResidualEstimates {

    private ResidualEstimates() {
    }

    /** The estimate, N·m; NaN when the result carries none. */
    static double estimateNm(JointResult r) {
        ResidualEstimate e = r.residual();
        return e != null && e.present() ? e.torqueNm() : Double.NaN;
    }

    /** Lower end of the estimate's 95 % band, N·m; NaN when none. */
    static double lowNm(JointResult r) {
        ResidualEstimate e = r.residual();
        return e != null && e.present() ? e.lowNm() : Double.NaN;
    }

    /** Upper end of the estimate's 95 % band, N·m; NaN when none. */
    static double highNm(JointResult r) {
        ResidualEstimate e = r.residual();
        return e != null && e.present() ? e.highNm() : Double.NaN;
    }

    /** Why the result carries no estimate (the estimator's reason); null when it carries one. */
    static String noValueReason(JointResult r) {
        ResidualEstimate e = r.residual();
        if (e == null) {
            return "NO_ESTIMATE_IN_RESULT";
        }
        return e.present() ? null : e.reason().name();
    }
}
