package hammerstep.app;

import hammerstep.config.MapReader;
import hammerstep.health.InterferenceSection;
import hammerstep.health.ToolHealthSection;
import hammerstep.mqtt.BrokerSettings;
import hammerstep.hardware.HardwareSections;
import hammerstep.results.StorageSettings;
import hammerstep.station.setup.IdentitySection;
import hammerstep.station.setup.MainsSection;
import hammerstep.station.setup.PartsSection;
import hammerstep.config.StationSection;
import hammerstep.station.setup.TimingSection;
import hammerstep.trace.TracesSection;
import hammerstep.web.WebSettings;

import java.nio.file.Path;
import java.util.List;

/**
 * Every section the controller reads from a station file, in one list. A subsystem with settings
 * of its own adds its {@link StationSection} here (one line); see DEVELOPERS.md.
 */
public final class StationSections {

    /** {@code storage:}: the outbox journal (optional; without it results are kept in memory only). */
    public static final StationSection<StorageSettings> STORAGE = new StationSection<>() {
        @Override
        public String key() {
            return "storage";
        }

        @Override
        public boolean required() {
            return false;
        }

        @Override
        public StorageSettings read(MapReader section, Path base) {
            return StorageSettings.read(section, base);
        }
    };

    /**
     * {@code broker:}: the MQTT connection (optional; without it the station keeps its results in
     * the outbox and delivers nothing). The client id defaults to site-line-station (empty here).
     */
    public static final StationSection<BrokerSettings> BROKER = new StationSection<>() {
        @Override
        public String key() {
            return "broker";
        }

        @Override
        public boolean required() {
            return false;
        }

        @Override
        public BrokerSettings read(MapReader section, Path base) {
            return BrokerSettings.read(section, base, "");
        }
    };

    private StationSections() {
    }

    /** The controller's sections; {@code simulation} is accepted unread (hammerstep-sim reads it). */
    public static List<StationSection<?>> all() {
        return List.of(
                IdentitySection.INSTANCE,
                PartsSection.INSTANCE,
                TimingSection.INSTANCE,
                STORAGE,
                BROKER,
                TracesSection.INSTANCE,
                ToolHealthSection.INSTANCE,
                InterferenceSection.INSTANCE,
                MainsSection.INSTANCE,
                HardwareSections.HARDWARE,
                HardwareSections.TRANSDUCER,
                WebSettings.SECTION,
                StationSection.readElsewhere("simulation"));
    }
}
