package hammerstep.trace;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;

/**
 * The compact binary trace the station keeps for every joint ({@code .hst}). Little-endian:
 * <pre>
 * offset  size  field
 *      0     4  magic "HSTR"
 *      4     2  format version (1)
 *      6     2  sample encoding: 1 = int16 counts × scale, 2 = float32 N·m
 *      8     8  sample rate, Hz (float64)
 *     16     8  time of the first sample, ns (int64, the station's clock)
 *     24     8  scale, N·m per count (float64; 0 for float32)
 *     32     4  number of samples (int32)
 *     36     2  metadata length m in bytes (uint16)
 *     38     m  metadata, UTF-8 lines "key=value\n" (joint id, program, revision, position, ...)
 *   38+m        samples
 * </pre>
 * int16 keeps a joint's trace at 2 bytes a sample with a resolution of the trace's largest
 * |torque| / 32767 (the scale is chosen per trace); float32 is lossless for N·m samples.
 */
public final class StoredTrace {

    public static final String EXTENSION = ".hst";
    static final int MAGIC = 0x52545348; // "HSTR" read little-endian
    static final int VERSION = 1;
    static final int HEADER_BYTES = 38;
    static final int MAX_METADATA_BYTES = 4096;

    /** How samples are stored. */
    public enum Encoding {
        INT16(1, 2), FLOAT32(2, 4);

        final int code;
        final int bytes;

        Encoding(int code, int bytes) {
            this.code = code;
            this.bytes = bytes;
        }

        static Encoding of(int code) {
            for (Encoding e : values()) {
                if (e.code == code) {
                    return e;
                }
            }
            return null;
        }
    }

    /** What a stored trace's header says. */
    public record Header(Encoding encoding, double rateHz, long firstSampleNs, double scaleNm, int samples,
                         Map<String, String> metadata) {
    }

    private StoredTrace() {
    }

    public static boolean isStored(Path path) {
        return path.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(EXTENSION);
    }

    /** Bytes a trace of {@code samples} samples takes, for the retention arithmetic. */
    public static long sizeOf(Encoding encoding, int samples, int metadataBytes) {
        return HEADER_BYTES + metadataBytes + (long) samples * encoding.bytes;
    }

    /**
     * Writes {@code samples[offset, offset+length)} to {@code out}. {@code scratch} is a reusable
     * buffer (grown when short); the method returns it so a caller can keep it for the next trace.
     */
    public static ByteBuffer write(OutputStream out, Encoding encoding, double rateHz, long firstSampleNs,
                                   Map<String, String> metadata, float[] samples, int offset, int length,
                                   ByteBuffer scratch) throws IOException {
        byte[] meta = metadata(metadata);
        double scale = 0;
        if (encoding == Encoding.INT16) {
            float maxAbs = 0;
            for (int i = offset; i < offset + length; i++) {
                float a = Math.abs(samples[i]);
                if (a > maxAbs && Float.isFinite(a)) {
                    maxAbs = a;
                }
            }
            scale = maxAbs > 0 ? maxAbs / 32767.0 : 1e-3;
        }
        long size = sizeOf(encoding, length, meta.length);
        if (size > Integer.MAX_VALUE) {
            throw new IOException("trace of " + length + " samples is too long to store");
        }
        ByteBuffer b = scratch != null && scratch.capacity() >= size ? scratch.clear()
                : ByteBuffer.allocate((int) Math.max(size, scratch == null ? 0 : scratch.capacity() * 2L));
        b.order(ByteOrder.LITTLE_ENDIAN);
        b.putInt(MAGIC).putShort((short) VERSION).putShort((short) encoding.code).putDouble(rateHz)
                .putLong(firstSampleNs).putDouble(scale).putInt(length).putShort((short) meta.length).put(meta);
        if (encoding == Encoding.INT16) {
            double inv = 1.0 / scale;
            for (int i = offset; i < offset + length; i++) {
                float v = samples[i];
                long c = Float.isNaN(v) ? 0 : Math.round(v * inv);
                b.putShort((short) Math.max(-32767, Math.min(32767, c)));
            }
        } else {
            for (int i = offset; i < offset + length; i++) {
                b.putFloat(samples[i]);
            }
        }
        out.write(b.array(), 0, b.position());
        return b;
    }

    /** Reads only the header (and metadata) of a stored trace. */
    public static Header readHeader(Path path) throws TraceException {
        try (FileChannel ch = FileChannel.open(path, StandardOpenOption.READ)) {
            return header(path, ch);
        } catch (NoSuchFileException e) {
            throw new TraceException(path + ": no such file");
        } catch (IOException e) {
            throw new TraceException(path + ": cannot read: " + e.getMessage());
        }
    }

