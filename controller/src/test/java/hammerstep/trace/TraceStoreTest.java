package hammerstep.trace;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

class TraceStoreTest {

    @TempDir
    Path dir;

    static final float[] SAMPLES = new float[1000];

    @Test
    void keepsAtMostTheConfiguredNumberOfTracesDeletingTheOldest() throws Exception {
        TraceStore store = new TraceStore(dir, 3, Long.MAX_VALUE, StoredTrace.Encoding.INT16);
        for (int i = 1; i <= 5; i++) {
            store.save("j-" + i, Map.of(), SAMPLES, 1000, 20_000, 0);
        }

        assertThat(names()).containsExactly("0000000002-j-3.hst", "0000000003-j-4.hst", "0000000004-j-5.hst");
        assertThat(store.count()).isEqualTo(3);
    }

    @Test
    void keepsWithinTheByteLimit() throws Exception {
        long one = StoredTrace.sizeOf(StoredTrace.Encoding.INT16, 1000, 0);
        TraceStore store = new TraceStore(dir, 100, 2 * one + 10, StoredTrace.Encoding.INT16);
        for (int i = 1; i <= 4; i++) {
            store.save("j-" + i, Map.of(), SAMPLES, 1000, 20_000, 0);
        }

        assertThat(names()).hasSize(2);
        assertThat(store.bytes()).isEqualTo(2 * one);
    }

    @Test
    void alwaysKeepsTheTraceJustWrittenEvenIfItAloneExceedsTheLimit() throws Exception {
        TraceStore store = new TraceStore(dir, 10, 100, StoredTrace.Encoding.INT16);

        Path p = store.save("big", Map.of(), SAMPLES, 1000, 20_000, 0);

        assertThat(p).exists();
        assertThat(store.count()).isEqualTo(1);
    }

    @Test
    void continuesNumberingAndRetentionAfterARestart() throws Exception {
        TraceStore first = new TraceStore(dir, 3, Long.MAX_VALUE, StoredTrace.Encoding.INT16);
        first.save("a", Map.of(), SAMPLES, 1000, 20_000, 0);
        first.save("b", Map.of(), SAMPLES, 1000, 20_000, 0);
        Files.writeString(dir.resolve("0000000009-half.hst.tmp"), "left by a crash");

        TraceStore again = new TraceStore(dir, 3, Long.MAX_VALUE, StoredTrace.Encoding.INT16);
        again.save("c", Map.of(), SAMPLES, 1000, 20_000, 0);
        again.save("d", Map.of(), SAMPLES, 1000, 20_000, 0);

        assertThat(names()).containsExactly("0000000001-b.hst", "0000000002-c.hst", "0000000003-d.hst");
    }

    @Test
    void storesTheSpanOfARecorderReadableWithItsMetadata() throws Exception {
        TraceRecorder rec = new TraceRecorder(1000, 100);
        float[] block = new float[10];
        for (int b = 0; b < 10; b++) {
            java.util.Arrays.fill(block, b);
            rec.onSamples(block, 0, 10, b * 10_000_000L);
        }
        TraceStore store = new TraceStore(dir, 10, Long.MAX_VALUE, StoredTrace.Encoding.FLOAT32);

        Path p = store.save("j/7 odd:name", Map.of("joint", "j/7"), rec, 20_000_000L, 39_000_000L);

        assertThat(p.getFileName().toString()).isEqualTo("0000000000-j_7_odd_name.hst");
        StoredTrace.Header h = StoredTrace.readHeader(p);
        assertThat(h.samples()).isEqualTo(20);
        assertThat(h.firstSampleNs()).isEqualTo(20_000_000L);
        assertThat(h.metadata()).containsEntry("joint", "j/7");
        float[] back = StoredTraceTest.readAll(p);
        assertThat(back[0]).isEqualTo(2);
        assertThat(back[19]).isEqualTo(3);
    }

    private List<String> names() throws Exception {
        try (Stream<Path> s = Files.list(dir)) {
            return s.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }
}
