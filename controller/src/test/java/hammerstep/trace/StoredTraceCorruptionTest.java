package hammerstep.trace;

import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/** Damaged stored traces (seeded random byte flips and cuts) are refused with a TraceException or read whole; nothing else escapes. */
class StoredTraceCorruptionTest {

    @TempDir
    Path dir;

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16})
    void aDamagedFileIsRefusedOrReadButNeverThrowsAnythingElse(long seed) throws Exception {
        Random rnd = new Random(seed);
        Path good = dir.resolve("good.hst");
        float[] x = StoredTraceTest.noise(300, seed);
        try (OutputStream out = Files.newOutputStream(good)) {
            StoredTrace.write(out, rnd.nextBoolean() ? StoredTrace.Encoding.INT16 : StoredTrace.Encoding.FLOAT32,
                    20_000, 0, Map.of("joint", "j-" + seed), x, 0, x.length, null);
        }
        byte[] bytes = Files.readAllBytes(good);
        for (int round = 0; round < 50; round++) {
            byte[] bad = Arrays.copyOf(bytes, bytes.length);
            int flips = 1 + rnd.nextInt(4);
            for (int k = 0; k < flips; k++) {
                int at = rnd.nextInt(Math.min(bad.length, 60));
                bad[at] = (byte) rnd.nextInt(256);
            }
            if (rnd.nextInt(4) == 0) {
                bad = Arrays.copyOf(bad, rnd.nextInt(bad.length));
            }
            Path f = dir.resolve("bad.hst");
            Files.write(f, bad);
            try {
                StoredTrace.Header h = StoredTrace.read(f, new float[64], (s, o, l, t) -> { });
                assertThat(h.samples()).isNotNegative();
                assertThat(h.rateHz()).isPositive();
            } catch (TraceException e) {
                assertThat(e.getMessage()).startsWith(f.toString()).doesNotContain("\n");
            }
        }
    }
}
