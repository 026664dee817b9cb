package hammerstep.analysis;

/**
 * Student's t distribution: the cumulative probability through the regularized incomplete beta
 * function (continued fraction, modified Lentz), the quantile by bisection on it. Accurate to
 * about 1e-10 for the degrees of freedom an audit study has (1 and up).
 */
public final class StudentT {

    private static final double EPS = 1e-15;
    private static final double TINY = 1e-300;

    private StudentT() {
    }

    /** P(T ≤ t) for {@code dof} degrees of freedom. */
    public static double cdf(double t, double dof) {
        if (!(dof > 0)) {
            throw new IllegalArgumentException("degrees of freedom must be positive, got " + dof);
        }
        if (Double.isNaN(t)) {
            return Double.NaN;
        }
        if (Double.isInfinite(t)) {
            return t > 0 ? 1 : 0;
        }
        double x = dof / (dof + t * t);
        double tail = 0.5 * regularizedBeta(x, dof / 2, 0.5);
        return t > 0 ? 1 - tail : tail;
    }

    /** The t with P(T ≤ t) = p, for 0 &lt; p &lt; 1. */
    public static double quantile(double p, double dof) {
        if (!(p > 0 && p < 1)) {
            throw new IllegalArgumentException("probability must lie strictly between 0 and 1, got " + p);
        }
        if (p < 0.5) {
            return -quantile(1 - p, dof);
        }
        if (p == 0.5) {
            return 0;
        }
        double lo = 0;
        double hi = 1;
        while (cdf(hi, dof) < p) {
            lo = hi;
            hi *= 2;
            if (hi > 1e12) {
                return Double.POSITIVE_INFINITY;
            }
        }
        for (int i = 0; i < 200 && hi - lo > 1e-13 * hi; i++) {
            double mid = 0.5 * (lo + hi);
            if (cdf(mid, dof) < p) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    /** I_x(a, b), the regularized incomplete beta function. */
    static double regularizedBeta(double x, double a, double b) {
        if (x <= 0) {
            return 0;
        }
        if (x >= 1) {
            return 1;
        }
        double lnFront = lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log1p(-x);
        if (x < (a + 1) / (a + b + 2)) {
            return Math.exp(lnFront) * continuedFraction(x, a, b) / a;
        }
        return 1 - Math.exp(lnFront) * continuedFraction(1 - x, b, a) / b;
    }

    /** The continued fraction of the incomplete beta function (modified Lentz). */
    private static double continuedFraction(double x, double a, double b) {
        double c = 1;
        double d = 1 - (a + b) * x / (a + 1);
        d = 1 / (Math.abs(d) < TINY ? TINY : d);
        double h = d;
        for (int m = 1; m <= 10_000; m++) {
            int m2 = 2 * m;
            double num = m * (b - m) * x / ((a + m2 - 1) * (a + m2));
            d = 1 + num * d;
            d = 1 / (Math.abs(d) < TINY ? TINY : d);
            c = 1 + num / c;
            c = Math.abs(c) < TINY ? TINY : c;
            h *= d * c;
            num = -(a + m) * (a + b + m) * x / ((a + m2) * (a + m2 + 1));
            d = 1 + num * d;
            d = 1 / (Math.abs(d) < TINY ? TINY : d);
            c = 1 + num / c;
            c = Math.abs(c) < TINY ? TINY : c;
            double step = d * c;
            h *= step;
            if (Math.abs(step - 1) < EPS) {
                break;
            }
        }
        return h;
    }

    /** ln Γ(x) for x &gt; 0 (Lanczos approximation, g = 7, 9 terms). */
    static double lnGamma(double x) {
        if (x < 0.5) {
            return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - lnGamma(1 - x);
        }
        double[] c = {0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
                -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
                1.5056327351493116e-7};
        double z = x - 1;
        double sum = c[0];
        for (int i = 1; i < c.length; i++) {
            sum += c[i] / (z + i);
        }
        double t = z + 7.5;
        return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
    }
}
