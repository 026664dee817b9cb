package hammerstep.trace;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class F32TraceTest {

    @TempDir
    Path dir;

    private Path write(int samples) throws IOException {
        ByteBuffer b = ByteBuffer.allocate(samples * 4).order(ByteOrder.LITTLE_ENDIAN);
        for (int i = 0; i < samples; i++) {
            b.putFloat(i * 0.5f);
        }
        return Files.write(dir.resolve("t.f32"), b.array());
    }

    @Test
    void readsAcrossWindowsForwardAndBack() throws Exception {
        try (F32Trace t = F32Trace.open(write(10_007), 1000)) {
            assertThat(t.samples()).isEqualTo(10_007);
            float[] into = new float[2500];
            for (long from : new long[] {0, 999, 1000, 2999, 7507, 5, 998}) {
                t.read(from, into, 2500);
                for (int i = 0; i < 2500; i++) {
                    assertThat(into[i]).as("sample %d", from + i).isEqualTo((from + i) * 0.5f);
                }
            }
        }
    }

    @Test
    void threadsReadingAtOnceEachGetTheirOwnStretch() throws Exception {
        try (F32Trace t = F32Trace.open(write(40_000), 700)) {
            int threads = 4;
            java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(threads);
            try {
                java.util.List<java.util.concurrent.Future<Integer>> wrong = new java.util.ArrayList<>();
                for (int n = 0; n < threads; n++) {
                    int start = n * 10_000;
                    wrong.add(pool.submit(() -> {
                        float[] into = new float[333];
                        int bad = 0;
                        for (int s = start; s + 333 <= start + 10_000; s += 333) {
                            t.read(s, into, 333);
                            for (int i = 0; i < 333; i++) {
                                bad += into[i] == (s + i) * 0.5f ? 0 : 1;
                            }
                        }
                        return bad;
                    }));
                }
                for (java.util.concurrent.Future<Integer> f : wrong) {
                    assertThat(f.get()).isZero();
                }
            } finally {
                pool.shutdownNow();
            }
        }
    }

    @Test
    void aFileCutShortAfterOpeningIsReportedWithItsName() throws Exception {
        Path p = write(5000);
        try (F32Trace t = F32Trace.open(p, 1000)) {
            float[] first = new float[10];
            t.read(0, first, 10);
            try (java.nio.channels.FileChannel ch = java.nio.channels.FileChannel.open(p,
                    java.nio.file.StandardOpenOption.WRITE)) {
                ch.truncate(3000 * 4);
            }
            assertThatThrownBy(() -> t.read(2500, new float[1000], 1000))
                    .isInstanceOf(java.io.UncheckedIOException.class)
                    .hasMessage(p + ": the file ended at byte 12000, shorter than when it was opened");
            // the failed read leaves no window claiming bytes it overwrote
            t.read(0, first, 10);
            assertThat(first).containsExactly(0f, 0.5f, 1f, 1.5f, 2f, 2.5f, 3f, 3.5f, 4f, 4.5f);
        }
    }

    @Test
    void traceWriterWritesWhatF32TraceReads() throws Exception {
        Path p = dir.resolve("w.f32");
        float[] x = new float[10_000];
        for (int i = 0; i < x.length; i++) {
            x[i] = (float) Math.sin(i * 0.01) * 300f;
        }
        try (TraceWriter w = new TraceWriter(p, 50_000, java.util.Map.of("ignored", "in .f32"))) {
            w.write(x, 0, 7000);
            w.write(x, 7000, 3000);
        }
        F32Trace t = F32Trace.open(p);
        float[] back = new float[x.length];
        t.read(0, back, back.length);
        assertThat(back).containsExactly(x);
    }

    @Test
    void aLongInMemoryTraceReadsAcrossWindows() {
        float[] x = new float[F32Trace.WINDOW_SAMPLES * 2 + 17];
        for (int i = 0; i < x.length; i++) {
            x[i] = i;
        }
        F32Trace t = F32Trace.of(x);
        float[] into = new float[4096];
        for (long from : new long[] {0, F32Trace.WINDOW_SAMPLES - 100L, x.length - 4096L, 3}) {
            t.read(from, into, 4096);
            assertThat(into[0]).isEqualTo((float) from);
            assertThat(into[4095]).isEqualTo((float) (from + 4095));
        }
    }

    @Test
    void inMemoryTraceReadsLikeAFile() {
        F32Trace t = F32Trace.of(new float[] {1f, -2.5f, 3f, 4f});
        float[] into = new float[2];
        t.read(1, into, 2);
        assertThat(t.samples()).isEqualTo(4);
        assertThat(into).containsExactly(-2.5f, 3f);
    }

    @Test
    void refusesReadsPastTheEnd() throws Exception {
        F32Trace t = F32Trace.open(write(100), 64);
        assertThatThrownBy(() -> t.read(90, new float[20], 20)).isInstanceOf(IndexOutOfBoundsException.class);
    }

    @Test
    void refusesATornFile() throws Exception {
        Path p = Files.write(dir.resolve("torn.f32"), new byte[10]);
        assertThatThrownBy(() -> F32Trace.open(p)).isInstanceOf(TraceException.class)
                .hasMessageContaining("not a whole number of float32 samples");
    }
}
