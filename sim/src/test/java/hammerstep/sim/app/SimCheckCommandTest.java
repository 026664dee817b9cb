package hammerstep.sim.app;

import hammerstep.testing.StandardStreams;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class SimCheckCommandTest {

    @TempDir
    Path dir;

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    @Test
    void theWholeConfigTreeIsValid() {
        assertThat(SimMain.run("check", "--quiet", "../config")).isZero();
        assertThat(streams.err()).isEmpty();
    }

    @Test
    void aBrokenPresetNamesItsLineAndColumn() throws Exception {
        Path tools = Files.createDirectories(dir.resolve("tools"));
        Path bad = tools.resolve("bad.yaml");
        Files.writeString(bad, Files.readString(Path.of("../config/sim/tools/cordless-two-dog.yaml"))
                .replace("name: cordless-two-dog", "name: cordless-two-dog\nflavour: strong"));
        assertThat(SimMain.run("check", bad.toString())).isEqualTo(2);
        assertThat(streams.err()).startsWith(bad + ":").contains("unknown key 'flavour'");
    }
}
