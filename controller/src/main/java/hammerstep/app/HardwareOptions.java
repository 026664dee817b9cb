package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.hardware.HardwareConfig;
import hammerstep.hardware.HardwareException;
import hammerstep.hardware.pi4j.Pi4jHardware;
import hammerstep.station.StationClock;
import picocli.CommandLine.Option;

import java.nio.file.Path;

/** Options shared by the commands that open the station's hardware: the station file and which hardware. */
final class HardwareOptions {

    enum Kind { gpio, mock }

    @Option(names = "--config", required = true, paramLabel = "FILE", description = "station file (YAML)")
    Path config;

    @Option(names = "--hardware", paramLabel = "KIND", defaultValue = "gpio",
            description = "gpio: the Raspberry Pi's GPIO and SPI (default); mock: Pi4J's mock GPIO and a simulated ADC")
    Kind kind;

    HardwareConfig load() throws ConfigException {
        return HardwareConfig.load(config);
    }

    /** Opens the hardware; a machine without GPIO, or a part that does not answer, is one line and exit 1. */
    Pi4jHardware open(HardwareConfig c, StationClock clock) {
        try {
            return Pi4jHardware.open(kind == Kind.mock ? Pi4jHardware.Mode.MOCK : Pi4jHardware.Mode.GPIO,
                    c.hardware(), c.transducer(), clock);
        } catch (HardwareException e) {
            throw new UserError(e.getMessage(), 1);
        }
    }

    /** Starts the ADC; a part that does not answer is one line and exit 1. */
    static void start(Pi4jHardware hw) {
        try {
            hw.adc().start();
        } catch (HardwareException e) {
            throw new UserError(e.getMessage(), 1);
        }
    }
}
