package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.hardware.HardwareConfig;
import hammerstep.hardware.Sampler;
import hammerstep.hardware.TransducerSettings;
import hammerstep.hardware.pi4j.Pi4jHardware;
import hammerstep.signal.Calibration;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

import java.util.Locale;
import java.util.concurrent.Callable;

/**
 * {@code hammerstep zero}: captures the transducer's zero with the tool idle: the mean of the
 * counts over a while, its noise, and whether the offset is within the limit. Prints the
 * {@code zero_counts} to keep in the station file.
 */
@Command(name = "zero", mixinStandardHelpOptions = true,
        description = {"Captures the transducer zero (tool idle, nothing on the socket) and checks it.",
                "Exit 0 when the offset is within --limit-pct of full scale and the signal was at rest, 1 otherwise."})
public final class ZeroCommand implements Callable<Integer> {

    @Mixin
    MeasureOptions measure;

    @Option(names = "--limit-pct", defaultValue = "2.0", paramLabel = "PCT",
            description = "largest acceptable offset, %% of full scale (default 2, common practice)")
    double limitPct;

    @Override
    public Integer call() throws ConfigException {
        HardwareConfig c = measure.begin();
        try (Pi4jHardware hw = measure.openStarted(c)) {
            Sampler.Reading r = Sampler.measure(hw.adc(), hw.dataReady(), measure.clock, measure.readingNs());
            hw.adc().stop();
            return report(r, hw.calibration(), c.transducer());
        }
    }

    private int report(Sampler.Reading r, Calibration cal, TransducerSettings t) {
        double k = cal.nmPerCount();
        double offsetNm = r.meanCounts() * k;
        double pct = offsetNm / t.fullScaleNm() * 100;
        double spreadNm = r.spreadCounts() * k;
        System.out.printf(Locale.ROOT, "zero: %d counts = %.4f N·m (%.3f %% of %s N·m), noise %.4f N·m rms,"
                        + " spread %.4f N·m over %d samples%n", Math.round(r.meanCounts()), offsetNm, pct,
                MeasureOptions.fmt(t.fullScaleNm()), r.stdCounts() * k, spreadNm, r.samples());
        if (spreadNm > 0.01 * t.fullScaleNm()) {
            System.out.printf(Locale.ROOT, "not at rest: the signal moved %.3f N·m (over 1 %% of full scale); release the tool"
                    + " and the socket and try again%n", spreadNm);
            return 1;
        }
        if (Math.abs(pct) > limitPct) {
            System.out.printf(Locale.ROOT, "offset beyond ±%s %% of full scale: check the transducer, its cable and the"
                    + " bridge wiring before use%n", MeasureOptions.fmt(limitPct));
            return 1;
        }
        System.out.printf(Locale.ROOT, "within ±%s %%: to start from it, set transducer.zero_counts: %d in %s%n",
                MeasureOptions.fmt(limitPct), Math.round(r.meanCounts()), measure.config());
        return 0;
    }
}
