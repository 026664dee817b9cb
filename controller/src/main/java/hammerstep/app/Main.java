package hammerstep.app;

import picocli.CommandLine;
import picocli.CommandLine.Command;

/** The {@code hammerstep} command line. */
@Command(name = "hammerstep",
        mixinStandardHelpOptions = true,
        versionProvider = Version.class,
        description = "Station controller for tightening bolt patterns with impact wrenches.",
        subcommands = {ReplayCommand.class, CheckCommand.class, StatsCommand.class, PlotCommand.class, AuditCommand.class,
                RunCommand.class, ZeroCommand.class, ShuntCheckCommand.class, CommandLine.HelpCommand.class})
public final class Main {

    public static void main(String[] args) {
        System.exit(run(args));
    }

    /** Runs a command line and returns its exit code: 0 done, 1 failed, 2 bad input or configuration. */
    public static int run(String... args) {
        return Cli.commandLine(new Main()).execute(args);
    }
}
