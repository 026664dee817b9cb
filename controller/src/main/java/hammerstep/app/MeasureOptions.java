package hammerstep.app;

import ch.qos.logback.classic.Level;
import hammerstep.config.ConfigException;
import hammerstep.hardware.HardwareConfig;
import hammerstep.hardware.pi4j.Pi4jHardware;
import hammerstep.station.StationClock;
import hammerstep.station.SystemStationClock;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

import java.nio.file.Path;

/**
 * Options and set-up shared by the commands that take readings of the idle transducer
 * ({@code zero}, {@code shunt-check}): the station file and hardware, the averaging time, logging.
 */
final class MeasureOptions {

    @Mixin
    HardwareOptions hardware;

    @Option(names = "--seconds", defaultValue = "1.0", paramLabel = "S", converter = NumberOptions.Lenient.class, description = "averaging time per reading (default 1.0)")
    double seconds;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    StationClock clock = new SystemStationClock();

    /** Configures logging, checks {@code --seconds} and loads the station file. */
    HardwareConfig begin() throws ConfigException {
        Logging.configure(verbose, Level.WARN);
        if (!(seconds > 0 && seconds <= 60)) {
            throw new UserError("--seconds must be above 0 and at most 60");
        }
        return hardware.load();
    }

    /** The station file named by {@code --config}. */
    Path config() {
        return hardware.config;
    }

    /** The averaging time of one reading, ns. */
    long readingNs() {
        return (long) (seconds * 1e9);
    }

    /** Opens the hardware and starts the ADC; the caller closes it. A part that does not answer is one line and exit 1. */
    Pi4jHardware openStarted(HardwareConfig c) {
        Pi4jHardware hw = hardware.open(c, clock);
        try {
            HardwareOptions.start(hw);
            return hw;
        } catch (RuntimeException e) {
            hw.close();
            throw e;
        }
    }

    /** A figure as the station file would hold it: whole numbers without a decimal point. */
    static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
