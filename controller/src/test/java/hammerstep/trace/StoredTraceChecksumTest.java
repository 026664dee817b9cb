package hammerstep.trace;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** A stored trace carries a CRC32C: any damage is refused by name before a sample reaches a chain. */
class StoredTraceChecksumTest {

    @TempDir
    Path dir;

    private Path good;
    private byte[] bytes;

    private void writeGood(StoredTrace.Encoding encoding) throws Exception {
        good = dir.resolve("0000000001-joint.hst");
        float[] x = StoredTraceTest.noise(2000, 7);
        try (OutputStream out = Files.newOutputStream(good)) {
            StoredTrace.write(out, encoding, 20_000, 1_000, Map.of("program", "hub-final"), x, 0, x.length, null);
        }
        bytes = Files.readAllBytes(good);
    }

    private Path damaged(byte[] b) throws Exception {
        Path f = dir.resolve("damaged.hst");
        Files.write(f, b);
        return f;
    }

    /** Reads through the sink and fails the test if a single sample is handed on. */
    private static void refusedBeforeAnySample(Path f, String... phrases) {
        int[] handed = {0};
        assertThatThrownBy(() -> StoredTrace.read(f, new float[256], (s, o, l, t) -> handed[0] += l))
                .isInstanceOf(TraceException.class)
                .satisfies(e -> {
                    assertThat(e.getMessage()).startsWith(f + ": ").doesNotContain("\n");
                    for (String p : phrases) {
                        assertThat(e.getMessage()).contains(p);
                    }
                });
        assertThat(handed[0]).as("samples handed on from a damaged trace").isZero();
        assertThatThrownBy(() -> StoredTrace.readHeader(f)).isInstanceOf(TraceException.class);
        assertThatThrownBy(() -> StoredTrace.load(f)).isInstanceOf(TraceException.class);
    }

    @Test
    void aFlippedBitInTheScaleFieldIsRefused() throws Exception {
        writeGood(StoredTrace.Encoding.INT16);
        byte[] b = bytes.clone();
        b[24 + 6] ^= 0x01; // the scale's exponent: the GO 289.42 that read as 305.42

        refusedBeforeAnySample(damaged(b), "checksum does not match", "refused");
    }

    @Test
    void aFlippedBitInTheSampleCountIsRefusedNotReadAsShorter() throws Exception {
        writeGood(StoredTrace.Encoding.INT16);
        byte[] b = bytes.clone();
        b[32] ^= 0x04;

        refusedBeforeAnySample(damaged(b), "checksum does not match");
    }

    @Test
    void aFlippedBitInTheMetadataIsRefused() throws Exception {
        writeGood(StoredTrace.Encoding.INT16);
        byte[] b = bytes.clone();
        b[40] ^= 0x20;

        refusedBeforeAnySample(damaged(b), "checksum does not match");
    }

    @Test
    void aFlippedBitInTheSamplesIsRefused() throws Exception {
        for (StoredTrace.Encoding e : StoredTrace.Encoding.values()) {
            writeGood(e);
            byte[] b = bytes.clone();
            b[b.length - 700] ^= 0x40;

            refusedBeforeAnySample(damaged(b), "checksum does not match");
        }
    }

    @Test
    void aFlippedBitInTheChecksumItselfIsRefused() throws Exception {
        writeGood(StoredTrace.Encoding.FLOAT32);
        byte[] b = bytes.clone();
        b[b.length - 1] ^= 0x01;

        refusedBeforeAnySample(damaged(b), "checksum does not match");
    }

    @Test
    void aTruncatedTraceIsRefusedAsCutShort() throws Exception {
        writeGood(StoredTrace.Encoding.INT16);
        for (int cut : new int[] {1, 4, 5, 1000, bytes.length - 39}) {
            refusedBeforeAnySample(damaged(Arrays.copyOf(bytes, bytes.length - cut)), "cut short");
        }
    }

    @Test
    void garbageAppendedAfterTheChecksumIsRefused() throws Exception {
        writeGood(StoredTrace.Encoding.INT16);
        byte[] b = Arrays.copyOf(bytes, bytes.length + 16);
        Arrays.fill(b, bytes.length, b.length, (byte) 0x5a);

        refusedBeforeAnySample(damaged(b), "appended to");
    }

    @Test
    void aWholeSecondTraceAppendedIsRefused() throws Exception {
        writeGood(StoredTrace.Encoding.FLOAT32);
        byte[] b = Arrays.copyOf(bytes, 2 * bytes.length);
        System.arraycopy(bytes, 0, b, bytes.length, bytes.length);

        refusedBeforeAnySample(damaged(b));
    }

    @Test
    void anIntactTraceIsCheckedAndReadWhole() throws Exception {
        writeGood(StoredTrace.Encoding.FLOAT32);

        StoredTrace.Loaded t = StoredTrace.load(good);

        assertThat(t.header().checked()).isTrue();
        assertThat(t.header().version()).isEqualTo(2);
        assertThat(t.samples()).containsExactly(StoredTraceTest.noise(2000, 7));
        assertThat(t.header().programId()).isEqualTo("hub-final");
    }

    @Test
    void aVersionOneTraceIsStillReadButMarkedUnchecked() throws Exception {
        writeGood(StoredTrace.Encoding.FLOAT32);
        // version 1 was the same layout without the checksum
        byte[] v1 = Arrays.copyOf(bytes, bytes.length - 4);
        ByteBuffer.wrap(v1).order(ByteOrder.LITTLE_ENDIAN).putShort(4, (short) 1);
        Path f = damaged(v1);

        StoredTrace.Loaded t = StoredTrace.load(f);

        assertThat(t.header().checked()).isFalse();
        assertThat(t.samples()).containsExactly(StoredTraceTest.noise(2000, 7));
    }

    @Test
    void aSingleFlippedBitCannotMakeVersionTwoReadAsUncheckedVersionOne() throws Exception {
        writeGood(StoredTrace.Encoding.INT16);
        for (int bit = 0; bit < 16; bit++) {
            byte[] b = bytes.clone();
            b[4 + bit / 8] ^= (byte) (1 << (bit % 8));
            Path f = damaged(b);

            assertThatThrownBy(() -> StoredTrace.load(f)).isInstanceOf(TraceException.class);
        }
    }
}
