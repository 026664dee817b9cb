package hammerstep.signal;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;

/**
 * Analytic torque signals with a known answer: strikes drawn as half-sine lobes of known peak, with
 * the artefacts a real strike shows (a negative rebound lobe, a re-contact hump, damped ringing),
 * plus noise and an offset. Used to check the detector against ground truth (tests, benchmarks,
 * a quick replay example); the physics simulator is the realistic source.
 */
public final class PulseTrain {

    /**
     * One strike, starting at {@code startS}.
     *
     * @param widthS          duration of the main half-sine lobe
     * @param peakNm          its peak
     * @param reboundFraction amplitude of the negative rebound lobe after it, as a fraction of the peak
     * @param humpFraction    amplitude of a re-contact hump after the rebound, as a fraction of the peak
     * @param ringFraction    amplitude of damped ringing riding on the main lobe's tail
     */
    public record Strike(double startS, double widthS, double peakNm,
                         double reboundFraction, double humpFraction, double ringFraction) {

        /** Time after the start by which the strike and all its artefacts have died out. */
        public double spanS() {
            return widthS + 0.5 * widthS + widthS / 3 + RING_SETTLE_S;
        }
    }

    private static final double RING_HZ = 3000.0;
    private static final double RING_TAU_S = 0.0003;
    private static final double RING_SETTLE_S = 0.0015;

    private PulseTrain() {
    }

    /** Renders strikes into a signal of {@code durationS} at {@code rateHz}. */
    public static float[] render(double rateHz, double durationS, List<Strike> strikes,
                                 double offsetNm, double noiseSdNm, long seed) {
        int n = (int) Math.round(durationS * rateHz);
        double[] x = new double[n];
        for (Strike s : strikes) {
            add(x, rateHz, s);
        }
        Random random = new Random(seed);
        float[] out = new float[n];
        for (int i = 0; i < n; i++) {
            out[i] = (float) (x[i] + offsetNm + (noiseSdNm > 0 ? noiseSdNm * random.nextGaussian() : 0.0));
        }
        return out;
    }

    private static void add(double[] x, double rateHz, Strike s) {
        double w = s.widthS();
        double t0 = s.startS();
        lobe(x, rateHz, t0, w, s.peakNm());
        double tr = t0 + w;
        lobe(x, rateHz, tr, 0.5 * w, -s.reboundFraction() * s.peakNm());
        lobe(x, rateHz, tr + 0.5 * w, w / 3, s.humpFraction() * s.peakNm());
        if (s.ringFraction() > 0) {
            // ringing that starts at the main lobe's peak and decays over a fraction of a millisecond
            double tp = t0 + 0.5 * w;
            int from = (int) Math.ceil(tp * rateHz);
            int to = Math.min(x.length, (int) Math.floor((tp + 0.5 * w + RING_SETTLE_S) * rateHz));
            for (int i = Math.max(0, from); i < to; i++) {
                double t = i / rateHz - tp;
                x[i] += s.ringFraction() * s.peakNm() * Math.exp(-t / RING_TAU_S) * Math.sin(2 * Math.PI * RING_HZ * t);
            }
        }
    }

    private static void lobe(double[] x, double rateHz, double startS, double widthS, double peak) {
        int from = (int) Math.ceil(startS * rateHz);
        int to = Math.min(x.length, (int) Math.floor((startS + widthS) * rateHz));
        for (int i = Math.max(0, from); i <= to && i < x.length; i++) {
            double t = i / rateHz - startS;
            if (t >= 0 && t <= widthS) {
                x[i] += peak * Math.sin(Math.PI * t / widthS);
            }
        }
    }

    /**
     * The true peak of each strike: the highest sample of the noise-free signal {@code clean} within
     * the strike's span (strikes must not overlap).
     */
    public static double[] truePeaks(double rateHz, float[] clean, double offsetNm, List<Strike> strikes) {
        double[] peaks = new double[strikes.size()];
        for (int k = 0; k < peaks.length; k++) {
            Strike s = strikes.get(k);
            int from = Math.max(0, (int) Math.floor(s.startS() * rateHz));
            int to = Math.min(clean.length, (int) Math.ceil((s.startS() + s.spanS()) * rateHz) + 1);
            double max = Double.NEGATIVE_INFINITY;
            for (int i = from; i < to; i++) {
                max = Math.max(max, clean[i] - offsetNm);
            }
            peaks[k] = max;
        }
        return peaks;
    }

    /**
     * A random rundown of strikes: peaks rising from {@code firstPeakNm} toward {@code lastPeakNm},
     * blow intervals for a rate between {@code minRatePerMin} and {@code maxRatePerMin}, widths of
     * 1 to 3.5 ms, with rebounds, humps and ringing that stay within each strike's span.
     */
    public static List<Strike> randomRundown(Random r, double startS, int blows, double firstPeakNm,
                                             double lastPeakNm, double minRatePerMin, double maxRatePerMin) {
        List<Strike> strikes = new ArrayList<>(blows);
        double t = startS;
        for (int b = 0; b < blows; b++) {
            double f = blows == 1 ? 1.0 : b / (double) (blows - 1);
            double peak = (firstPeakNm + f * (lastPeakNm - firstPeakNm)) * (0.95 + 0.1 * r.nextDouble());
            double width = 0.001 + 0.0025 * r.nextDouble();
            strikes.add(new Strike(t, width, peak, 0.5 * r.nextDouble(), 0.6 * r.nextDouble(), 0.3 * r.nextDouble()));
            double rate = minRatePerMin + (maxRatePerMin - minRatePerMin) * r.nextDouble();
            t += 60.0 / rate;
        }
        return strikes;
    }
}
