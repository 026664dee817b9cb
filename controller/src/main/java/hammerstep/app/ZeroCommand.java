package hammerstep.app;

import ch.qos.logback.classic.Level;
import hammerstep.config.ConfigException;
import hammerstep.hardware.HardwareConfig;
import hammerstep.hardware.Sampler;
import hammerstep.hardware.TransducerSettings;
import hammerstep.hardware.pi4j.Pi4jHardware;
import hammerstep.signal.Calibration;
import org.agrona.concurrent.NanoClock;
import org.agrona.concurrent.SystemNanoClock;
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
    HardwareOptions hardware;

    @Option(names = "--seconds", defaultValue = "1.0", paramLabel = "S", description = "how long to average (default 1.0)")
    double seconds;

    @Option(names = "--limit-pct", defaultValue = "2.0", paramLabel = "PCT",
            description = "largest acceptable offset, % of full scale (default 2, common practice)")
    double limitPct;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    NanoClock clock = SystemNanoClock.INSTANCE;

    @Override
    public Integer call() throws ConfigException {
        Logging.configure(verbose, Level.WARN);
        if (!(seconds > 0 && seconds <= 60)) {
            throw new UserError("--seconds must be above 0 and at most 60");
        }
        HardwareConfig c = hardware.load();
        try (Pi4jHardware hw = hardware.open(c, clock)) {
            HardwareOptions.start(hw);
            Sampler.Reading r = Sampler.measure(hw.adc(), hw.dataReady(), clock, (long) (seconds * 1e9));
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
                fmt(t.fullScaleNm()), r.stdCounts() * k, spreadNm, r.samples());
        if (spreadNm > 0.01 * t.fullScaleNm()) {
            System.out.printf(Locale.ROOT, "not at rest: the signal moved %.3f N·m (over 1 %% of full scale); release the tool"
                    + " and the socket and try again%n", spreadNm);
            return 1;
        }
        if (Math.abs(pct) > limitPct) {
            System.out.printf(Locale.ROOT, "offset beyond ±%s %% of full scale: check the transducer, its cable and the"
                    + " bridge wiring before use%n", fmt(limitPct));
            return 1;
        }
        System.out.printf(Locale.ROOT, "within ±%s %%: to start from it, set transducer.zero_counts: %d in %s%n",
                fmt(limitPct), Math.round(r.meanCounts()), hardware.config);
        return 0;
    }

    static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
