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
 * the samples {@code p .. p+w−1} are predicted by the quintic through the three samples before and
 * the three after (the cubic through two and two for w above 2); the excursion is an impulse when every one of them leaves its prediction, on the same
 * side, by more than the level plus 10 % of the largest |torque| among the prediction and the six samples
 * around. Of the widths that pass, the one whose
 * smallest departure is largest wins, and its samples are replaced by the prediction. Over a strike
 * of 0.5 ms even at 20 kHz (10 samples a lobe) the quintic is off by well under 1 % of the peak, so strikes,
 * their rebound and their ringing are left alone; the 10 % term keeps it so with margin where the
 * ringing of a stiff joint is sampled coarsely.
 *
 * <p>Works in place on a caller's array; allocation-free, holds nothing from one call to the next.
 * Of two neighbouring candidates the one departing further wins: a sample next to an impulse departs
 * from a curve bent by the impulse itself.
 */
public final class ImpulseRejector {

    /** The longest excursion that is an impulse rather than a pulse, ms (well under a strike's 0.5 ms). */
    public static final double MAX_IMPULSE_MS = 0.1;
    /** Samples of context the test needs before an impulse. */
    public static final int HISTORY = 3;
    /** Part of the predicted level added to the impulse level, so that large strikes need a larger departure. */
    public static final double RELATIVE = 0.1;

    private final float level;
    private final int maxWidth;
    private final double[] pred;

    /** @param levelNm smallest departure that counts as an impulse; must be positive */
    public ImpulseRejector(double levelNm, double rateHz) {
        if (!(levelNm > 0)) {
            throw new IllegalArgumentException("impulse level must be positive");
        }
        this.level = (float) levelNm;
        this.maxWidth = maxWidthFor(rateHz);
        this.pred = new double[maxWidth];
    }

    /** The widest impulse at a rate: 0.1 ms, and at least 2 samples. */
    public static int maxWidthFor(double rateHz) {
        return Math.max(2, (int) Math.round(MAX_IMPULSE_MS * 1e-3 * rateHz));
    }

    /**
     * Samples of context the test needs after an impulse's first sample: the widest impulse, three
     * more, and one for the comparison with the candidate starting a sample later.
     */
    public int lookAhead() {
        return maxWidth + 4;
    }

    /** The smallest departure that counts as an impulse, N·m. */
    public float level() {
        return level;
    }

    public int maxWidth() {
        return maxWidth;
    }

    /**
     * Replaces every impulse that starts in {@code [from, to)} of {@code s}. The array must hold
     * {@link #HISTORY} samples before {@code from} and {@code lookAhead() − 1} from {@code to} on.
     * Every sample's bend is looked at; a caller that already knows no bend there reaches the level
     * (the conditioner finds the largest in its one pass over the block) need not call it at all.
     *
     * @return how many impulses were replaced
     */
    public int reject(float[] s, int from, int to) {
        float lvl = level;
        int found = 0;
        int p = from;
        while (p < to) {
            float d2 = s[p] - 2f * s[p - 1] + s[p - 2];
            if (d2 < lvl && d2 > -lvl) {
                p++;
                continue;
            }
            int w = widthAt(s, p);
            if (w > 0) {
                // a sample next to an impulse departs from a curve bent by the impulse itself: of two
                // neighbouring candidates the one departing further is the impulse
                double here = margin;
                if (widthAt(s, p + 1) > 0 && margin > here) {
                    w = 0;
                }
            }
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

    /** The smallest departure beyond the threshold of the last {@link #widthAt} that found an impulse. */
    private double margin;

    /**
     * The width of the impulse starting at {@code p}, or 0 when the samples there are no impulse;
     * sets {@link #margin}.
     */
    private int widthAt(float[] s, int p) {
        int best = 0;
        double bestMargin = 0;
        for (int w = 1; w <= maxWidth; w++) {
            double around = Math.max(Math.max(Math.abs(s[p - 3]), Math.abs(s[p - 2])),
                    Math.max(Math.abs(s[p - 1]), Math.max(Math.abs(s[p + w]), Math.max(Math.abs(s[p + w + 1]),
                            Math.abs(s[p + w + 2])))));
            double margin = Double.POSITIVE_INFINITY;
            int sign = 0;
            for (int k = 0; k < w; k++) {
                double pred = predict(s, p, w, k);
                double r = s[p + k] - pred;
                int sk = r > 0 ? 1 : -1;
                if (sign == 0) {
                    sign = sk;
                }
                double excess = Math.abs(r) - (level + RELATIVE * Math.max(around, Math.abs(pred)));
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
        margin = bestMargin;
        return best;
    }

    private void replace(float[] s, int p, int w) {
        // predictions first: they read the samples around the impulse, not inside it
        for (int k = 0; k < w; k++) {
            pred[k] = predict(s, p, w, k);
        }
        for (int k = 0; k < w; k++) {
            s[p + k] = (float) pred[k];
        }
    }

    /**
     * The prediction at {@code p+k} for an impulse of {@code w} samples at {@code p}: for one or two
     * samples the quintic through the three samples on either side, which follows a strike's crest
     * and the ringing on it closely enough that the replaced samples keep the peak; for wider ones
     * the cubic through two on either side, which over a wider gap carries less of the noise of the
     * samples it is drawn through (about 1.9 times their noise at the middle of a 5-sample gap,
     * where the quintic would carry several times it).
     */
    private static double predict(float[] s, int p, int w, int k) {
        int side = w <= 2 ? 3 : 2;
        int nodes = 2 * side;
        double sum = 0;
        for (int i = 0; i < nodes; i++) {
            int ni = i < side ? i - side : w + i - side;
            double l = 1;
            for (int j = 0; j < nodes; j++) {
                if (j != i) {
                    int nj = j < side ? j - side : w + j - side;
                    l *= (double) (k - nj) / (ni - nj);
                }
            }
            sum += l * s[p + ni];
        }
        return sum;
    }
}
