package hammerstep.hardware;

import hammerstep.station.StationClock;

/**
 * Reads the ADC for a while and sums up what it saw: for {@code hammerstep zero} and
 * {@code hammerstep shunt-check}, which run on the calling thread with the ADC already started.
 */
public final class Sampler {

    /** What the ADC read over one measurement, in counts. */
    public record Reading(long samples, double meanCounts, double stdCounts, int minCounts, int maxCounts) {
        public int spreadCounts() {
            return maxCounts - minCounts;
        }
    }

    private Sampler() {
    }

    /** Reads every conversion for {@code durationNs}; at least one is required within the time. */
    public static Reading measure(AdcDriver adc, DataReady ready, StationClock clock, long durationNs) {
        long start = clock.nanoTime();
        long end = start + durationNs;
        long n = 0;
        double mean = 0;
        double m2 = 0;
        int min = Integer.MAX_VALUE;
        int max = Integer.MIN_VALUE;
        long now = start;
        while (now - end < 0 || n == 0) {
            if (n == 0 && now - end - 1_000_000_000L > 0) {
                throw new HardwareException(adc.part() + ": no conversion within " + (durationNs / 1_000_000 + 1000) + " ms");
            }
            if (ready.ready(now)) {
                int c = adc.read();
                ready.taken(now);
                n++;
                double d = c - mean;
                mean += d / n;
                m2 += d * (c - mean);
                min = Math.min(min, c);
                max = Math.max(max, c);
            } else {
                Thread.onSpinWait();
            }
            now = clock.nanoTime();
        }
        return new Reading(n, mean, n > 1 ? Math.sqrt(m2 / (n - 1)) : 0, min, max);
    }

    /** Waits {@code ns} while reading and discarding conversions (filter settling after a switch). */
    public static void settle(AdcDriver adc, DataReady ready, StationClock clock, long ns) {
        long end = clock.nanoTime() + ns;
        long now;
        while ((now = clock.nanoTime()) - end < 0) {
            if (ready.ready(now)) {
                adc.read();
                ready.taken(now);
            } else {
                Thread.onSpinWait();
            }
        }
    }
}
