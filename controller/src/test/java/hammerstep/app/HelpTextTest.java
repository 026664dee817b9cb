package hammerstep.app;

import hammerstep.testing.StandardStreams;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import picocli.CommandLine;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code --help} of every command and subcommand prints its whole text without a picocli warning
 * (a {@code %} in a description is a format specifier to picocli and must be written {@code %%}),
 * and the one line each command gets in {@code hammerstep --help} is a whole sentence.
 */
class HelpTextTest {

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    /** Every command path below the top, e.g. {@code [replay]}, as the user would type it. */
    static List<List<String>> commandPaths(CommandLine top) {
        List<List<String>> paths = new ArrayList<>();
        collect(top, new ArrayList<>(), paths);
        return paths;
    }

    private static void collect(CommandLine cl, List<String> prefix, List<List<String>> paths) {
        paths.add(List.copyOf(prefix));
        for (var e : cl.getSubcommands().entrySet()) {
            List<String> p = new ArrayList<>(prefix);
            p.add(e.getKey());
            collect(e.getValue(), p, paths);
        }
    }

    @Test
    void everyCommandsHelpIsCompleteWithoutWarnings() {
        List<List<String>> paths = commandPaths(Main.commandLine());
        assertThat(paths).hasSizeGreaterThanOrEqualTo(Main.COMMANDS.size() + 1);
        for (List<String> path : paths) {
            List<String> args = new ArrayList<>(path);
            args.add("--help");
            int exit = Main.run(args.toArray(String[]::new));
            String out = streams.out();
            String err = streams.err();
            assertThat(exit).as(String.join(" ", args)).isZero();
            assertThat(out).as(String.join(" ", args)).contains("Usage: hammerstep").doesNotContain("WARN")
                    .doesNotContain("Could not format");
            assertThat(err).as(String.join(" ", args)).doesNotContain("WARN").doesNotContain("Could not format");
            streams.clear();
        }
    }

    @Test
    void theCommandListGivesEachCommandAWholeSentence() {
        for (var e : Main.commandLine().getSubcommands().entrySet()) {
            var usage = e.getValue().getCommandSpec().usageMessage();
            // the list shows the header where there is one (picocli's help command), else the first description line
            String[] shown = usage.header().length > 0 ? usage.header() : usage.description();
            String first = shown.length > 0 ? shown[0] : "";
            assertThat(first).as(e.getKey()).matches("[A-Z].*\\.");
        }
    }
}
