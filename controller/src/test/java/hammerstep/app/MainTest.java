package hammerstep.app;

import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

/** The command tree: one subcommand built when one is named, the whole tree otherwise. */
class MainTest {

    @Test
    void namingACommandBuildsOnlyThatOne() {
        for (String name : Main.COMMANDS) {
            if (!name.equals("help")) {
                assertThat(Main.commandLine(name, "--x").getSubcommands()).as(name).containsOnlyKeys(name);
            }
        }
    }

    @Test
    void withoutAKnownCommandTheWholeTreeIsBuilt() {
        for (String[] args : new String[][] {{}, {"--help"}, {"help"}, {"replya"}}) {
            assertThat(Main.commandLine(args).getSubcommands()).containsOnlyKeys(Main.COMMANDS.toArray(String[]::new));
        }
    }

    @Test
    void helpListsEveryCommandAndATypoIsBadInput() {
        Captured help = Captured.run("--help");
        assertThat(help.exit()).isZero();
        for (String name : Main.COMMANDS) {
            assertThat(help.out()).contains(name);
        }
        assertThat(Captured.run("replya", "t.csv").exit()).isEqualTo(2);
    }
}
