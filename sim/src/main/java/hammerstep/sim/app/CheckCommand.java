package hammerstep.sim.app;

import hammerstep.app.ConfigFiles;
import hammerstep.config.ConfigException;
import hammerstep.sim.physics.Presets;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;

import java.io.IOException;
import java.nio.file.Path;
import java.util.concurrent.Callable;

/**
 * {@code hammerstep-sim check}: validates simulator presets (files in a {@code tools/},
 * {@code joints/} or {@code transducers/} folder) and, through the controller's checks, every
 * other configuration file, so {@code hammerstep-sim check config/} covers the whole tree.
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

    static void check(Path file) throws ConfigException {
        Path dir = file.toAbsolutePath().getParent();
        String folder = dir == null ? "" : dir.getFileName().toString();
        String path = file.toString();
        switch (folder) {
            case "tools" -> Presets.tool(path);
            case "joints" -> Presets.joint(path);
            case "transducers" -> Presets.transducer(path);
            default -> ConfigFiles.check(file);
        }
    }
}
