package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.Problem;
import hammerstep.config.StationSection;
import hammerstep.config.YamlDocument;
import hammerstep.joint.ProgramFile;
import hammerstep.sequence.PatternFile;
import hammerstep.station.setup.StationFile;
import hammerstep.station.setup.StationConfig;

import java.nio.file.Path;
import java.util.List;

/**
 * Tells the kinds of configuration file apart by their top-level keys and validates each with
 * its own reader. A joint program has {@code torque}, a pattern {@code passes}, a station file
 * {@code identity} or {@code parts}.
 */
public final class ConfigFiles {

    private ConfigFiles() {
    }

    /**
     * Validates one file of any known kind. Returns null when it was validated, or a note saying why
     * it was skipped: a simulator preset (tool, joint, transducer) is the simulator's to validate.
     */
    public static String check(Path file) throws ConfigException {
        YamlDocument doc = YamlDocument.read(file);
        ConfigNode root = doc.root();
        if (root.kind() != ConfigNode.Kind.MAP) {
            throw new ConfigException(new Problem(doc.file(), root.line(), root.column(),
                    "expected a map of keys at the top of the file, got " + root.describe()));
        }
        if (root.entries().containsKey("torque")) {
            ProgramFile.read(doc);
            return null;
        }
        Path dir = file.toAbsolutePath().getParent();
        if (root.entries().containsKey("passes")) {
            PatternFile.read(doc, dir);
            return null;
        }
        if (isStation(root)) {
            checkStation(doc, dir, StationSections.all());
            return null;
        }
        String preset = simulatorPreset(root);
        if (preset != null) {
            return doc.file() + ": skipped: a simulator " + preset + " preset ('hammerstep-sim check' validates it)";
        }
        throw new ConfigException(new Problem(doc.file(), root.line(), root.column(),
                "not a known kind of configuration file: a joint program has 'torque', a pattern 'passes',"
                        + " a station file 'identity' and 'parts'"));
    }

    /** A station file has {@code identity} or {@code parts} at its top. */
    public static boolean isStation(ConfigNode root) {
        return root.entries().containsKey("identity") || root.entries().containsKey("parts");
    }

    /** Validates a station file with {@code sections} (the simulator adds its own {@code simulation}). */
    public static void checkStation(YamlDocument doc, Path dir, List<StationSection<?>> sections) throws ConfigException {
        StationConfig station = StationFile.read(doc, dir, sections);
        StartChecks.check(doc, station, false); // what run would refuse at start, refused here too
    }

    /**
     * The kind of simulator preset a file's top-level keys say it is ({@code tool}: {@code drive} or
     * {@code mechanism}; {@code joint}: {@code full_torque_nm}; {@code transducer}:
     * {@code rated_torque_nm}), or null.
     */
    public static String simulatorPreset(ConfigNode root) {
        var keys = root.entries().keySet();
        if (keys.contains("drive") || keys.contains("mechanism")) {
            return "tool";
        }
        if (keys.contains("full_torque_nm")) {
            return "joint";
        }
        if (keys.contains("rated_torque_nm")) {
            return "transducer";
        }
        return null;
    }
}
