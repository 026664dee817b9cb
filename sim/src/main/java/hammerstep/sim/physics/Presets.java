package hammerstep.sim.physics;

import hammerstep.config.ConfigException;
import hammerstep.config.MapReader;
import hammerstep.config.Problem;
import hammerstep.config.Problems;
import hammerstep.config.YamlDocument;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/**
 * Tool, joint and transducer presets: bundled ones by name (copies of {@code config/sim/} inside
 * the jar), or any YAML file by path. A bad file gives a {@link ConfigException} whose problems
 * read {@code file:line:column: message}. Keys and units are in docs/simulator.md.
 */
public final class Presets {

    public static final List<String> TOOLS = List.of(
            "cordless-two-dog", "cordless-three-dog", "cordless-skip-dog", "air-twin-hammer", "oil-pulse",
            "air-rocking-dog", "air-three-jaw", "air-twin-pin-oil-bath");
    public static final List<String> JOINTS = List.of("iso-hard", "iso-soft", "wheel-stud-m14", "flange-m16");
    public static final List<String> TRANSDUCERS = List.of("inline-1000", "inline-300");
    public static final String DEFAULT_TRANSDUCER = "inline-1000";

    private static final String RESOURCE_ROOT = "/hammerstep/sim/presets/";

    private Presets() {
    }

    public static ToolSpec tool(String nameOrPath) throws ConfigException {
        YamlDocument doc = document("tools", "tool", TOOLS, nameOrPath);
        return read(doc, r -> PresetReaders.tool(r, label(doc, nameOrPath)));
    }

    public static JointSpec joint(String nameOrPath) throws ConfigException {
        YamlDocument doc = document("joints", "joint", JOINTS, nameOrPath);
        return read(doc, r -> PresetReaders.joint(r, label(doc, nameOrPath)));
    }

    public static TransducerSpec transducer(String nameOrPath) throws ConfigException {
        YamlDocument doc = document("transducers", "transducer", TRANSDUCERS, nameOrPath);
        return read(doc, r -> PresetReaders.transducer(r, label(doc, nameOrPath)));
    }

    /** The transducer used when none is named. */
    public static TransducerSpec defaultTransducer() {
        try {
            return transducer(DEFAULT_TRANSDUCER);
        } catch (ConfigException e) {
            throw new IllegalStateException("bundled transducer preset is invalid: " + e.getMessage(), e);
        }
    }

    /** True when the argument names a file rather than a bundled preset. */
    public static boolean isPath(String nameOrPath) {
        return nameOrPath.contains("/") || nameOrPath.contains("\\") || nameOrPath.endsWith(".yaml")
                || nameOrPath.endsWith(".yml");
    }

    private static String label(YamlDocument doc, String nameOrPath) {
        return isPath(nameOrPath) ? doc.file() : nameOrPath;
    }

    private interface Reader<T> {
        T read(MapReader root);
    }

    private static <T> T read(YamlDocument doc, Reader<T> reader) throws ConfigException {
        Problems problems = new Problems(doc.file());
        MapReader root = MapReader.of(problems, doc.root());
        T value = reader.read(root);
        root.finish();
        problems.throwIfAny();
        return value;
    }

    private static YamlDocument document(String folder, String kind, List<String> names, String nameOrPath)
            throws ConfigException {
        if (isPath(nameOrPath) || Files.isRegularFile(Path.of(nameOrPath))) {
            return YamlDocument.read(Path.of(nameOrPath));
        }
        String resource = RESOURCE_ROOT + folder + "/" + nameOrPath + ".yaml";
        try (InputStream in = Presets.class.getResourceAsStream(resource)) {
            if (in == null || !names.contains(nameOrPath)) {
                throw new ConfigException(new Problem(nameOrPath, 0, 0, "no " + kind + " preset of that name (bundled: "
                        + String.join(", ", names) + "); give a file path for your own"));
            }
            return YamlDocument.parse("config/sim/" + folder + "/" + nameOrPath + ".yaml", in.readAllBytes());
        } catch (IOException e) {
            throw new ConfigException(new Problem(nameOrPath, 0, 0, "cannot read bundled preset: " + e.getMessage()));
        }
    }
}
