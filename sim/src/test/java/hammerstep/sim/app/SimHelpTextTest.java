package hammerstep.sim.app;

import hammerstep.app.Cli;
import hammerstep.testing.StandardStreams;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import picocli.CommandLine;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** {@code hammerstep-sim} and every subcommand's {@code --help}: complete, no picocli warning, whole sentences in the list. */
class SimHelpTextTest {

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    @Test
    void everyCommandsHelpIsCompleteWithoutWarnings() {
        CommandLine top = Cli.commandLine(new SimMain());
        List<String> names = new ArrayList<>(top.getSubcommands().keySet());
        names.add("");
        for (String name : names) {
            String[] args = name.isEmpty() ? new String[] {"--help"} : new String[] {name, "--help"};
            int exit = SimMain.run(args);
            assertThat(exit).as(String.join(" ", args)).isZero();
            assertThat(streams.out()).as(name).contains("Usage: hammerstep-sim").doesNotContain("Could not format");
            assertThat(streams.err()).as(name).doesNotContain("WARN").doesNotContain("Could not format");
            streams.clear();
        }
    }

    @Test
    void theCommandListGivesEachCommandAWholeSentence() {
        for (var e : Cli.commandLine(new SimMain()).getSubcommands().entrySet()) {
            var usage = e.getValue().getCommandSpec().usageMessage();
            String[] shown = usage.header().length > 0 ? usage.header() : usage.description();
            assertThat(shown.length > 0 ? shown[0] : "").as(e.getKey()).matches("[A-Z].*\\.");
        }
    }
}
