package hammerstep.signal;

/**
 * Analytic blow lobes with a known answer, drawn sample by sample (no noise unless added):
 * <ul>
 *   <li>{@link #elastic}: a half-sine, a blow on a stuck nut (an elastic strike on a torsional spring:
 *       the torque follows a half-sine, any dynamics textbook);</li>
 *   <li>{@link #turning}: a blow that breaks the nut free: an elastic rise to the breakaway torque, a
 *       sudden drop to the friction torque the nut slides against (the light nut darts off and the spring
 *       unloads at once), a flat slide at that torque, and an
 *       elastic fall (a quarter-cosine) once the nut has stuck again. Over the slide the torque is the
 *       friction torque, so the slide's mean torque is that torque (the nut starts and ends it at rest:
 *       impulse and momentum);</li>
 *   <li>{@link #snapBack}: a stiff strike that unloads geometrically from its peak, each sample a fixed
 *       fraction of the one before (a damped spring let go at its peak): no flat run, no knee, its fall
 *       slowing down all the way into the floor;</li>
 *   <li>{@link #hydraulic}: an oil-pulse pulse: a rise, a short flat top, and an exponential tail (the oil
 *       draining through the valve).</li>
 * </ul>
 */
public final class BlowForms {

    private BlowForms() {
    }

    /** A half-sine of {@code peakNm} lasting {@code samples}, with {@code pad} zeros either side. */
    public static float[] elastic(double peakNm, int samples, int pad) {
        float[] x = new float[samples + 2 * pad];
        for (int i = 0; i < samples; i++) {
            x[pad + i] = (float) (peakNm * Math.sin(Math.PI * (i + 0.5) / samples));
        }
        return x;
    }

    /**
     * A turning blow: rise (quarter-sine) to {@code breakawayNm} over {@code riseSamples}, a drop to
     * {@code frictionNm} within one sample, a slide at {@code frictionNm} for {@code slideSamples}, then a
     * quarter-cosine fall to zero over {@code fallSamples}; {@code pad} zeros either side.
     */
    public static float[] turning(double breakawayNm, double frictionNm, int riseSamples, int slideSamples,
                                  int fallSamples, int pad) {
        float[] x = new float[riseSamples + slideSamples + fallSamples + 2 * pad];
        int i = pad;
        for (int k = 1; k <= riseSamples; k++) {
            x[i++] = (float) (breakawayNm * Math.sin(0.5 * Math.PI * k / riseSamples));
        }
        for (int k = 0; k < slideSamples; k++) {
            x[i++] = (float) frictionNm;
        }
        for (int k = 1; k <= fallSamples; k++) {
            x[i++] = (float) (frictionNm * Math.cos(0.5 * Math.PI * k / fallSamples));
        }
        return x;
    }

    /**
     * A snap-back: a quarter-sine rise to {@code peakNm} over {@code riseSamples}, then {@code peakNm·ratio^k}
     * for k = 1, 2, … down to 1 % of the peak; {@code pad} zeros either side.
     */
    public static float[] snapBack(double peakNm, int riseSamples, double ratio, int pad) {
        int tail = (int) Math.ceil(Math.log(0.01) / Math.log(ratio));
        float[] x = new float[riseSamples + tail + 2 * pad];
        int i = pad;
        for (int k = 1; k <= riseSamples; k++) {
            x[i++] = (float) (peakNm * Math.sin(0.5 * Math.PI * k / riseSamples));
        }
        for (int k = 1; k <= tail; k++) {
            x[i++] = (float) (peakNm * Math.pow(ratio, k));
        }
        return x;
    }

    /**
     * An oil pulse: a quarter-sine rise to {@code peakNm} over {@code riseSamples}, flat for 5 samples,
     * then an exponential tail with time constant {@code tauSamples} down to 1 % of the peak.
     */
    public static float[] hydraulic(double peakNm, int riseSamples, double tauSamples, int pad) {
        int tail = (int) Math.ceil(tauSamples * Math.log(100));
        float[] x = new float[riseSamples + 5 + tail + 2 * pad];
        int i = pad;
        for (int k = 1; k <= riseSamples; k++) {
            x[i++] = (float) (peakNm * Math.sin(0.5 * Math.PI * k / riseSamples));
        }
        for (int k = 0; k < 5; k++) {
            x[i++] = (float) peakNm;
        }
        for (int k = 1; k <= tail; k++) {
            x[i++] = (float) (peakNm * Math.exp(-k / tauSamples));
        }
        return x;
    }

    /** {@code parts} one after the other. */
    public static float[] concat(float[]... parts) {
        int n = 0;
        for (float[] p : parts) {
            n += p.length;
        }
        float[] x = new float[n];
        int at = 0;
        for (float[] p : parts) {
            System.arraycopy(p, 0, x, at, p.length);
            at += p.length;
        }
        return x;
    }

    /** {@code x} with its sign flipped (a left-hand thread). */
    public static float[] negated(float[] x) {
        float[] y = new float[x.length];
        for (int i = 0; i < x.length; i++) {
            y[i] = -x[i];
        }
        return y;
    }
}
