package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.trace.TraceException;
import picocli.CommandLine;

import java.io.PrintWriter;

/**
 * Shared command-line behaviour for hammerstep's commands (and the simulator's): errors are one
 * line on stderr and a non-zero exit, never a stack trace unless {@code HAMMERSTEP_DEBUG} is set.
 */
public final class Cli {

    private Cli() {
    }

    public static CommandLine commandLine(Object command) {
        return configure(new CommandLine(command));
    }

    /** Applies the shared behaviour to {@code cl} and the subcommands it holds already. */
    public static CommandLine configure(CommandLine cl) {
        cl.setCaseInsensitiveEnumValuesAllowed(true);
        cl.setExecutionExceptionHandler(Cli::handle);
        cl.setParameterExceptionHandler((ex, args) -> {
            PrintWriter err = ex.getCommandLine().getErr();
            err.println(ex.getCommandLine().getCommandName() + ": " + ex.getMessage());
            err.println("Try '" + ex.getCommandLine().getCommandSpec().qualifiedName() + " --help'.");
            err.flush();
            return 2;
        });
        return cl;
    }

    private static int handle(Exception ex, CommandLine cl, CommandLine.ParseResult parsed) {
        PrintWriter err = cl.getErr();
        if (System.getenv("HAMMERSTEP_DEBUG") != null) {
            ex.printStackTrace(err);
        }
        if (ex instanceof UserError u) {
            err.println(u.getMessage());
            err.flush();
            return u.exitCode();
        }
        if (ex instanceof ConfigException c) {
            c.problems().forEach(err::println);
            err.flush();
            return 2;
        }
        if (ex instanceof TraceException t) {
            err.println(t.getMessage());
            err.flush();
            return 2;
        }
        err.println(cl.getCommandName() + ": " + (ex.getMessage() == null ? ex.getClass().getSimpleName() : ex.getMessage()));
        err.flush();
        return 1;
    }
}
