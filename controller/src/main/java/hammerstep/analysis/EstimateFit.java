package hammerstep.analysis;

/**
 * Audits fitted against the residual estimate of the same joints (the estimate by the default factor,
 * {@code residual_estimate.uncalibrated_nm}): the calibration a program can carry
 * ({@code residual_calibration}: audit = factor × estimate + offset, with its 95 % band).
 *
 * <p>A line (factor and offset) when at least 3 pairs spread enough for a significant slope; otherwise,
 * as is usual for the joints of one program whose estimates cluster, a factor through zero (offset 0):
 * factor = Σxy / Σx², its residual scatter s with n − 1 degrees of freedom. The band is the half-width of
 * the prediction interval of one new audit: for the line, the widest over the audited estimates; for the
 * factor, t(1 − α/2, n − 1) · s · √(1 + 1/n) at the mean estimate.
 *
 * @param n           pairs (audited joints that carry an estimate)
 * @param line        the fitted line, or null when the factor through zero was used
 * @param factor      slope of the calibration
 * @param offsetNm    intercept of the calibration, N·m (0 for the factor through zero)
 * @param bandNm      half-width of the band of a calibrated estimate, N·m
 * @param seNm        standard error of an audit about the calibration, N·m
 * @param meanEstimateNm mean of the audited joints' estimates, N·m
 * @param meanAuditNm mean of their audits, N·m
 */
public record EstimateFit(int n, LinearFit line, double factor, double offsetNm, double bandNm, double seNm,
                          double meanEstimateNm, double meanAuditNm) {

    /** Fewest pairs a calibration rests on. */
    public static final int MIN_AUDITS = 2;

    /** The fit of {@code audit} on {@code estimate}; null with fewer than {@link #MIN_AUDITS} pairs. */
    public static EstimateFit of(double[] estimate, double[] audit, double confidence) {
        int n = estimate.length;
        if (n < MIN_AUDITS) {
            return null;
        }
        double mx = 0;
        double my = 0;
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            mx += estimate[i];
            my += audit[i];
            lo = Math.min(lo, estimate[i]);
            hi = Math.max(hi, estimate[i]);
        }
        mx /= n;
        my /= n;
        if (n >= 3 && hi > lo) {
            LinearFit f = LinearFit.of(estimate, audit);
            if (f.b() > 0 && f.slopeSignificant(confidence)) {
                double band = Math.max(f.predictionHalfWidth(lo, confidence), f.predictionHalfWidth(hi, confidence));
                return new EstimateFit(n, f, f.b(), f.a(), band, f.se(), mx, my);
            }
        }
        double sxy = 0;
        double sxx = 0;
        for (int i = 0; i < n; i++) {
            sxy += estimate[i] * audit[i];
            sxx += estimate[i] * estimate[i];
        }
        double factor = sxy / sxx;
        double sse = 0;
        for (int i = 0; i < n; i++) {
            double d = audit[i] - factor * estimate[i];
            sse += d * d;
        }
        double s = Math.sqrt(sse / (n - 1));
        double t = StudentT.quantile(0.5 + confidence / 2, n - 1);
        return new EstimateFit(n, null, factor, 0.0, t * s * Math.sqrt(1 + 1.0 / n), s, mx, my);
    }
}
