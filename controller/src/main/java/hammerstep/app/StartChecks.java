package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.Problem;
import hammerstep.config.YamlDocument;
import hammerstep.hardware.HardwareSections;
import hammerstep.hardware.HardwareSettings;
import hammerstep.hardware.TransducerSettings;
import hammerstep.station.loop.PatternMonitors;
import hammerstep.station.setup.PartsSection;
import hammerstep.station.setup.StationConfig;
import hammerstep.station.setup.StationFile;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * What {@code hammerstep run} needs of a station file beyond each section on its own (each section's
 * reader checks its own keys, files and folders): checks across sections, made by {@code check} and by
 * {@code run} before it opens anything, so both refuse the same file with the same
 * {@code file:line:column: message} and exit 2.
 * <ul>
 * <li>a station runs on {@code hardware} with its {@code transducer}: one without the other is refused;
 *     a file with neither is one for the simulator ({@code simulation}), or refused;</li>
 * <li>the transducer's output fits the ADC (a bridge on the bridge ADC, a voltage on the other);</li>
 * <li>every pattern has at most as many positions as the station has position lamps.</li>
 * </ul>
 */
final class StartChecks {

    private StartChecks() {
    }

    /** Reads a station file as {@code run} does and refuses what run would refuse at start. */
    static StationConfig load(Path file) throws ConfigException {
        YamlDocument doc = YamlDocument.read(file);
        StationConfig station = StationFile.read(doc, file.toAbsolutePath().getParent(), StationSections.all());
        check(doc, station, true);
        return station;
    }

    /**
     * Throws the problems of a valid station file that {@code run} would refuse at start.
     *
     * @param forRun true for {@code run}, which also refuses a file for the simulator (no hardware)
     */
    static void check(YamlDocument doc, StationConfig station, boolean forRun) throws ConfigException {
        List<Problem> problems = new ArrayList<>();
        ConfigNode root = doc.root();
        HardwareSettings hw = station.get(HardwareSections.HARDWARE);
        TransducerSettings td = station.get(HardwareSections.TRANSDUCER);
        boolean simulated = root.entries().containsKey("simulation");
        if (hw == null && td == null) {
            if (forRun || !simulated) {
                problems.add(at(doc, root, "a station needs 'hardware' and 'transducer' sections to run"
                        + (simulated ? " (this file is for the simulator: hammerstep-sim demo --config FILE)"
                        : " (a simulated station has 'simulation' instead)")));
            }
        } else if (hw == null || td == null) {
            String has = hw != null ? "hardware" : "transducer";
            problems.add(at(doc, root.entries().get(has), "'" + has + "' needs '"
                    + (hw != null ? "transducer" : "hardware") + "' beside it: a station runs on both"));
        } else {
            String mismatch = HardwareSections.mismatch(hw, td);
            if (mismatch != null) {
                ConfigNode t = root.entries().get("transducer");
                ConfigNode output = t.kind() == ConfigNode.Kind.MAP ? t.entries().get("output") : null;
                problems.add(at(doc, output != null ? output : t, mismatch));
            }
            PartsSection.Parts parts = station.get(PartsSection.INSTANCE);
            String lamps = parts == null ? null : PatternMonitors.lampProblem(parts.byModel(), hw.positions().size());
            if (lamps != null) {
                problems.add(at(doc, positionsNode(root), lamps
                        + ": 'hardware.outputs.positions' needs one lamp per position of every pattern"));
            }
        }
        if (!problems.isEmpty()) {
            throw new ConfigException(problems);
        }
    }

    private static ConfigNode positionsNode(ConfigNode root) {
        ConfigNode n = root.entries().get("hardware");
        for (String key : new String[] {"outputs", "positions"}) {
            ConfigNode child = n.kind() == ConfigNode.Kind.MAP ? n.entries().get(key) : null;
            if (child == null) {
                return n;
            }
            n = child;
        }
        return n;
    }

    private static Problem at(YamlDocument doc, ConfigNode n, String message) {
        return new Problem(doc.file(), n.line(), n.column(), message);
    }
}
