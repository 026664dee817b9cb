package hammerstep.signal;

/**
 * Finds and replaces electrical impulses: excursions of one to a few samples (at most
 * {@link #MAX_IMPULSE_MS}) that leave the signal's course by at least the impulse level and come
 * back. Welders, contactors and drives switching put such spikes of 100 to 400 N·m, of either sign,
 * on a transducer line; a strike cannot make them, because strike pulses last 0.5 ms and more
 * (about 1 to 5 ms; transducer practice, memory), so over a few samples a strike is smooth.
 *
 * <p>The test runs only where the signal bends sharply: where the second difference
 * {@code |x[p] − 2x[p−1] + x[p−2]|} reaches the level. There, for each width w up to the maximum,
 * the samples {@code p .. p+w−1} are predicted by the cubic through the two samples before and the
 * two after; the excursion is an impulse when every one of them leaves its prediction, on the same
 * side, by more than {@code level + 10 % of |prediction|}. Of the widths that pass, the one whose
 * smallest departure is largest wins, and its samples are replaced by the prediction. Over a strike
 * of 0.5 ms even at 20 kHz (10 samples a lobe) the cubic is off by under 1 % of the peak, so strikes,
 * their rebound and their ringing are left alone; the 10 % term keeps it so with margin where the
 * ringing of a stiff joint is sampled coarsely.
 *
 * <p>Works in place on a caller's array; allocation-free, stateless between calls.
 */
public final class ImpulseRejector {

    /** The longest excursion that is an impulse rather than a pulse, ms (well under a strike's 0.5 ms). */
    public static final double MAX_IMPULSE_MS = 0.1;
    /** Samples of context the test needs before an impulse. */
    public static final int HISTORY = 2;
    /** Part of the predicted level added to the impulse level, so that large strikes need a larger departure. */
    public static final double RELATIVE = 0.1;

    private final float level;
    private final int maxWidth;

    /** @param levelNm smallest departure that counts as an impulse; must be positive */
    public ImpulseRejector(double levelNm, double rateHz) {
        if (!(levelNm > 0)) {
            throw new IllegalArgumentException("impulse level must be positive");
        }
        this.level = (float) levelNm;
        this.maxWidth = maxWidthFor(rateHz);
    }

    /** The widest impulse at a rate: 0.1 ms, and at least 2 samples. */
    public static int maxWidthFor(double rateHz) {
        return Math.max(2, (int) Math.round(MAX_IMPULSE_MS * 1e-3 * rateHz));
    }

    /** Samples of context the test needs after an impulse's first sample: the widest impulse and two more. */
    public int lookAhead() {
        return maxWidth + 2;
    }

    public int maxWidth() {
        return maxWidth;
    }

    /**
     * Replaces every impulse that starts in {@code [from, to)} of {@code s}. The array must hold
     * {@link #HISTORY} samples before {@code from} and {@code maxWidth + 1} after {@code to − 1}.
     *
     * @return how many impulses were replaced
     */
    public int reject(float[] s, int from, int to) {
        int found = 0;
        float lvl = level;
        int p = from;
        while (p < to) {
            float d2 = s[p] - 2f * s[p - 1] + s[p - 2];
            if (d2 < lvl && d2 > -lvl) {
                p++;
                continue;
            }
            int w = widthAt(s, p);
            if (w > 0) {
                replace(s, p, w);
                found++;
                p += w;
            } else {
                p++;
            }
        }
        return found;
    }

    /** The width of the impulse starting at {@code p}, or 0 when the samples there are no impulse. */
    private int widthAt(float[] s, int p) {
        int best = 0;
        double bestMargin = 0;
        for (int w = 1; w <= maxWidth; w++) {
            double margin = Double.POSITIVE_INFINITY;
            int sign = 0;
            for (int k = 0; k < w; k++) {
                double pred = predict(s, p, w, k);
                double r = s[p + k] - pred;
                int sk = r > 0 ? 1 : -1;
                if (sign == 0) {
                    sign = sk;
                }
                double excess = Math.abs(r) - (level + RELATIVE * Math.abs(pred));
                if (sk != sign || excess <= 0) {
                    margin = -1;
                    break;
                }
                margin = Math.min(margin, excess);
            }
            if (margin > bestMargin) {
                bestMargin = margin;
                best = w;
            }
        }
        return best;
    }

    private static void replace(float[] s, int p, int w) {
        // predictions first: they read the samples around the impulse, not inside it
        double a = s[p - 2], b = s[p - 1], c = s[p + w], d = s[p + w + 1];
        for (int k = 0; k < w; k++) {
            s[p + k] = (float) cubic(a, b, c, d, w, k);
        }
    }

    private static double predict(float[] s, int p, int w, int k) {
        return cubic(s[p - 2], s[p - 1], s[p + w], s[p + w + 1], w, k);
    }

    /** The cubic through (−2, a), (−1, b), (w, c), (w+1, d), at t = k. */
    private static double cubic(double a, double b, double c, double d, int w, int k) {
        double t = k;
        double n0 = -2, n1 = -1, n2 = w, n3 = w + 1;
        double la = (t - n1) * (t - n2) * (t - n3) / ((n0 - n1) * (n0 - n2) * (n0 - n3));
        double lb = (t - n0) * (t - n2) * (t - n3) / ((n1 - n0) * (n1 - n2) * (n1 - n3));
        double lc = (t - n0) * (t - n1) * (t - n3) / ((n2 - n0) * (n2 - n1) * (n2 - n3));
        double ld = (t - n0) * (t - n1) * (t - n2) / ((n3 - n0) * (n3 - n1) * (n3 - n2));
        return la * a + lb * b + lc * c + ld * d;
    }
}
