package hammerstep.analysis;

/**
 * Capability figures of one characteristic against its two-sided specification:
 * Cm = (USL − LSL) / 6s and Cmk = min(USL − x̄, x̄ − LSL) / 3s, with s the sample standard
 * deviation (n − 1). These are the machine capability indices of VDI/VDE 2645-2 style studies
 * (ISO 22514-3 style indices); a study usually asks Cm and Cmk ≥ {@value #REQUIRED} on 25 to 50
 * tightenings (common practice, from memory of the guideline).
 *
 * @param n    number of values
 * @param mean arithmetic mean; NaN when n = 0
 * @param sd   sample standard deviation; NaN when n &lt; 2
 * @param cm   NaN when n &lt; 2; +∞ when all values are equal
 * @param cmk  NaN when n &lt; 2; ±∞ when all values are equal (negative when the mean lies outside)
 */
public record Capability(int n, double mean, double sd, double lsl, double usl, double cm, double cmk) {

    /** The index a machine capability study usually asks for (VDI/VDE 2645-2 style; memory). */
    public static final double REQUIRED = 1.67;

    /** The smallest study the guideline usually asks for (memory). */
    public static final int MIN_STUDY = 25;

    /** Figures of {@code values} against [lsl, usl]; two-pass mean and variance for accuracy. */
    public static Capability of(double[] values, double lsl, double usl) {
        int n = values.length;
        if (n == 0) {
            return new Capability(0, Double.NaN, Double.NaN, lsl, usl, Double.NaN, Double.NaN);
        }
        double sum = 0;
        for (double v : values) {
            sum += v;
        }
        double mean = sum / n;
        if (n < 2) {
            return new Capability(1, mean, Double.NaN, lsl, usl, Double.NaN, Double.NaN);
        }
        double ss = 0;
        double comp = 0;
        for (double v : values) {
            double d = v - mean;
            ss += d * d;
            comp += d;
        }
        double variance = (ss - comp * comp / n) / (n - 1);
        double sd = Math.sqrt(Math.max(0, variance));
        double nearest = Math.min(usl - mean, mean - lsl);
        double cm;
        double cmk;
        if (sd == 0) {
            cm = Double.POSITIVE_INFINITY;
            cmk = nearest >= 0 ? Double.POSITIVE_INFINITY : Double.NEGATIVE_INFINITY;
        } else {
            cm = (usl - lsl) / (6 * sd);
            cmk = nearest / (3 * sd);
        }
        return new Capability(n, mean, sd, lsl, usl, cm, cmk);
    }

    /** True when Cm is known and below {@link #REQUIRED}. */
    public boolean cmLow() {
        return !Double.isNaN(cm) && cm < REQUIRED;
    }

    /** True when Cmk is known and below {@link #REQUIRED}. */
    public boolean cmkLow() {
        return !Double.isNaN(cmk) && cmk < REQUIRED;
    }
}
