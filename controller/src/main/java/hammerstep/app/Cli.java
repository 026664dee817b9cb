package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.config.InputFiles;
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
            err.println(InputFiles.errorLine(ex.getCommandLine().getCommandName() + ": " + ex.getMessage()));
            err.println("Try '" + ex.getCommandLine().getCommandSpec().qualifiedName() + " --help'.");
            err.flush();
            return 2;
        });
        return cl;
    }

    /**
     * Runs {@code cl} on {@code args}; the last resort for an {@link Error} out of a command (the
     * heap exhausted, the stack overflowed): one line and exit 1, never a stack trace. Inputs are
     * bounded so that this does not happen; it is here for what the bounds missed.
     */
    public static int execute(CommandLine cl, String... args) {
        try {
            return cl.execute(args);
        } catch (OutOfMemoryError | StackOverflowError e) {
            if (System.getenv("HAMMERSTEP_DEBUG") != null) {
                e.printStackTrace();
            }
            System.err.println(cl.getCommandName() + ": " + (e instanceof OutOfMemoryError
                    ? "out of memory (heap " + Runtime.getRuntime().maxMemory() / (1 << 20) + " MB); the input is too large for it"
                    : "input nested too deeply (stack overflow)"));
            System.err.flush();
            return 1;
        }
    }

    private static int handle(Exception ex, CommandLine cl, CommandLine.ParseResult parsed) {
        PrintWriter err = cl.getErr();
        if (System.getenv("HAMMERSTEP_DEBUG") != null) {
            ex.printStackTrace(err);
        }
        if (ex instanceof UserError u) {
            err.println(InputFiles.errorLine(u.getMessage()));
            err.flush();
            return u.exitCode();
        }
        if (ex instanceof ConfigException c) {
            c.problems().forEach(p -> err.println(InputFiles.errorLine(p.toString())));
            err.flush();
            return 2;
        }
        if (ex instanceof TraceException t) {
            err.println(InputFiles.errorLine(t.getMessage()));
            err.flush();
            return 2;
        }
        err.println(InputFiles.errorLine(cl.getCommandName() + ": "
                + (ex.getMessage() == null ? ex.getClass().getSimpleName() : ex.getMessage())));
        err.flush();
        return 1;
    }
}
