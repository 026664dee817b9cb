package hammerstep.trace;

import java.io.BufferedOutputStream;
import java.io.BufferedWriter;
import java.io.Closeable;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;

/**
 * Writes the trace formats that {@link TraceReader} reads: CSV, or raw little-endian float32 when
 * the path ends in {@code .f32} (which keeps no rate or metadata: the reader is told the rate).
 * Not for the sample path.
 */
public final class TraceWriter implements Closeable {

    private final BufferedWriter csv;
    private final OutputStream raw;
    private final ByteBuffer rawBlock = ByteBuffer.allocate(4 * 4096).order(ByteOrder.LITTLE_ENDIAN);
    private final double rateHz;
    private long sample;

    public TraceWriter(Path path, double rateHz, Map<String, String> metadata) throws IOException {
        this.rateHz = rateHz;
        if (TraceReader.isF32(path)) {
            this.csv = null;
            this.raw = new BufferedOutputStream(Files.newOutputStream(path), 1 << 16);
            return;
        }
        this.raw = null;
        this.csv = Files.newBufferedWriter(path, StandardCharsets.UTF_8);
        csv.write("# rate_hz=" + format(rateHz) + "\n");
        for (Map.Entry<String, String> e : metadata.entrySet()) {
            csv.write("# " + e.getKey() + "=" + e.getValue() + "\n");
        }
        csv.write(TraceReader.HEADER + "\n");
    }

    /** Appends samples at the trace's rate, continuing from the last one written. */
    public void write(float[] samples, int offset, int length) throws IOException {
        if (raw != null) {
            writeRaw(samples, offset, length);
            return;
        }
        StringBuilder sb = new StringBuilder(32);
        for (int i = 0; i < length; i++) {
            sb.setLength(0);
            sb.append(String.format(Locale.ROOT, "%.7f", sample / rateHz)).append(',')
                    .append(String.format(Locale.ROOT, "%.4f", samples[offset + i])).append('\n');
            csv.write(sb.toString());
            sample++;
        }
    }

    private void writeRaw(float[] samples, int offset, int length) throws IOException {
        int done = 0;
        while (done < length) {
            int k = Math.min(length - done, rawBlock.capacity() / 4);
            rawBlock.clear();
            rawBlock.asFloatBuffer().put(samples, offset + done, k);
            raw.write(rawBlock.array(), 0, 4 * k);
            done += k;
        }
        sample += length;
    }

    private static String format(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }

    @Override
    public void close() throws IOException {
        if (raw != null) {
            raw.close();
        } else {
            csv.close();
        }
    }
}
