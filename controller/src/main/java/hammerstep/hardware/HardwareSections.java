package hammerstep.hardware;

import hammerstep.config.MapReader;
import hammerstep.config.StationSection;

import java.nio.file.Path;

/** The station file sections this package reads: {@code hardware:} and {@code transducer:}. */
public final class HardwareSections {

    public static final StationSection<HardwareSettings> HARDWARE = new StationSection<>() {
        @Override
        public String key() {
            return "hardware";
        }

        @Override
        public HardwareSettings read(MapReader section, Path base) {
            return HardwareSection.read(section);
        }

        @Override
        public boolean required() {
            return false; // simulated stations have none; hammerstep run requires it
        }
    };

    public static final StationSection<TransducerSettings> TRANSDUCER = new StationSection<>() {
        @Override
        public String key() {
            return "transducer";
        }

        @Override
        public TransducerSettings read(MapReader section, Path base) {
            return TransducerSection.read(section);
        }

        @Override
        public boolean required() {
            return false;
        }
    };

    private HardwareSections() {
    }

    /** Why the transducer and the ADC of a valid station file do not go together, or null. */
    public static String mismatch(HardwareSettings hardware, TransducerSettings transducer) {
        return HardwareConfig.mismatch(hardware.adc(), transducer);
    }
}
