package hammerstep.station.setup;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.MapReader;
import hammerstep.config.Problem;
import hammerstep.config.Problems;
import hammerstep.config.StationSection;
import hammerstep.config.YamlDocument;

import java.nio.file.Path;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Reads a station file: a map of sections, each read by its own {@link StationSection}. A key that
 * no section claims is an error, as is a missing required section. All problems of the file (and
 * of the pattern and program files it names) are reported together as {@code file:line:column: message}.
 */
public final class StationFile {

    private StationFile() {
    }

    public static StationConfig load(Path file, List<StationSection<?>> sections) throws ConfigException {
        YamlDocument doc = YamlDocument.read(file);
        return read(doc, file.toAbsolutePath().getParent(), sections);
    }

    public static StationConfig read(YamlDocument doc, Path base, List<StationSection<?>> sections)
            throws ConfigException {
        Problems problems = new Problems(doc.file());
        MapReader root = MapReader.of(problems, doc.root());
        Map<String, Object> values = new HashMap<>();
        Set<String> keys = new LinkedHashSet<>();
        for (StationSection<?> section : sections) {
            if (!keys.add(section.key())) {
                throw new IllegalArgumentException("two readers for section " + section.key());
            }
            ConfigNode node = root.child(section.key());
            if (node == null || node.kind() == ConfigNode.Kind.NULL) {
                if (section.required()) {
                    problems.add(node == null ? doc.root() : node, "missing section '" + section.key() + "'");
                } else {
                    Object fallback = section.absent(base);
                    if (fallback != null) {
                        values.put(section.key(), fallback);
                    }
                }
                continue;
            }
            Object value = section.read(MapReader.of(problems, node), base);
            if (value != null) {
                values.put(section.key(), value);
            }
        }
        root.finish();
        List<Problem> all = new java.util.ArrayList<>(problems.list());
        for (Object v : values.values()) {
            if (v instanceof NestedProblems n) {
                all.addAll(n.problems());
            }
        }
        if (!all.isEmpty()) {
            throw new ConfigException(all);
        }
        return new StationConfig(Path.of(doc.file()), doc.revision(), values);
    }

    /** A section's value that carries problems found in other files it names (patterns, programs). */
    public interface NestedProblems {
        List<Problem> problems();
    }
}
