package hammerstep.app;

import hammerstep.testing.StandardStreams;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import picocli.CommandLine.Command;

import java.util.concurrent.Callable;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The last resort at the command edge: an {@link Error} that the input bounds did not prevent is one
 * line and exit 1, never a stack trace (the JVM's own handler would print 20 lines of frames).
 */
class CliLastResortTest {

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    @Command(name = "greedy")
    static final class Greedy implements Callable<Integer> {
        @Override
        public Integer call() {
            throw new OutOfMemoryError("Java heap space");
        }
    }

    @Command(name = "deep")
    static final class Deep implements Callable<Integer> {
        @Override
        public Integer call() {
            throw new StackOverflowError();
        }
    }

    @Test
    void outOfMemoryIsOneLineAndExitOne() {
        int exit = Cli.execute(Cli.commandLine(new Greedy()));
        assertThat(exit).isEqualTo(1);
        assertThat(streams.err().lines()).singleElement().satisfies(l -> assertThat(l)
                .startsWith("greedy: out of memory (heap ").endsWith("MB); the input is too large for it"));
    }

    @Test
    void aStackOverflowIsOneLineAndExitOne() {
        int exit = Cli.execute(Cli.commandLine(new Deep()));
        assertThat(exit).isEqualTo(1);
        assertThat(streams.err().lines()).containsExactly("deep: input nested too deeply (stack overflow)");
    }
}
