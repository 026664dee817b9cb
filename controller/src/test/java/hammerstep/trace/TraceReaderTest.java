package hammerstep.trace;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class TraceReaderTest {

    @TempDir
    Path dir;

    private final List<Float> samples = new ArrayList<>();
    private final List<Long> blockStarts = new ArrayList<>();

    private void collect(float[] x, int off, int len, long ns) {
        blockStarts.add(ns);
        for (int i = 0; i < len; i++) {
            samples.add(x[off + i]);
        }
    }

    private Path csv(String text) throws IOException {
        Path p = dir.resolve("t.csv");
        Files.writeString(p, text);
        return p;
    }

    @Test
    void readsMetadataHeaderAndRowsInBlocks() throws Exception {
        Path p = csv("# rate_hz=1000\n# tool=demo\ntime_s,torque_nm\n0.000,1.5\n0.001,2.5\n0.002,3.5\n");
        TraceReader.Info info = TraceReader.readCsv(p, 0, new float[2], this::collect);
        assertThat(info.rateHz()).isEqualTo(1000);
        assertThat(info.metadata()).containsEntry("tool", "demo");
        assertThat(samples).containsExactly(1.5f, 2.5f, 3.5f);
        assertThat(blockStarts).containsExactly(0L, 2_000_000L);
    }

    @Test
    void rateComesFromTheRowsWhenTheMetadataHasNone() throws Exception {
        Path p = csv("time_s,torque_nm\n0.0,0\n0.00002,0\n");
        assertThat(TraceReader.peekCsv(p).rateHz()).isCloseTo(50_000, org.assertj.core.api.Assertions.within(1e-6));
    }

    @Test
    void malformedRowNamesItsLine() throws IOException {
        Path p = csv("# rate_hz=1000\ntime_s,torque_nm\n0.000,1.5\n0.001;2.5\n");
        assertThatThrownBy(() -> TraceReader.readCsv(p, 0, new float[8], this::collect))
                .isInstanceOf(TraceException.class).hasMessage(p + ":4: expected two values 'time_s,torque_nm', got '0.001;2.5'");
    }

    @Test
    void timeMustIncrease() throws IOException {
        Path p = csv("# rate_hz=1000\ntime_s,torque_nm\n0.000,1.5\n0.001,2.5\n0.001,2.5\n");
        assertThatThrownBy(() -> TraceReader.readCsv(p, 0, new float[8], this::collect))
                .isInstanceOf(TraceException.class).hasMessage(p + ":5: time 0.001 s does not increase (previous 0.001 s)");
    }

    @Test
    void notANumberIsRefused() throws IOException {
        Path p = csv("# rate_hz=1000\ntime_s,torque_nm\n0.000,NaN\n");
        assertThatThrownBy(() -> TraceReader.readCsv(p, 0, new float[8], this::collect))
                .isInstanceOf(TraceException.class).hasMessage(p + ":3: torque_nm 'NaN' is not a finite number");
    }

    @Test
    void wrongHeaderIsRefused() throws IOException {
        Path p = csv("t,torque\n0,1\n");
        assertThatThrownBy(() -> TraceReader.readCsv(p, 0, new float[8], this::collect))
                .isInstanceOf(TraceException.class).hasMessageContaining(":1: expected the header 'time_s,torque_nm'");
    }

    @Test
    void truncatedFileWithoutRowsHasNoRate() throws IOException {
        Path p = csv("time_s,torque_nm\n0.0,1.0\n");
        assertThatThrownBy(() -> TraceReader.peekCsv(p)).isInstanceOf(TraceException.class).hasMessageContaining("no sample rate");
    }

    @Test
    void missingFileIsOneLine() {
        assertThatThrownBy(() -> TraceReader.readCsv(dir.resolve("none.csv"), 0, new float[8], this::collect))
                .hasMessage(dir.resolve("none.csv") + ": no such file");
    }

    @Test
    void readsRawFloat32LittleEndian() throws Exception {
        Path p = dir.resolve("t.f32");
        ByteBuffer b = ByteBuffer.allocate(5 * 4).order(ByteOrder.LITTLE_ENDIAN);
        for (int i = 0; i < 5; i++) {
            b.putFloat(i * 10f);
        }
        Files.write(p, b.array());
        TraceReader.readF32(p, 1000, new float[2], this::collect);
        assertThat(samples).containsExactly(0f, 10f, 20f, 30f, 40f);
        assertThat(blockStarts).containsExactly(0L, 2_000_000L, 4_000_000L);
    }

    @Test
    void float32FileOfTornLengthIsRefused() throws IOException {
        Path p = dir.resolve("t.f32");
        Files.write(p, new byte[7]);
        assertThatThrownBy(() -> TraceReader.readF32(p, 1000, new float[2], this::collect))
                .hasMessage(p + ": size 7 bytes is not a whole number of float32 samples");
    }

    @Test
    void writerOutputReadsBack() throws Exception {
        Path p = dir.resolve("w.csv");
        try (TraceWriter w = new TraceWriter(p, 20_000, Map.of("seed", "3"))) {
            w.write(new float[] {0f, 1.25f, -2.5f}, 0, 3);
        }
        TraceReader.Info info = TraceReader.readCsv(p, 0, new float[16], this::collect);
        assertThat(info.rateHz()).isEqualTo(20_000);
        assertThat(info.metadata()).containsEntry("seed", "3");
        assertThat(samples).containsExactly(0f, 1.25f, -2.5f);
    }
}
