package hammerstep.sequence;

/**
 * Tightening orders generated for a bolt circle. Positions are numbered 1..n clockwise; the
 * returned arrays hold 0-based position indices.
 *
 * <p>Cross (star) order, the rule for any count n:
 * <ul>
 *   <li>n even: take the cross order of n/2 and follow each bolt {@code a} by the bolt opposite it,
 *       {@code a + n/2};</li>
 *   <li>n odd: the star polygon that jumps (n−1)/2 positions each time, starting at 1 (for 5 studs
 *       1-3-5-2-4; the jump is always coprime with n, so every bolt is visited once);</li>
 *   <li>n = 1: 1.</li>
 * </ul>
 * For 4, 8, 12 and 16 bolts this gives the ASME PCC-1 legacy cross pattern exactly (see the tests),
 * for 6 bolts 1-4-2-5-3-6 and for 10 bolts 1-6-3-8-5-10-2-7-4-9.
 */
public final class Order {

    private Order() {
    }

    /** The cross (star) order for {@code n} bolts. */
    public static int[] cross(int n) {
        if (n < 1) {
            throw new IllegalArgumentException("a bolt circle needs at least one bolt: " + n);
        }
        if (n == 1) {
            return new int[] {0};
        }
        if (n % 2 == 0) {
            int half = n / 2;
            int[] inner = cross(half);
            int[] order = new int[n];
            for (int k = 0; k < half; k++) {
                order[2 * k] = inner[k];
                order[2 * k + 1] = inner[k] + half;
            }
            return order;
        }
        int jump = (n - 1) / 2;
        int[] order = new int[n];
        for (int k = 0; k < n; k++) {
            order[k] = (int) ((long) k * jump % n);
        }
        return order;
    }

    /** Round the circle: 1, 2, ..., n. */
    public static int[] circular(int n) {
        if (n < 1) {
            throw new IllegalArgumentException("a bolt circle needs at least one bolt: " + n);
        }
        int[] order = new int[n];
        for (int k = 0; k < n; k++) {
            order[k] = k;
        }
        return order;
    }
}
