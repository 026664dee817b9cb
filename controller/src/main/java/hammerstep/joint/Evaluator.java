package hammerstep.joint;

import hammerstep.signal.SignalFaults;

import java.util.ArrayList;
import java.util.List;

/** Judges a rundown's figures against its program. Pure; called once per rundown. */
public final class Evaluator {

    private Evaluator() {
    }

    /**
     * The final torque per {@code rule} from the peaks in order; 0 when there are none.
     * {@code maxPeakNm} and {@code lastThree} cover blows beyond the stored array.
     */
    static double finalTorque(FinalTorque rule, int blows, double maxPeakNm, double[] lastThree) {
        if (blows == 0) {
            return 0.0;
        }
        switch (rule) {
            case MAX_PEAK:
                return maxPeakNm;
            case LAST_PEAK:
                return lastThree[(blows - 1) % 3];
            case RESIDUAL_ESTIMATE:
                throw new IllegalArgumentException("the residual estimate is not taken from the peaks");
            default:
                int n = Math.min(3, blows);
                double sum = 0;
                for (int k = 0; k < n; k++) {
                    sum += lastThree[(blows - 1 - k) % 3];
                }
                return sum / n;
        }
    }

    /** The reasons a rundown is NO-GO, in a fixed order; empty for GO. */
    public static List<Reason> reasons(JointProgram p, int blows, double finalTorqueNm, boolean cut,
                                       int firstBlowAtMin, int faults) {
        return reasons(p, blows, finalTorqueNm, cut, firstBlowAtMin, faults, true);
    }

    /**
     * As above; {@code hasResidual} says whether the rundown has a residual estimate. A program that
     * judges on it ({@link FinalTorque#RESIDUAL_ESTIMATE}) gets {@link Reason#RESIDUAL_UNKNOWN} instead of
     * the torque window when there is none.
     */
    public static List<Reason> reasons(JointProgram p, int blows, double finalTorqueNm, boolean cut,
                                       int firstBlowAtMin, int faults, boolean hasResidual) {
        List<Reason> reasons = new ArrayList<>(4);
        if (p.finalTorque() == FinalTorque.RESIDUAL_ESTIMATE && !hasResidual) {
            reasons.add(Reason.RESIDUAL_UNKNOWN);
        } else {
            if (finalTorqueNm < p.torque().minNm()) {
                reasons.add(Reason.TORQUE_LOW);
            }
            if (finalTorqueNm > p.torque().maxNm()) {
                reasons.add(Reason.TORQUE_HIGH);
            }
        }
        if (blows < p.blows().min()) {
            reasons.add(Reason.BLOWS_FEW);
        }
        if (blows > p.blows().max()) {
            reasons.add(Reason.BLOWS_MANY);
        }
        if (cut) {
            reasons.add(Reason.TIME_LONG);
        }
        if (p.rehitBlows() > 0 && firstBlowAtMin > 0 && firstBlowAtMin <= p.rehitBlows()) {
            reasons.add(Reason.REHIT);
        }
        if (faults != 0) {
            reasons.add(Reason.SENSOR_FAULT);
        }
        return List.copyOf(reasons);
    }

    static String describe(int faults) {
        return String.join(",", SignalFaults.names(faults));
    }
}
