package hammerstep.trace;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

class StoredTraceTest {

    @TempDir
    Path dir;

    @Test
    void float32KeepsEverySampleExactly() throws Exception {
        float[] x = noise(5000, 1);
        Path f = write(StoredTrace.Encoding.FLOAT32, x, Map.of("joint", "j-1"));

        float[] back = readAll(f);

        assertThat(back).containsExactly(x);
        assertThat(Files.size(f)).isEqualTo(StoredTrace.sizeOf(StoredTrace.Encoding.FLOAT32, 5000, "joint=j-1\n".length()));
    }

    @Test
    void int16IsWithinHalfAStepOfTheLargestTorque() throws Exception {
        float[] x = noise(5000, 2);
        float maxAbs = 0;
        for (float v : x) {
            maxAbs = Math.max(maxAbs, Math.abs(v));
        }
        Path f = write(StoredTrace.Encoding.INT16, x, Map.of());

        float[] back = readAll(f);

        double halfStep = maxAbs / 32767.0 / 2;
        for (int i = 0; i < x.length; i++) {
            assertThat((double) back[i]).isCloseTo(x[i], within(halfStep * 1.001 + 1e-6));
        }
        assertThat(Files.size(f)).isEqualTo(38 + 2L * x.length + 4);
    }

    @Test
    void headerCarriesRateStartAndMetadata() throws Exception {
        Map<String, String> meta = new LinkedHashMap<>();
        meta.put("joint", "j-0042");
        meta.put("program", "hub-final");
        Path f = dir.resolve("t.hst");
        try (OutputStream out = Files.newOutputStream(f)) {
            StoredTrace.write(out, StoredTrace.Encoding.INT16, 25_000, 123_456_789L, meta, new float[] {1, 2, 3}, 0, 3, null);
        }

        StoredTrace.Header h = StoredTrace.readHeader(f);

        assertThat(h.rateHz()).isEqualTo(25_000);
        assertThat(h.firstSampleNs()).isEqualTo(123_456_789L);
        assertThat(h.samples()).isEqualTo(3);
        assertThat(h.metadata()).containsExactlyEntriesOf(meta);
    }

    @Test
    void blockTimesFollowTheRate() throws Exception {
        Path f = dir.resolve("t.hst");
        try (OutputStream out = Files.newOutputStream(f)) {
            StoredTrace.write(out, StoredTrace.Encoding.FLOAT32, 1000, 5_000_000L, Map.of(), new float[2500], 0, 2500, null);
        }
        long[] starts = new long[3];
        int[] n = {0};
        StoredTrace.read(f, new float[1000], (s, o, l, t) -> starts[n[0]++] = t);

        assertThat(starts).containsExactly(5_000_000L, 1_005_000_000L, 2_005_000_000L);
    }

    @Test
    void aTraceCutShortIsReportedNotReadAsShorter() throws Exception {
        Path f = write(StoredTrace.Encoding.INT16, noise(100, 3), Map.of());
        byte[] all = Files.readAllBytes(f);
        Files.write(f, Arrays.copyOf(all, all.length - 10));

        assertThatThrownBy(() -> readAll(f)).isInstanceOf(TraceException.class).hasMessageContaining("cut short");
    }

    @Test
    void aFileOfAnotherKindIsRefusedByName() throws Exception {
        Path f = dir.resolve("other.hst");
        Files.writeString(f, "time_s,torque_nm\n0,1\n0.1,2\n and more text to fill a header");

        assertThatThrownBy(() -> readAll(f)).hasMessage(f + ": not a stored hammerstep trace (no HSTR mark)");
    }

    @Test
    void aTooShortFileIsRefused() throws Exception {
        Path f = dir.resolve("short.hst");
        Files.write(f, new byte[] {'H', 'S'});

        assertThatThrownBy(() -> readAll(f)).hasMessageContaining("too short");
    }

    static float[] noise(int n, long seed) {
        Random r = new Random(seed);
        float[] x = new float[n];
        for (int i = 0; i < n; i++) {
            x[i] = (float) (200 * r.nextGaussian());
        }
        return x;
    }

    private Path write(StoredTrace.Encoding e, float[] x, Map<String, String> meta) throws IOException {
        Path f = dir.resolve("t-" + e + ".hst");
        try (OutputStream out = Files.newOutputStream(f)) {
            StoredTrace.write(out, e, 20_000, 0, meta, x, 0, x.length, null);
        }
        return f;
    }

    static float[] readAll(Path f) throws TraceException {
        StoredTrace.Header h = StoredTrace.readHeader(f);
        float[] out = new float[h.samples()];
        int[] at = {0};
        StoredTrace.read(f, new float[777], (s, o, l, t) -> {
            System.arraycopy(s, o, out, at[0], l);
            at[0] += l;
        });
        return out;
    }
}