    /** Streams a stored trace through {@code sink} in blocks of up to {@code block.length} samples. */
    public static Header read(Path path, float[] block, SampleSink sink) throws TraceException {
        try (FileChannel ch = FileChannel.open(path, StandardOpenOption.READ)) {
            Header h = header(path, ch);
            int unit = h.encoding().bytes;
            ByteBuffer buf = ByteBuffer.allocate(block.length * unit).order(ByteOrder.LITTLE_ENDIAN);
            double periodNs = 1e9 / h.rateHz();
            long done = 0;
            while (done < h.samples()) {
                int k = (int) Math.min(block.length, h.samples() - done);
                buf.clear().limit(k * unit);
                while (buf.hasRemaining()) {
                    if (ch.read(buf) < 0) {
                        throw new TraceException(path + ": ends after " + (done + (k * unit - buf.remaining()) / unit)
                                + " of " + h.samples() + " samples (cut short)");
                    }
                }
                buf.flip();
                if (h.encoding() == Encoding.INT16) {
                    for (int i = 0; i < k; i++) {
                        block[i] = (float) (buf.getShort() * h.scaleNm());
                    }
                } else {
                    for (int i = 0; i < k; i++) {
                        block[i] = buf.getFloat();
                    }
                }
                sink.onSamples(block, 0, k, h.firstSampleNs() + Math.round(done * periodNs));
                done += k;
            }
            return h;
        } catch (NoSuchFileException e) {
            throw new TraceException(path + ": no such file");
        } catch (IOException e) {
            throw new TraceException(path + ": cannot read: " + e.getMessage());
        }
    }

    private static Header header(Path path, FileChannel ch) throws IOException, TraceException {
        ByteBuffer h = ByteBuffer.allocate(HEADER_BYTES).order(ByteOrder.LITTLE_ENDIAN);
        while (h.hasRemaining()) {
            if (ch.read(h) < 0) {
                throw new TraceException(path + ": too short for a stored trace header (" + h.position() + " bytes)");
            }
        }
        h.flip();
        if (h.getInt() != MAGIC) {
            throw new TraceException(path + ": not a stored hammerstep trace (no HSTR mark)");
        }
        int version = h.getShort() & 0xffff;
        if (version != VERSION) {
            throw new TraceException(path + ": stored trace version " + version + ", this build reads " + VERSION);
        }
        int code = h.getShort() & 0xffff;
        Encoding encoding = Encoding.of(code);
        if (encoding == null) {
            throw new TraceException(path + ": unknown sample encoding " + code);
        }
        double rate = h.getDouble();
        long first = h.getLong();
        double scale = h.getDouble();
        int samples = h.getInt();
        int metaLength = h.getShort() & 0xffff;
        if (!(rate > 0) || !Double.isFinite(rate)) {
            throw new TraceException(path + ": sample rate " + rate + " Hz is not positive");
        }
        if (samples < 0 || (encoding == Encoding.INT16 && !(scale > 0))) {
            throw new TraceException(path + ": damaged header (samples " + samples + ", scale " + scale + ")");
        }
        if (metaLength > MAX_METADATA_BYTES) {
            throw new TraceException(path + ": metadata of " + metaLength + " bytes is longer than " + MAX_METADATA_BYTES);
        }
        ByteBuffer m = ByteBuffer.allocate(metaLength);
        while (m.hasRemaining()) {
            if (ch.read(m) < 0) {
                throw new TraceException(path + ": cut short inside its metadata");
            }
        }
        long expected = sizeOf(encoding, samples, metaLength);
        if (ch.size() < expected) {
            throw new TraceException(path + ": " + ch.size() + " bytes, its header announces " + expected + " (cut short)");
        }
        Map<String, String> meta = new LinkedHashMap<>();
        for (String line : new String(m.array(), StandardCharsets.UTF_8).split("\n")) {
            int eq = line.indexOf('=');
            if (eq > 0) {
                meta.put(line.substring(0, eq), line.substring(eq + 1));
            }
        }
        return new Header(encoding, rate, first, scale, samples, meta);
    }

    private static byte[] metadata(Map<String, String> metadata) {
        StringBuilder sb = new StringBuilder();
        for (Map.Entry<String, String> e : metadata.entrySet()) {
            String k = e.getKey().replace('\n', ' ').replace('=', '_');
            String v = e.getValue() == null ? "" : e.getValue().replace('\n', ' ');
            sb.append(k).append('=').append(v).append('\n');
        }
        byte[] bytes = sb.toString().getBytes(StandardCharsets.UTF_8);
        if (bytes.length > MAX_METADATA_BYTES) {
            throw new IllegalArgumentException("trace metadata of " + bytes.length + " bytes exceeds " + MAX_METADATA_BYTES);
        }
        return bytes;
    }
}
