package hammerstep.trace;

import hammerstep.config.InputFiles;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.zip.CRC32C;

/**
 * The compact binary trace the station keeps for every joint ({@code .hst}). Little-endian:
 * <pre>
 * offset  size  field
 *      0     4  magic "HSTR"
 *      4     2  format version (2; 1 for traces written before the checksum)
 *      6     2  sample encoding: 1 = int16 counts × scale, 2 = float32 N·m
 *      8     8  sample rate, Hz (float64)
 *     16     8  time of the first sample, ns (int64, the station's clock)
 *     24     8  scale, N·m per count (float64; 0 for float32)
 *     32     4  number of samples (int32)
 *     36     2  metadata length m in bytes (uint16)
 *     38     m  metadata, UTF-8 lines "key=value\n" (joint id, program, revision, position, ...)
 *   38+m        samples
 *    end     4  CRC32C of every byte before it (version 2 only)
 * </pre>
 * int16 keeps a joint's trace at 2 bytes a sample with a resolution of the trace's largest
 * |torque| / 32767 (the scale is chosen per trace); float32 is lossless for N·m samples.
 *
 * <p>Version 2 ends in a CRC32C (Castagnoli) over header, metadata and samples. A file whose
 * checksum does not match, which is cut short or has bytes after its checksum is refused with one
 * line naming it ({@link TraceException}); no sample of it reaches a chain. A single flipped bit can
 * not turn version 2 into 1. Version 1 files (no checksum) are still read, unchecked:
 * {@link Header#checked()} is false and the tools say so.
 */
public final class StoredTrace {

    public static final String EXTENSION = ".hst";
    static final int MAGIC = 0x52545348; // "HSTR" read little-endian
    static final int VERSION = 2;
    /** The format before the checksum: still read, unchecked. */
    static final int VERSION_UNCHECKED = 1;
    static final int HEADER_BYTES = 38;
    static final int CHECKSUM_BYTES = 4;
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

    /**
     * What a stored trace's header says.
     *
     * @param version the file's format version; below {@link #VERSION} there was no checksum to check
     */
    public record Header(Encoding encoding, double rateHz, long firstSampleNs, double scaleNm, int samples,
                         Map<String, String> metadata, int version) {

        public Header(Encoding encoding, double rateHz, long firstSampleNs, double scaleNm, int samples,
                      Map<String, String> metadata) {
            this(encoding, rateHz, firstSampleNs, scaleNm, samples, metadata, VERSION);
        }

        /** True when the file's checksum was verified (version 2 and later). */
        public boolean checked() {
            return version >= VERSION;
        }

        /** The id of the program the joint was judged with, or null when the trace does not say. */
        public String programId() {
            return metadata.get("program");
        }

        /** The revision (content hash) of that program, or null when the trace does not say. */
        public String programRevision() {
            return metadata.get("program_revision");
        }

        /** The transducer's range in N·m the station judged over-range against, or NaN when not stored. */
        public double rangeNm() {
            String v = metadata.get("range_nm");
            try {
                return v == null ? Double.NaN : Double.parseDouble(v);
            } catch (NumberFormatException e) {
                return Double.NaN;
            }
        }

        /** One sample's step in N·m: the int16 scale, 0 for float32 (exact). */
        public double resolutionNm() {
            return encoding == Encoding.INT16 ? scaleNm : 0;
        }
    }

    private StoredTrace() {
    }

    public static boolean isStored(Path path) {
        return path.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(EXTENSION);
    }

