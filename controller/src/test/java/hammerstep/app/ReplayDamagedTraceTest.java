package hammerstep.app;

import hammerstep.trace.StoredTrace;
import hammerstep.trace.SyntheticRundown;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/** replay and plot refuse a damaged stored trace with one line naming it, exit 2, and judge nothing. */
class ReplayDamagedTraceTest {

    @TempDir
    Path dir;

    private Path damaged() throws Exception {
        float[] x = SyntheticRundown.samples(8, 130, 206, 55);
        Path hst = dir.resolve("0000000007-joint.hst");
        try (OutputStream out = Files.newOutputStream(hst)) {
            StoredTrace.write(out, StoredTrace.Encoding.INT16, SyntheticRundown.RATE_HZ, 0, Map.of(), x, 0, x.length, null);
        }
        byte[] b = Files.readAllBytes(hst);
        b[30] ^= 0x01; // a bit of the scale
        Files.write(hst, b);
        return hst;
    }

    @Test
    void replayRefusesAFlippedBitByName() throws Exception {
        Path hst = damaged();

        Captured c = Captured.run("replay", hst.toString(), "--program", PlotCommandTest.PROGRAM);

        assertThat(c.exit()).isEqualTo(2);
        assertThat(c.out()).isEmpty();
        assertThat(c.err().lines()).singleElement().asString().startsWith(hst + ": checksum does not match");
    }

    @Test
    void plotRefusesAFlippedBitByName() throws Exception {
        Path hst = damaged();

        Captured c = Captured.run("plot", hst.toString(), "--program", PlotCommandTest.PROGRAM,
                "--out", dir.resolve("p.svg").toString());

        assertThat(c.exit()).isEqualTo(2);
        assertThat(c.err().lines()).singleElement().asString().startsWith(hst + ": checksum does not match");
        assertThat(dir.resolve("p.svg")).doesNotExist();
    }
}
