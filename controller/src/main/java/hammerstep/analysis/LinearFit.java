package hammerstep.analysis;

/**
 * Least-squares line y = a + b·x through paired values, with the figures needed to state its
 * uncertainty: the standard error of estimate s_e = √(SSE / (n − 2)), the standard errors of
 * a and b, Pearson's r, and the prediction interval of a single new y at x,
 * ŷ(x) ± t(1 − α/2, n − 2) · s_e · √(1 + 1/n + (x − x̄)² / Sxx).
 */
public record LinearFit(int n, double meanX, double meanY, double sxx, double syy, double sxy,
                        double a, double b, double r, double se, double seA, double seB) {

    /** Fits {@code y} on {@code x}; needs at least 3 pairs and some spread in x. */
    public static LinearFit of(double[] x, double[] y) {
        int n = x.length;
        if (n != y.length) {
            throw new IllegalArgumentException(n + " x values but " + y.length + " y values");
        }
        if (n < 3) {
            throw new IllegalArgumentException("a line with its uncertainty needs at least 3 pairs, got " + n);
        }
        double mx = 0;
        double my = 0;
        for (int i = 0; i < n; i++) {
            mx += x[i];
            my += y[i];
        }
        mx /= n;
        my /= n;
        double sxx = 0;
        double syy = 0;
        double sxy = 0;
        for (int i = 0; i < n; i++) {
            double dx = x[i] - mx;
            double dy = y[i] - my;
            sxx += dx * dx;
            syy += dy * dy;
            sxy += dx * dy;
        }
        if (!(sxx > 0)) {
            throw new IllegalArgumentException("all x values are equal: no line can be fitted");
        }
        double b = sxy / sxx;
        double a = my - b * mx;
        double sse = Math.max(0, syy - b * sxy);
        double se = Math.sqrt(sse / (n - 2));
        double r = syy > 0 ? sxy / Math.sqrt(sxx * syy) : Double.NaN;
        double seB = se / Math.sqrt(sxx);
        double seA = se * Math.sqrt(1.0 / n + mx * mx / sxx);
        return new LinearFit(n, mx, my, sxx, syy, sxy, a, b, r, se, seA, seB);
    }

    public double predict(double x) {
        return a + b * x;
    }

    /** Half-width of the prediction interval of one new y at x, for a two-sided {@code confidence} (e.g. 0.95). */
    public double predictionHalfWidth(double x, double confidence) {
        double t = StudentT.quantile(0.5 + confidence / 2, n - 2);
        double dx = x - meanX;
        return t * se * Math.sqrt(1 + 1.0 / n + dx * dx / sxx);
    }

    /** True when the slope differs from zero at the two-sided {@code confidence}: |b| &gt; t · SE(b). */
    public boolean slopeSignificant(double confidence) {
        return Math.abs(b) > StudentT.quantile(0.5 + confidence / 2, n - 2) * seB;
    }
}
