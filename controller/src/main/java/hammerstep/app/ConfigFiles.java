package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.Problem;
import hammerstep.config.YamlDocument;
import hammerstep.joint.ProgramFile;
import hammerstep.sequence.PatternFile;
import hammerstep.station.setup.StationFile;
import hammerstep.station.setup.StationConfig;

import java.nio.file.Path;

/**
 * Tells the kinds of configuration file apart by their top-level keys and validates each with
 * its own reader. A joint program has {@code torque}, a pattern {@code passes}, a station file
 * {@code identity} or {@code parts}.
 */
public final class ConfigFiles {

    private ConfigFiles() {
    }

    /** Validates one file of any known kind. */
    public static void check(Path file) throws ConfigException {
        YamlDocument doc = YamlDocument.read(file);
        ConfigNode root = doc.root();
        if (root.kind() != ConfigNode.Kind.MAP) {
            throw new ConfigException(new Problem(doc.file(), root.line(), root.column(),
                    "expected a map of keys at the top of the file, got " + root.describe()));
        }
        if (root.entries().containsKey("torque")) {
            ProgramFile.read(doc);
            return;
        }
        Path dir = file.toAbsolutePath().getParent();
        if (root.entries().containsKey("passes")) {
            PatternFile.read(doc, dir);
            return;
        }
        if (root.entries().containsKey("identity") || root.entries().containsKey("parts")) {
            StationConfig station = StationFile.read(doc, dir, StationSections.all());
            StartChecks.check(doc, station, false); // what run would refuse at start, refused here too
            return;
        }
        String hint = root.entries().containsKey("name") && root.entries().containsKey("description")
                ? ": it looks like a simulator preset, which 'hammerstep-sim check' validates" : "";
        throw new ConfigException(new Problem(doc.file(), root.line(), root.column(),
                "not a known kind of configuration file: a joint program has 'torque', a pattern 'passes',"
                        + " a station file 'identity' and 'parts'" + hint));
    }
}
