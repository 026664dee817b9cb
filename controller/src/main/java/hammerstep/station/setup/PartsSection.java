package hammerstep.station.setup;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.MapReader;
import hammerstep.config.Problem;
import hammerstep.config.StationSection;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.PatternFile;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The {@code parts:} section: which pattern each part model gets. Pattern files are read relative
 * to the station file; models may share a pattern.
 *
 * <pre>
 * parts:
 *   HX-220: patterns/hub-5.yaml
 *   HX-260: patterns/hub-5.yaml
 * </pre>
 */
public final class PartsSection implements StationSection<PartsSection.Parts> {

    public static final PartsSection INSTANCE = new PartsSection();

    /** Part model → pattern, in file order. */
    public record Parts(Map<String, Pattern> byModel, List<Problem> problems) implements StationFile.NestedProblems {
        public Parts {
            byModel = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(byModel));
            problems = List.copyOf(problems);
        }
    }

    @Override
    public String key() {
        return "parts";
    }

    @Override
    public Parts read(MapReader r, Path base) {
        Map<String, Pattern> byModel = new LinkedHashMap<>();
        Map<Path, Pattern> loaded = new HashMap<>();
        List<Problem> elsewhere = new ArrayList<>();
        Map<String, ConfigNode> entries = r.node().entries();
        if (entries.isEmpty() && r.node().kind() == ConfigNode.Kind.MAP) {
            r.problems().add(r.node(), "'parts' is empty: expected at least one 'MODEL: pattern-file' entry");
        }
        for (Map.Entry<String, ConfigNode> e : entries.entrySet()) {
            String model = e.getKey();
            ConfigNode node = r.child(model);
            if (node.kind() != ConfigNode.Kind.STRING || node.text().isBlank()) {
                r.problem(model, "'" + r.path(model) + "': expected a pattern file name, got " + node.describe());
                continue;
            }
            Path file = base.resolve(node.text()).normalize();
            Pattern pattern = loaded.get(file);
            if (pattern == null) {
                try {
                    pattern = PatternFile.load(file);
                    loaded.put(file, pattern);
                } catch (ConfigException ex) {
                    if (ex.problems().size() == 1 && ex.problems().get(0).line() == 0) {
                        r.problem(model, "'" + r.path(model) + "': cannot use pattern file " + node.text() + ": "
                                + ex.problems().get(0).message());
                    } else {
                        r.problem(model, "'" + r.path(model) + "': pattern file " + node.text() + " is not valid");
                        elsewhere.addAll(ex.problems());
                    }
                    continue;
                }
            }
            byModel.put(model, pattern);
        }
        r.finish();
        return new Parts(byModel, elsewhere);
    }
}
