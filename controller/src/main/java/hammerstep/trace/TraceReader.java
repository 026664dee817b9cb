package hammerstep.trace;

import hammerstep.config.InputFiles;
import hammerstep.signal.Conditioner;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;

/**
 * Reads torque traces and streams them in blocks. Two formats:
 * <ul>
 *   <li>CSV: {@code #} lines carry metadata ({@code # rate_hz=50000}), then the header
 *   {@code time_s,torque_nm}, then one row per sample with time strictly increasing;</li>
 *   <li>{@code .f32}: raw little-endian float32 N·m, its rate given by the caller.</li>
 * </ul>
 * Errors are {@link TraceException}s naming the file and line.
 */
public final class TraceReader {

    public static final String HEADER = "time_s,torque_nm";

    private TraceReader() {
    }

    /** What a trace's metadata says, as read before the samples. */
    public record Info(double rateHz, Map<String, String> metadata) { }

    public static boolean isF32(Path path) {
        return path.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".f32");
    }

    /**
     * Streams a raw float32 file through {@code sink} in blocks of {@code blockLength}.
     * The first sample is at time 0.
     */
    public static Info readF32(Path path, double rateHz, float[] block, SampleSink sink) throws TraceException {
        if (!(rateHz > 0)) {
            throw new TraceException(path + ": a .f32 trace needs --rate HZ (a positive sample rate)");
        }
        double periodNs = 1e9 / rateHz;
        try (F32Trace trace = F32Trace.open(path)) {
            long samples = trace.samples();
            for (long sample = 0; sample < samples; sample += block.length) {
                int k = (int) Math.min(block.length, samples - sample);
                trace.read(sample, block, k);
                sink.onSamples(block, 0, k, (long) (sample * periodNs));
            }
        } catch (UncheckedIOException e) {
            throw new TraceException(e.getMessage());
        }
        return new Info(rateHz, Map.of());
    }

    /**
     * Reads a CSV trace. {@code sink} receives blocks of up to {@code block.length} samples; a
     * block's first sample time is taken from its row. When {@code rateHz} is not positive, the
     * rate comes from the {@code rate_hz} metadata, else from the first two rows.
     *
     * <p>Refused, naming file and line: a value that is not a finite number or a torque beyond any
     * transducer's range ({@link Conditioner#ABSURD_NM}); a time that does not advance by one sample
     * period (within half a period either way): a gap, a step or a time base that disagrees with
     * {@code rate_hz}; a last row without its line break (the file was cut, perhaps inside the
     * value); a line longer than {@link InputFiles#MAX_TEXT_LINE_CHARS}.
     */
    public static Info readCsv(Path path, double rateHz, float[] block, SampleSink sink) throws TraceException {
        return withCsv(path, lines -> {
            double lastTime = Double.NEGATIVE_INFINITY;
            double rate = rateHz;
            int n = 0;
            long blockNs = 0;
            double firstTime = Double.NaN;
            String line;
            while ((line = lines.next()) != null) {
                int lineNo = lines.lineNo;
                if (lines.atHeader) {
                    if (!(rate > 0) && lines.meta.containsKey("rate_hz")) {
                        rate = parseRate(path, lines.meta.get("rate_hz"));
                    }
                    continue;
                }
                int comma = line.indexOf(',');
                if (comma < 0 || line.indexOf(',', comma + 1) >= 0) {
                    throw new TraceException(path + ":" + lineNo + ": expected two values 'time_s,torque_nm', got '"
                            + abbreviate(line) + "'");
                }
                double t = parseNumber(path, lineNo, line.substring(0, comma), "time_s");
                double v = parseNumber(path, lineNo, line.substring(comma + 1), "torque_nm");
                if (Math.abs(v) >= Conditioner.ABSURD_NM) {
                    throw new TraceException(path + ":" + lineNo + ": torque_nm " + abbreviate(line.substring(comma + 1).strip())
                            + " is beyond any torque transducer's range (" + (long) Conditioner.ABSURD_NM + " N·m)");
                }
                if (!(t > lastTime)) {
                    throw new TraceException(path + ":" + lineNo + ": time " + t + " s does not increase (previous "
                            + lastTime + " s)");
                }
                if (Double.isNaN(firstTime)) {
                    firstTime = t;
                } else if (!(rate > 0)) {
                    rate = 1.0 / (t - lastTime);
                } else {
                    checkStep(path, lineNo, t - lastTime, rate);
                }
                lastTime = t;
                if (n == 0) {
                    blockNs = Math.round(t * 1e9);
                }
                block[n++] = (float) v;
                if (n == block.length) {
                    if (!(rate > 0)) {
                        throw new TraceException(path + ": no sample rate: add '# rate_hz=...' or at least two rows");
                    }
                    sink.onSamples(block, 0, n, blockNs);
                    n = 0;
                }
            }
            if (!lines.header) {
                throw new TraceException(path + ": no '" + HEADER + "' header: not a torque trace");
            }
            lines.checkEnded();
            if (n > 0) {
                sink.onSamples(block, 0, n, blockNs);
            }
            return new Info(rate, lines.meta);
        });
    }

    /**
     * A time step must be one sample period within half a period either way: samples missing (a
     * gap), a jump of the time base (a step) or rows at another rate than {@code rate_hz} would put
     * the samples at the wrong times and could hide the peak blow.
     */
    private static void checkStep(Path path, int lineNo, double stepS, double rateHz) throws TraceException {
        double periods = stepS * rateHz;
        if (periods > 1.5 || periods < 0.5) {
            throw new TraceException(path + ":" + lineNo + ": time steps by " + ms(stepS) + " ms, expected one sample period ("
                    + ms(1.0 / rateHz) + " ms at " + format(rateHz) + " Hz): "
                    + (periods > 1.5 ? "a gap in the time column" : "a step in the time column"));
        }
    }

    private static String ms(double s) {
        return String.format(Locale.ROOT, "%.4g", s * 1e3);
    }

    private static String format(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }

    /** Reads only the metadata and rate of a CSV trace (up to its header and first two rows). */
    public static Info peekCsv(Path path) throws TraceException {
        return withCsv(path, lines -> {
            double first = Double.NaN;
            String line;
            while ((line = lines.next()) != null) {
                if (lines.atHeader) {
                    if (lines.meta.containsKey("rate_hz")) {
                        return new Info(parseRate(path, lines.meta.get("rate_hz")), lines.meta);
                    }
                    continue;
                }
                int comma = line.indexOf(',');
                if (comma < 0) {
                    throw new TraceException(path + ":" + lines.lineNo + ": expected two values 'time_s,torque_nm'");
                }
                double t = parseNumber(path, lines.lineNo, line.substring(0, comma), "time_s");
                if (Double.isNaN(first)) {
                    first = t;
                } else {
                    if (!(t > first)) {
                        throw new TraceException(path + ":" + lines.lineNo + ": time " + t + " s does not increase");
                    }
                    return new Info(1.0 / (t - first), lines.meta);
                }
            }
            if (!lines.header) {
                throw new TraceException(path + ": no '" + HEADER + "' header: not a torque trace");
            }
            throw new TraceException(path + ": no sample rate: add '# rate_hz=...' or at least two rows");
        });
    }

    private interface CsvRead {
        Info read(CsvLines lines) throws IOException, TraceException;
    }

    /** Opens a CSV trace for {@code read}; a missing, binary, non-regular or unreadable file is one TraceException naming it. */
    private static Info withCsv(Path path, CsvRead read) throws TraceException {
        try (InputFiles.Lines in = InputFiles.lines(path, InputFiles.MAX_TEXT_LINE_CHARS)) {
            return read.read(new CsvLines(path, in));
        } catch (IOException e) {
            throw new TraceException(InputFiles.describe(path, e));
        }
    }

    /** The lines of a CSV trace: blank lines skipped, {@code #} lines (anywhere) into {@link #meta}, the header checked. */
    private static final class CsvLines {
        private final Path path;
        private final InputFiles.Lines in;
        final Map<String, String> meta = new LinkedHashMap<>();
        int lineNo;
        /** The header has been read. */
        boolean header;
        /** The line {@link #next()} returned last is the header. */
        boolean atHeader;

        CsvLines(Path path, InputFiles.Lines in) {
            this.path = path;
            this.in = in;
        }

        /** The next line that is neither blank nor metadata, the header first; null at the end. */
        String next() throws IOException, TraceException {
            atHeader = false;
            String line;
            while ((line = in.next()) != null) {
                lineNo = in.lineNo();
                if (line.isEmpty()) {
                    continue;
                }
                if (line.charAt(0) == '#') {
                    readMeta(line, meta);
                    continue;
                }
                if (!header) {
                    if (!line.strip().equals(HEADER)) {
                        throw new TraceException(path + ":" + lineNo + ": expected the header '" + HEADER
                                + "', got '" + abbreviate(line) + "'");
                    }
                    header = true;
                    atHeader = true;
                }
                return line;
            }
            return null;
        }

        /** Refuses a file that ends inside its last line: it was cut short, perhaps inside a value. */
        void checkEnded() throws TraceException {
            if (!in.lastLineEnded()) {
                throw new TraceException(path + ":" + in.lineNo() + ": the file ends inside this line (no line break"
                        + " after it): cut short, perhaps inside its last value");
            }
        }
    }

    private static void readMeta(String line, Map<String, String> meta) {
        String body = line.substring(1).strip();
        int eq = body.indexOf('=');
        if (eq > 0) {
            meta.put(body.substring(0, eq).strip(), body.substring(eq + 1).strip());
        }
    }

    private static double parseRate(Path path, String text) throws TraceException {
        try {
            double r = Double.parseDouble(text);
            if (r > 0 && Double.isFinite(r)) {
                return r;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw new TraceException(path + ": metadata rate_hz='" + abbreviate(text) + "' is not a positive number");
    }

    private static double parseNumber(Path path, int lineNo, String text, String column) throws TraceException {
        String s = text.strip();
        try {
            double v = Double.parseDouble(s);
            if (Double.isFinite(v)) {
                return v;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw new TraceException(path + ":" + lineNo + ": " + column + " '" + abbreviate(s) + "' is not a finite number");
    }

    private static String abbreviate(String s) {
        return InputFiles.quote(s);
    }
}
