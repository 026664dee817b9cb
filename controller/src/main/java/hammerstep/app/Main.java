package hammerstep.app;

import picocli.CommandLine;
import picocli.CommandLine.Command;

import java.util.List;

/**
 * The {@code hammerstep} command line.
 *
 * <p>picocli reflects over every command it is given, and building a command object can pull in
 * its collaborators (hardware, logging). A command line naming one subcommand therefore gets a
 * tree holding only that one; {@code replay} of a large trace is dominated by start-up otherwise.
 * Without a known subcommand (no arguments, {@code --help}, a typo) the whole tree is built, so
 * help and "did you mean" still list everything.
 */
@Command(name = "hammerstep",
        mixinStandardHelpOptions = true,
        versionProvider = Version.class,
        description = "Station controller for tightening bolt patterns with impact wrenches.")
public final class Main {

    /** Subcommand names in the order help lists them. */
    static final List<String> COMMANDS =
            List.of("replay", "check", "stats", "plot", "audit", "run", "zero", "shunt-check", "web-user", "help");

    public static void main(String[] args) {
        if (args.length > 0 && args[0].equals("replay")) {
            ReplayPreload.start();
        }
        System.exit(run(args));
    }

    /** Runs a command line and returns its exit code: 0 done, 1 failed, 2 bad input or configuration. */
    public static int run(String... args) {
        return Cli.execute(commandLine(args), args);
    }

    /** The command line to execute {@code args} with. */
    static CommandLine commandLine(String... args) {
        CommandLine cl = new CommandLine(new Main());
        String first = args.length > 0 ? args[0] : "";
        if (COMMANDS.contains(first) && !first.equals("help")) {
            cl.addSubcommand(command(first));
        } else {
            for (String name : COMMANDS) {
                cl.addSubcommand(command(name));
            }
        }
        return Cli.configure(cl);
    }

    private static Object command(String name) {
        switch (name) {
            case "replay": return new ReplayCommand();
            case "check": return new CheckCommand();
            case "stats": return new StatsCommand();
            case "plot": return new PlotCommand();
            case "audit": return new AuditCommand();
            case "run": return new RunCommand();
            case "zero": return new ZeroCommand();
            case "shunt-check": return new ShuntCheckCommand();
            case "web-user": return new WebUserCommand();
            case "help": return new CommandLine.HelpCommand();
            default: throw new IllegalArgumentException(name);
        }
    }
}
