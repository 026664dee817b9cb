package hammerstep.sim.app;

import hammerstep.app.Cli;
import hammerstep.app.Version;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** The {@code hammerstep-sim} command line: one subcommand per job. */
@Command(name = "hammerstep-sim",
        mixinStandardHelpOptions = true,
        versionProvider = Version.class,
        description = "Hardware simulator for hammerstep: modelled impact tools, joints and transducers.",
        subcommands = {SimulateCommand.class, DemoCommand.class, CheckCommand.class, CommandLine.HelpCommand.class})
public final class SimMain {

    public static void main(String[] args) {
        StartingLine.write(args, System.console() != null, System.out);
        System.exit(run(args));
    }

    /** Runs a command line and returns its exit code: 0 done, 1 failed, 2 bad input or configuration. */
    public static int run(String... args) {
        return Cli.execute(Cli.commandLine(new SimMain()), args);
    }
}
