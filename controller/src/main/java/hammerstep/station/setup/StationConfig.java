package hammerstep.station.setup;

import hammerstep.config.StationSection;
import java.nio.file.Path;
import java.util.Map;

/**
 * A validated station file: one record per section, looked up by the section that read it.
 *
 * @param revision content hash of the station file as loaded
 */
public record StationConfig(Path file, String revision, Map<String, Object> sections) {

    public StationConfig {
        sections = Map.copyOf(sections);
    }

    /** The record {@code section} read; null only for an optional section whose absent value is null. */
    @SuppressWarnings("unchecked")
    public <T> T get(StationSection<T> section) {
        return (T) sections.get(section.key());
    }

    /** True when the file had the section or it has a default. */
    public boolean has(StationSection<?> section) {
        return sections.containsKey(section.key());
    }
}
