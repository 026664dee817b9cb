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

class ReplayStoredTraceTest {

    @TempDir
    Path dir;

    @Test
    void replaysAStoredTraceLikeTheSameTraceInCsv() throws Exception {
        float[] x = SyntheticRundown.samples(8, 130, 206, 55);
        Path csv = dir.resolve("t.csv");
        SyntheticRundown.writeCsv(csv, x);
        Path hst = dir.resolve("t.hst");
        try (OutputStream out = Files.newOutputStream(hst)) {
            StoredTrace.write(out, StoredTrace.Encoding.FLOAT32, SyntheticRundown.RATE_HZ, 0, Map.of(), x, 0, x.length, null);
        }

        Captured fromCsv = Captured.run("replay", csv.toString(), "--program", PlotCommandTest.PROGRAM);
        Captured fromStore = Captured.run("replay", hst.toString(), "--program", PlotCommandTest.PROGRAM);

        assertThat(fromStore.exit()).as(fromStore.err()).isZero();
        assertThat(fromStore.out()).contains("\"blows\":8", "\"final_torque_nm\":206.0").isEqualTo(fromCsv.out());
    }
}
