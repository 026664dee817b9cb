package hammerstep.sim.app;

import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class SimCheckCommandTest {

    @TempDir
    Path dir;

    private final ByteArrayOutputStream err = new ByteArrayOutputStream();
    private PrintStream oldErr;

    @BeforeEach
    void capture() {
        oldErr = System.err;
        System.setErr(new PrintStream(err, true, StandardCharsets.UTF_8));
    }

    @AfterEach
    void restore() {
        System.setErr(oldErr);
    }

    @Test
    void theWholeConfigTreeIsValid() {
        assertThat(SimMain.run("check", "--quiet", "../config")).isZero();
        assertThat(err.toString(StandardCharsets.UTF_8)).isEmpty();
    }

    @Test
    void aBrokenPresetNamesItsLineAndColumn() throws Exception {
        Path tools = Files.createDirectories(dir.resolve("tools"));
        Path bad = tools.resolve("bad.yaml");
        Files.writeString(bad, Files.readString(Path.of("../config/sim/tools/cordless-two-dog.yaml"))
                .replace("name: cordless-two-dog", "name: cordless-two-dog\nflavour: strong"));
        assertThat(SimMain.run("check", bad.toString())).isEqualTo(2);
        assertThat(err.toString(StandardCharsets.UTF_8)).startsWith(bad + ":").contains("unknown key 'flavour'");
    }
}
