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
