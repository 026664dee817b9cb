package hammerstep.trace;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Map;

/**
 * An invented rundown for tests: quiet, then {@code blows} half-sine pulses of 2 ms at a steady
 * interval, peaks rising linearly from {@code firstPeakNm} to {@code lastPeakNm}, then quiet.
 */
public final class SyntheticRundown {

    public static final double RATE_HZ = 20_000;

    private SyntheticRundown() {
    }

    public static float[] samples(int blows, double firstPeakNm, double lastPeakNm, double intervalMs) {
        int lead = (int) (0.05 * RATE_HZ);
        int interval = (int) (intervalMs * 1e-3 * RATE_HZ);
        int width = (int) (2e-3 * RATE_HZ);
        int tail = (int) (0.4 * RATE_HZ);
        float[] x = new float[lead + blows * interval + tail];
        for (int b = 0; b < blows; b++) {
            double peak = blows == 1 ? lastPeakNm : firstPeakNm + (lastPeakNm - firstPeakNm) * b / (blows - 1);
            int start = lead + b * interval;
            for (int i = 0; i <= width; i++) {
                x[start + i] = (float) (peak * Math.sin(Math.PI * i / width));
            }
        }
        return x;
    }

    public static void writeCsv(Path file, float[] samples) throws IOException {
        try (TraceWriter w = new TraceWriter(file, RATE_HZ, Map.of("scenario", "invented test rundown"))) {
            w.write(samples, 0, samples.length);
        }
    }
}
