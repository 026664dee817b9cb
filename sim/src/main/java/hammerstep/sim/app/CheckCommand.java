package hammerstep.sim.app;

import hammerstep.app.ConfigFiles;
import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.YamlDocument;
import hammerstep.sim.demo.SimulationSection;
import hammerstep.sim.physics.Presets;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;

import java.io.IOException;
import java.nio.file.Path;
import java.util.concurrent.Callable;

/**
 * {@code hammerstep-sim check}: validates simulator presets (files in a {@code tools/},
 * {@code joints/} or {@code transducers/} folder, or told by their keys elsewhere), station files
 * with their {@code simulation} section as the demo reads it, and, through the controller's
 * checks, every other configuration file, so {@code hammerstep-sim check config/} covers the whole tree.
 */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Validates simulator presets (tools/, joints/, transducers/) and all other configuration files.",
                "Prints one line per problem as file:line:column: message; exit 0 when all are valid, 2 otherwise."})
public final class CheckCommand implements Callable<Integer> {

    @Mixin
    hammerstep.app.CheckCommand.Targets targets;

    @Override
    public Integer call() throws IOException {
        return targets.checkAll(CheckCommand::check);
    }

    /**
     * Validates one file: a preset by its folder or, outside those folders, by its keys (as
     * {@link ConfigFiles#simulatorPreset}); a station file with its {@code simulation} section read
     * as the demo reads it; every other file as {@code hammerstep check} does.
     */
    static String check(Path file) throws ConfigException {
        Path dir = file.toAbsolutePath().getParent();
        String folder = dir == null ? "" : dir.getFileName().toString();
        String path = file.toString();
        String kind = switch (folder) {
            case "tools" -> "tool";
            case "joints" -> "joint";
            case "transducers" -> "transducer";
            default -> null;
        };
        YamlDocument doc = null;
        if (kind == null) {
            doc = YamlDocument.read(file);
            if (doc.root().kind() == ConfigNode.Kind.MAP) {
                kind = ConfigFiles.simulatorPreset(doc.root());
                if (kind == null && ConfigFiles.isStation(doc.root()) && doc.root().entries().containsKey("simulation")) {
                    ConfigFiles.checkStation(doc, dir, SimulationSection.withStationSections());
                    return null;
                }
            }
        }
        if (kind == null) {
            return ConfigFiles.check(file);
        }
        switch (kind) {
            case "tool" -> Presets.tool(path);
            case "joint" -> Presets.joint(path);
            default -> Presets.transducer(path);
        }
        return null;
    }
}
