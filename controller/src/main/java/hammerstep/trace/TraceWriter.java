package hammerstep.trace;

import java.io.BufferedWriter;
import java.io.Closeable;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;

/** Writes the CSV trace format that {@link TraceReader} reads. Not for the sample path. */
public final class TraceWriter implements Closeable {

    private final BufferedWriter out;
    private final double rateHz;
    private long sample;

    public TraceWriter(Path path, double rateHz, Map<String, String> metadata) throws IOException {
        this.out = Files.newBufferedWriter(path, StandardCharsets.UTF_8);
        this.rateHz = rateHz;
        out.write("# rate_hz=" + format(rateHz) + "\n");
        for (Map.Entry<String, String> e : metadata.entrySet()) {
            out.write("# " + e.getKey() + "=" + e.getValue() + "\n");
        }
        out.write(TraceReader.HEADER + "\n");
    }

    /** Appends samples at the trace's rate, continuing from the last one written. */
    public void write(float[] samples, int offset, int length) throws IOException {
        StringBuilder sb = new StringBuilder(32);
        for (int i = 0; i < length; i++) {
            sb.setLength(0);
            sb.append(String.format(Locale.ROOT, "%.7f", sample / rateHz)).append(',')
                    .append(String.format(Locale.ROOT, "%.4f", samples[offset + i])).append('\n');
            out.write(sb.toString());
            sample++;
        }
    }

    private static String format(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }

    @Override
    public void close() throws IOException {
        out.close();
    }
}
