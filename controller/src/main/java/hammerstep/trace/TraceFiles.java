package hammerstep.trace;

import java.nio.file.Path;

/**
 * Opens any trace the tools accept by its name: CSV, raw float32 ({@code .f32}, rate given), or a
 * station's stored trace ({@code .hst}, rate in its header).
 */
public final class TraceFiles {

    private TraceFiles() {
    }

    /**
     * The sample rate of a trace: {@code rateHz} when positive (it overrides CSV metadata and is
     * required for .f32), else what the file says.
     */
    public static double rateOf(Path path, double rateHz) throws TraceException {
        if (StoredTrace.isStored(path)) {
            return StoredTrace.readHeader(path).rateHz();
        }
        if (TraceReader.isF32(path)) {
            if (!(rateHz > 0)) {
                throw new TraceException(path + ": a .f32 trace needs --rate HZ (a positive sample rate)");
            }
            return rateHz;
        }
        return rateHz > 0 ? rateHz : TraceReader.peekCsv(path).rateHz();
    }

    /** The metadata key, in a CSV {@code #} line or a stored trace's header, for the transducer's range. */
    public static final String RANGE_KEY = "range_nm";

    /**
     * The transducer's range a trace names ({@code # range_nm=1000} in a CSV, {@code range_nm=} in a
     * stored trace's metadata), N·m; NaN when it names none (raw .f32 never does).
     */
    public static double rangeOf(Path path) throws TraceException {
        java.util.Map<String, String> meta;
        if (StoredTrace.isStored(path)) {
            meta = StoredTrace.readHeader(path).metadata();
        } else if (TraceReader.isF32(path)) {
            return Double.NaN;
        } else {
            meta = TraceReader.peekCsv(path).metadata();
        }
        String text = meta.get(RANGE_KEY);
        if (text == null) {
            return Double.NaN;
        }
        try {
            double v = Double.parseDouble(text.strip());
            if (v > 0 && Double.isFinite(v)) {
                return v;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw new TraceException(path + ": metadata " + RANGE_KEY + "='" + text + "' is not a positive number of N·m");
    }

    /** Streams the trace through {@code sink} at {@code rateHz} (from {@link #rateOf}). */
    public static void read(Path path, double rateHz, float[] block, SampleSink sink) throws TraceException {
        if (StoredTrace.isStored(path)) {
            StoredTrace.read(path, block, sink);
        } else if (TraceReader.isF32(path)) {
            TraceReader.readF32(path, rateHz, block, sink);
        } else {
            TraceReader.readCsv(path, rateHz, block, sink);
        }
    }
}
