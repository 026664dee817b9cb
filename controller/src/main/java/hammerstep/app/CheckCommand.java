package hammerstep.app;

import ch.qos.logback.classic.Level;
import hammerstep.config.ConfigException;
import hammerstep.config.InputFiles;
import hammerstep.config.Problem;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.stream.Stream;

/**
 * {@code hammerstep check}: validates configuration files (and the YAML files of directories).
 * Exit 0 when all are valid, 2 otherwise, one {@code file:line:column: message} line per problem.
 */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Validates configuration files: joint programs, patterns and station files, told apart by their keys.",
                "Prints one line per problem as file:line:column: message; exit 0 when all are valid, 2 otherwise.",
                "Simulator presets (tools, joints, transducers) are skipped with a note: hammerstep-sim check validates them."})
public final class CheckCommand implements Callable<Integer> {

    /** What a check command checks and how much it says; the simulator's {@code check} takes the same. */
    public static final class Targets {
        @Parameters(arity = "1..*", paramLabel = "PATH", description = "files, or directories searched for *.yaml")
        List<Path> paths;

        @Option(names = "--quiet", description = "print nothing when all files are valid")
        boolean quiet;

        /** Checks the files with {@code check}; the exit code as {@link CheckCommand#checkAll(List, FileCheck, boolean)}. */
        public int checkAll(FileCheck check) throws IOException {
            return CheckCommand.checkAll(paths, check, quiet);
        }
    }

    @Mixin
    Targets targets;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    /** Validates one file, throwing what is wrong with it; returns null, or a note why it was skipped. */
    @FunctionalInterface
    public interface FileCheck {
        String check(Path file) throws ConfigException;
    }

    @Override
    public Integer call() throws IOException {
        if (verbose) {
            Logging.configure(true, Level.WARN);
        }
        return targets.checkAll(ConfigFiles::check);
    }

    /**
     * Checks files and the YAML files under directories with {@code check}, prints every problem on
     * stderr and returns the exit code: 0 when all are valid, 2 otherwise.
     */
    public static int checkAll(List<Path> paths, FileCheck check, boolean quiet) throws IOException {
        List<Path> files = new ArrayList<>();
        List<Problem> problems = new ArrayList<>();
        for (Path p : paths) {
            if (Files.isDirectory(p)) {
                try (Stream<Path> s = Files.walk(p)) {
                    s.filter(f -> f.toString().endsWith(".yaml") || f.toString().endsWith(".yml")).sorted().forEach(files::add);
                }
            } else {
                files.add(p);
            }
        }
        List<String> notes = new ArrayList<>();
        for (Path f : files) {
            try {
                String note = check.check(f);
                if (note != null) {
                    notes.add(note);
                }
            } catch (ConfigException e) {
                problems.addAll(e.problems());
            }
        }
        problems.forEach(p -> System.err.println(InputFiles.errorLine(p.toString())));
        if (!quiet) {
            notes.forEach(n -> System.out.println(InputFiles.errorLine(n)));
        }
        if (!quiet && problems.isEmpty()) {
            int valid = files.size() - notes.size();
            System.out.println(valid + (valid == 1 ? " file" : " files") + " valid"
                    + (notes.isEmpty() ? "" : ", " + notes.size() + " skipped"));
        }
        return problems.isEmpty() ? 0 : 2;
    }
}
