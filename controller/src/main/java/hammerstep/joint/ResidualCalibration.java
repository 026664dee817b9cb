package hammerstep.joint;

import java.time.LocalDate;

/**
 * A program's calibration of the residual estimate by audits ({@code hammerstep audit}): the audited
 * residual torque fitted against the default estimate as {@code audit = factor × estimate + offset},
 * with the 95 % band half-width that fit leaves. Carried in the program file under
 * {@code residual_calibration}.
 *
 * @param factor   slope of the fit
 * @param offsetNm intercept of the fit, N·m
 * @param bandNm   half-width of the 95 % band of a calibrated estimate, N·m
 * @param audits   number of audits the fit rests on
 * @param date     the day of the fit
 */
public record ResidualCalibration(double factor, double offsetNm, double bandNm, int audits, LocalDate date) {

    /** Fewest audits a calibration may rest on. */
    public static final int MIN_AUDITS = 2;
    /** Plausible factors: the estimate is off by more than a factor of two only when something else is wrong. */
    public static final double MIN_FACTOR = 0.5;
    public static final double MAX_FACTOR = 2.0;

    /** The calibrated estimate from the default one. */
    public double apply(double estimateNm) {
        return factor * estimateNm + offsetNm;
    }
}