    /** Bytes a trace of {@code samples} samples takes, for the retention arithmetic. */
    public static long sizeOf(Encoding encoding, int samples, int metadataBytes) {
        return HEADER_BYTES + metadataBytes + (long) samples * encoding.bytes + CHECKSUM_BYTES;
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
        if (size > Integer.MAX_VALUE - 8) {
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
        CRC32C crc = new CRC32C();
        crc.update(b.array(), 0, b.position());
        b.putInt((int) crc.getValue());
        out.write(b.array(), 0, b.position());
        return b;
    }

    /** Reads the header (and metadata) of a stored trace, after checking the file's checksum. */
    public static Header readHeader(Path path) throws TraceException {
        return parse(path, bytes(path));
    }

    /**
     * Streams a stored trace through {@code sink} in blocks of up to {@code block.length} samples. The
     * whole file is checked first: a damaged trace is refused before its first sample is handed on.
     */
    public static Header read(Path path, float[] block, SampleSink sink) throws TraceException {
        ByteBuffer file = bytes(path);
        Header h = parse(path, file);
        double periodNs = 1e9 / h.rateHz();
        int done = 0;
        while (done < h.samples()) {
            int k = Math.min(block.length, h.samples() - done);
            decode(h, file, done, block, k);
            sink.onSamples(block, 0, k, h.firstSampleNs() + Math.round(done * periodNs));
            done += k;
        }
        return h;
    }

    /** A checked stored trace held whole in memory: its header and its samples in N·m. */
    public record Loaded(Header header, float[] samples) {

        /** Time of sample {@code index} on the station's clock. */
        public long timeOf(long index) {
            return header.firstSampleNs() + Math.round(index * 1e9 / header.rateHz());
        }
    }

    /** Reads a whole stored trace into memory, after checking it. */
    public static Loaded load(Path path) throws TraceException {
        ByteBuffer file = bytes(path);
        Header h = parse(path, file);
        float[] samples = new float[h.samples()];
        decode(h, file, 0, samples, h.samples());
        return new Loaded(h, samples);
    }

    private static void decode(Header h, ByteBuffer file, int from, float[] into, int count) {
        int at = file.position() + from * h.encoding().bytes;
        if (h.encoding() == Encoding.INT16) {
            double scale = h.scaleNm();
            for (int i = 0; i < count; i++) {
                into[i] = (float) (file.getShort(at + 2 * i) * scale);
            }
        } else {
            for (int i = 0; i < count; i++) {
                into[i] = file.getFloat(at + 4 * i);
            }
        }
    }

    private static ByteBuffer bytes(Path path) throws TraceException {
        try (FileChannel ch = InputFiles.open(path, 0)) {
            long size = ch.size();
            if (size > Integer.MAX_VALUE - 8) {
                throw new TraceException(path + ": " + size + " bytes is too long for a stored trace");
            }
            ByteBuffer b = ByteBuffer.allocate((int) size).order(ByteOrder.LITTLE_ENDIAN);
            while (b.hasRemaining() && ch.read(b) >= 0) {
                // reads until the end
            }
            b.flip();
            return b;
        } catch (IOException e) {
            throw new TraceException(InputFiles.describe(path, e));
        }
    }

    /**
     * Checks and parses a whole file; leaves {@code file}'s position at the first sample. The checksum
     * is checked before any header field is trusted, so a damaged count or scale is never acted on.
     */
    private static Header parse(Path path, ByteBuffer file) throws TraceException {
        int size = file.limit();
        if (size < HEADER_BYTES) {
            throw new TraceException(path + ": too short for a stored trace header (" + size + " bytes)");
        }
        if (file.getInt(0) != MAGIC) {
            throw new TraceException(path + ": not a stored hammerstep trace (no HSTR mark)");
        }
        int version = file.getShort(4) & 0xffff;
        if (version != VERSION && version != VERSION_UNCHECKED) {
            throw new TraceException(path + ": stored trace version " + version + ", this build reads "
                    + VERSION_UNCHECKED + " and " + VERSION + " (damaged, or written by a newer build)");
        }
        boolean checked = version == VERSION;
        int trailer = checked ? CHECKSUM_BYTES : 0;
        if (checked) {
            CRC32C crc = new CRC32C();
            crc.update(file.array(), 0, size - CHECKSUM_BYTES);
            if ((int) crc.getValue() != file.getInt(size - CHECKSUM_BYTES)) {
                throw new TraceException(path + ": checksum does not match: damaged" + sizeHint(file, size)
                        + ", refused");
            }
        }
        file.position(8);
        int code = file.getShort(6) & 0xffff;
        Encoding encoding = Encoding.of(code);
        if (encoding == null) {
            throw new TraceException(path + ": unknown sample encoding " + code);
        }
        double rate = file.getDouble();
        long first = file.getLong();
        double scale = file.getDouble();
        int samples = file.getInt();
        int metaLength = file.getShort() & 0xffff;
        if (!(rate > 0) || !Double.isFinite(rate)) {
            throw new TraceException(path + ": sample rate " + rate + " Hz is not positive");
        }
        if (samples < 0 || (encoding == Encoding.INT16 && !(scale > 0 && Double.isFinite(scale)))) {
            throw new TraceException(path + ": damaged header (samples " + samples + ", scale " + scale + ")");
        }
        if (metaLength > MAX_METADATA_BYTES) {
            throw new TraceException(path + ": metadata of " + metaLength + " bytes is longer than " + MAX_METADATA_BYTES);
        }
        long expected = HEADER_BYTES + metaLength + (long) samples * encoding.bytes + trailer;
        if (size < expected) {
            throw new TraceException(path + ": " + size + " bytes, its header announces " + expected + " (cut short)");
        }
        if (checked && size != expected) {
            throw new TraceException(path + ": " + size + " bytes, its header announces " + expected
                    + " (bytes after its end), refused");
        }
        Map<String, String> meta = new LinkedHashMap<>();
        String text = new String(file.array(), HEADER_BYTES, metaLength, StandardCharsets.UTF_8);
        for (String line : text.split("\n")) {
            int eq = line.indexOf('=');
            if (eq > 0) {
                meta.put(line.substring(0, eq), line.substring(eq + 1));
            }
        }
        file.position(HEADER_BYTES + metaLength);
        return new Header(encoding, rate, first, scale, samples, meta, version);
    }

    /** What the (unchecked) header's length says about a damaged file, for the one line. */
    private static String sizeHint(ByteBuffer file, int size) {
        Encoding e = Encoding.of(file.getShort(6) & 0xffff);
        int samples = file.getInt(32);
        int meta = file.getShort(36) & 0xffff;
        if (e == null || samples < 0) {
            return "";
        }
        long expected = sizeOf(e, samples, meta);
        if (size < expected) {
            return " or cut short (" + size + " bytes, its header announces " + expected + ")";
        }
        if (size > expected) {
            return " or appended to (" + size + " bytes, its header announces " + expected + ")";
        }
        return "";
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
