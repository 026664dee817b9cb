package hammerstep.app;

import hammerstep.signal.PulseTrain;
import hammerstep.testing.StandardStreams;
import hammerstep.trace.TraceWriter;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The catalogue of bad inputs beyond the configuration files (those are {@link BrokenConfigurationTest}'s):
 * damaged and dishonest traces for {@code replay} and {@code plot}, results files for {@code stats},
 * audit files for {@code audit}, files that are no regular files, too large or with endless lines for
 * every command that reads one, and station files for {@code check}. Each case names its expected
 * line; each is refused with exit 2, that line on standard error, no line longer than 300 characters
 * and nothing that looks like a stack trace or a Java class name. The simulator's part ({@code
 * simulate}, {@code hammerstep-sim check}, the demo's {@code simulation} section) is in the sim
 * module's {@code SimBadInputCatalogueTest}.
 */
class BadInputCatalogueTest {

    private static final String PROGRAM = "src/test/resources/programs/good.yaml";
    private static final double RATE = 20_000;

    /** One bad input: the command line ({@code {d}} is the catalogue's folder) and the line it must print. */
    record Bad(String name, List<String> args, String expect) {
        @Override
        public String toString() {
            return name;
        }
    }

    private static Path dir;
    private static List<String> clean;
    private static int header;
    private static int peak;
    private static boolean fifos;

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    @BeforeAll
    static void writeTheCatalogue() throws Exception {
        dir = Files.createTempDirectory("bad-inputs");
        float[] x = rundown();
        Path whole = dir.resolve("whole.csv");
        try (TraceWriter w = new TraceWriter(whole, RATE, Map.of())) {
            w.write(x, 0, x.length);
        }
        clean = Files.readAllLines(whole);
        header = clean.indexOf("time_s,torque_nm");
        int best = 0;
        for (int i = 1; i < x.length; i++) {
            if (x[i] > x[best]) {
                best = i;
            }
        }
        peak = header + 1 + best;
        writeFiles();
    }

    @AfterAll
    static void removeTheCatalogue() throws IOException {
        try (Stream<Path> s = Files.walk(dir)) {
            s.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }

    private static float[] rundown() {
        List<PulseTrain.Strike> s = new ArrayList<>();
        for (int i = 0; i < 8; i++) {
            s.add(new PulseTrain.Strike(0.1 + i * 0.027, 0.002, 100 + i * 15, 0.3, 0.2, 0));
        }
        return PulseTrain.render(RATE, 0.8, s, 0.2, 0.1, 1);
    }

    /** The clean trace with row {@code line} (0-based line of the file) replaced. */
    private static String withLine(int line, String text) {
        List<String> l = new ArrayList<>(clean);
        l.set(line, text);
        return String.join("\n", l) + "\n";
    }

    private static String time(int line) {
        return clean.get(line).substring(0, clean.get(line).indexOf(','));
    }

    private static String torque(int line) {
        return clean.get(line).substring(clean.get(line).indexOf(',') + 1);
    }

    private static void write(String name, String text) throws IOException {
        Files.writeString(dir.resolve(name), text);
    }

    private static void write(String name, byte[] bytes) throws IOException {
        Files.write(dir.resolve(name), bytes);
    }

    private static void fifo(String name) throws Exception {
        Process p = new ProcessBuilder("mkfifo", dir.resolve(name).toString()).start();
        fifos &= p.waitFor(10, TimeUnit.SECONDS) && p.exitValue() == 0;
    }

    private static byte[] f32(float... v) {
        ByteBuffer b = ByteBuffer.allocate(4 * v.length).order(ByteOrder.LITTLE_ENDIAN);
        for (float f : v) {
            b.putFloat(f);
        }
        return b.array();
    }

    private static float[] rundownWith(int index, float value) {
        float[] x = rundown();
        x[index] = value;
        return x;
    }

    private static String joint(String limits, String extra) {
        return "{\"schema\":\"hammerstep.joint.v1\",\"id\":\"j-1\",\"program\":\"hub-final\",\"final_torque_nm\":201.5,"
                + "\"blows\":8,\"verdict\":\"GO\",\"reasons\":[]," + extra + "\"limits\":" + limits + "}";
    }

    private static final String LIMITS = "{\"torque_nm\":{\"min\":180.0,\"max\":230.0},\"blows\":{\"min\":4,\"max\":30}}";

    private static void writeFiles() throws Exception {
        String all = String.join("\n", clean) + "\n";
        int mid = peak;
        // traces
        write("absurd-negative.csv", withLine(mid, time(mid) + ",-1e30"));
        write("absurd-positive.csv", withLine(mid, time(mid) + ",12000000"));
        write("nan.csv", withLine(mid, time(mid) + ",NaN"));
        write("infinity.csv", withLine(mid, time(mid) + ",Infinity"));
        write("overflow.csv", withLine(mid, time(mid) + ",1e999"));
        write("not-a-number.csv", withLine(mid, time(mid) + ",12.3.4"));
        write("time-nan.csv", withLine(mid, "NaN," + torque(mid)));
        List<String> gap = new ArrayList<>(clean);
        gap.subList(mid, mid + 1000).clear(); // 50 ms at 20 kHz
        write("gap-50ms.csv", String.join("\n", gap) + "\n");
        write("time-back.csv", withLine(mid, time(mid - 2) + "," + torque(mid)));
        write("time-still.csv", withLine(mid, time(mid - 1) + "," + torque(mid)));
        double t = Double.parseDouble(time(mid - 1)) + 0.2 / RATE;
        write("time-step-short.csv", withLine(mid, String.format(java.util.Locale.ROOT, "%.7f", t) + "," + torque(mid)));
        write("rate-disagrees.csv", all.replace("# rate_hz=20000", "# rate_hz=50000"));
        write("rate-not-number.csv", all.replace("# rate_hz=20000", "# rate_hz=fast"));
        write("rate-negative.csv", all.replace("# rate_hz=20000", "# rate_hz=-5"));
        write("cut-in-value.csv", all.substring(0, all.length() - 3));
        write("cut-in-time.csv", all.substring(0, all.lastIndexOf('\n', all.length() - 2) + 5));
        write("three-values.csv", withLine(mid, clean.get(mid) + ",7"));
        write("no-header.csv", all.replace("time_s,torque_nm\n", "time,torque\n"));
        write("empty.csv", "");
        write("binary.csv", new byte[] {(byte) 0xff, (byte) 0xfe, 0, 1, 2, (byte) 0xc3, 0x28});
        write("long-metadata.csv", "# note=" + "x".repeat(5000) + "\n" + all);
        write("odd-size.f32", Arrays.copyOf(f32(1f, 2f, 3f), 10));
        write("infinite.f32", f32(rundownWith(4000, Float.POSITIVE_INFINITY)));
        write("absurd.f32", f32(rundownWith(4000, -1e30f)));
        write("gap-in-plot.csv", String.join("\n", gap) + "\n");
        // a program of 2 MB, one with a 100 000-character value, one with an endless key
        write("huge-program.yaml", "id: hub-final\n# " + "x".repeat(2 << 20) + "\n");
        write("long-value.yaml", Files.readString(Path.of(PROGRAM)).replace("id: hub-final", "id: " + "h".repeat(100_000)));
        write("long-key.yaml", Files.readString(Path.of(PROGRAM)) + "? " + "k".repeat(5000) + "\n: 1\n");
        write("long-number.yaml", Files.readString(Path.of(PROGRAM)).replace("shutoff_at: 205.0", "shutoff_at: 2" + "0".repeat(9000)));
        // results files
        write("inverted-torque.jsonl", joint("{\"torque_nm\":{\"min\":230.0,\"max\":180.0},\"blows\":{\"min\":4,\"max\":30}}", "") + "\n");
        write("inverted-blows.jsonl", joint("{\"torque_nm\":{\"min\":180.0,\"max\":230.0},\"blows\":{\"min\":30,\"max\":4}}", "") + "\n");
        write("blows-huge.jsonl", joint(LIMITS, "").replace("\"blows\":8", "\"blows\":1e10") + "\n");
        write("blows-negative.jsonl", joint(LIMITS, "").replace("\"blows\":8", "\"blows\":-3") + "\n");
        write("blows-fraction.jsonl", joint(LIMITS, "").replace("\"blows\":8", "\"blows\":2.5") + "\n");
        write("limit-blows-huge.jsonl", joint("{\"torque_nm\":{\"min\":180.0,\"max\":230.0},\"blows\":{\"min\":4,\"max\":1e10}}", "") + "\n");
        write("torque-absurd.jsonl", joint(LIMITS, "").replace("201.5", "1e30") + "\n");
        write("limit-absurd.jsonl", joint("{\"torque_nm\":{\"min\":-1e300,\"max\":230.0},\"blows\":{\"min\":4,\"max\":30}}", "") + "\n");
        write("nested.jsonl", "{\"a\":" + "[".repeat(1500) + "]".repeat(1500) + "}\n");
        write("not-json.jsonl", "GO 201.5 N·m\n");
        write("array.jsonl", "[1,2,3]\n");
        write("no-program.jsonl", joint(LIMITS, "").replace("\"program\":\"hub-final\",", "") + "\n");
        write("no-limits.jsonl", joint(LIMITS, "").replace(",\"limits\":" + LIMITS, "") + "\n");
        write("torque-text.jsonl", joint(LIMITS, "").replace("201.5", "\"high\"") + "\n");
        write("long-line.jsonl", "{\"x\":\"" + "y".repeat((1 << 20) + 10) + "\"}\n");
        write("binary.jsonl", new byte[] {'{', (byte) 0xc3, 0x28, '}', '\n'});
        write("good.jsonl", joint(LIMITS, "\"part_serial\":\"TR-1\",\"position\":\"1\",") + "\n");
        // audit files
        String auditHeader = "joint_id,part_serial,position,method,residual_nm\n";
        write("audit-good.csv", auditHeader + "j-1,,,breakaway,90\n");
        write("audit-absurd.csv", auditHeader + "j-1,,,breakaway,1e300\n");
        write("audit-nan.csv", auditHeader + "j-1,,,breakaway,NaN\n");
        write("audit-text.csv", auditHeader + "j-1,,,breakaway," + "9".repeat(60) + "x\n");
        write("audit-column.csv", "joint_id,method,residual,colour\nj-1,breakaway,90\n");
        write("audit-method.csv", auditHeader + "j-1,,,by-feel,90\n");
        write("audit-long.csv", auditHeader + "j-1,,,breakaway," + "9".repeat(5000) + "\n");
        write("audit-no-header.csv", "# only a comment\n");
        // station files
        String station = "identity: { site: s1, line: l1, station: st1 }\nparts:\n  HX-1: " + Path.of("src/test/resources/broken/support/pattern.yaml").toAbsolutePath() + "\n";
        write("station-long-value.yaml", station.replace("site: s1", "site: " + "s".repeat(5000)));
        write("station-huge.yaml", station + "# " + "z".repeat(3 << 20) + "\n");
        write("station-fifo-pattern.yaml", station.replace(
                Path.of("src/test/resources/broken/support/pattern.yaml").toAbsolutePath().toString(), "fifo-pattern.yaml"));
        Files.createDirectories(dir.resolve("with-fifo"));
        Files.createDirectories(dir.resolve("out-is-dir.png"));
        fifos = true;
        for (String f : List.of("fifo.csv", "fifo.f32", "fifo.hst", "fifo.yaml", "fifo.jsonl", "fifo-audit.csv",
                "station-fifo.yaml", "with-fifo/x.yaml", "fifo-pattern.yaml")) {
            fifo(f);
        }
    }

    private static Bad bad(String name, String expect, String... args) {
        return new Bad(name, List.of(args), expect);
    }

    private static String line(int fileLine) {
        return ":" + (fileLine + 1) + ": ";
    }

    static List<Bad> catalogue() {
        String d = "{d}/";
        String p = PROGRAM;
        List<Bad> c = new ArrayList<>();
        int mid = peak;
        // replay: samples
        c.add(bad("replay: a -1e30 N·m sample inside a rundown", d + "absurd-negative.csv" + line(mid) + "torque_nm -1e30 is beyond any torque transducer's range", "replay", d + "absurd-negative.csv", "--program", p));
        c.add(bad("replay: a 12 MN·m sample", d + "absurd-positive.csv" + line(mid) + "torque_nm 12000000 is beyond", "replay", d + "absurd-positive.csv", "--program", p));
        c.add(bad("replay: NaN", d + "nan.csv" + line(mid) + "torque_nm 'NaN' is not a finite number", "replay", d + "nan.csv", "--program", p));
        c.add(bad("replay: Infinity", d + "infinity.csv" + line(mid) + "torque_nm 'Infinity' is not a finite number", "replay", d + "infinity.csv", "--program", p));
        c.add(bad("replay: 1e999", d + "overflow.csv" + line(mid) + "torque_nm '1e999' is not a finite number", "replay", d + "overflow.csv", "--program", p));
        c.add(bad("replay: 12.3.4", d + "not-a-number.csv" + line(mid) + "torque_nm '12.3.4' is not a finite number", "replay", d + "not-a-number.csv", "--program", p));
        c.add(bad("replay: time NaN", d + "time-nan.csv" + line(mid) + "time_s 'NaN' is not a finite number", "replay", d + "time-nan.csv", "--program", p));
        // replay: the time column
        c.add(bad("replay: a 50 ms gap inside a rundown", d + "gap-50ms.csv" + line(mid) + "time steps by 50.05 ms, expected one sample period (0.05000 ms at 20000 Hz): a gap in the time column", "replay", d + "gap-50ms.csv", "--program", p));
        c.add(bad("replay: time going back", d + "time-back.csv" + line(mid) + "time " , "replay", d + "time-back.csv", "--program", p));
        c.add(bad("replay: time standing still", d + "time-still.csv" + line(mid) + "time ", "replay", d + "time-still.csv", "--program", p));
        c.add(bad("replay: a step of a fifth of a period", d + "time-step-short.csv" + line(mid) + "time steps by 0.01000 ms, expected one sample period (0.05000 ms at 20000 Hz): a step in the time column", "replay", d + "time-step-short.csv", "--program", p));
        c.add(bad("replay: rate_hz disagrees with the time column", d + "rate-disagrees.csv:", "replay", d + "rate-disagrees.csv", "--program", p));
        c.add(bad("replay: rate_hz not a number", d + "rate-not-number.csv: metadata rate_hz='fast' is not a positive number", "replay", d + "rate-not-number.csv", "--program", p));
        c.add(bad("replay: rate_hz negative", d + "rate-negative.csv: metadata rate_hz='-5' is not a positive number", "replay", d + "rate-negative.csv", "--program", p));
        // replay: files cut, damaged, not traces
        c.add(bad("replay: cut inside the last value", d + "cut-in-value.csv" + line(clean.size() - 1) + "the file ends inside this line (no line break after it): cut short", "replay", d + "cut-in-value.csv", "--program", p));
        c.add(bad("replay: cut inside the last time", d + "cut-in-time.csv" + line(clean.size() - 1) + "expected two values 'time_s,torque_nm'", "replay", d + "cut-in-time.csv", "--program", p));
        c.add(bad("replay: three values on a row", d + "three-values.csv" + line(mid) + "expected two values 'time_s,torque_nm'", "replay", d + "three-values.csv", "--program", p));
        c.add(bad("replay: no header", d + "no-header.csv" + line(header) + "expected the header 'time_s,torque_nm'", "replay", d + "no-header.csv", "--program", p));
        c.add(bad("replay: empty file", d + "empty.csv: no 'time_s,torque_nm' header: not a torque trace", "replay", d + "empty.csv", "--program", p));
        c.add(bad("replay: binary junk", d + "binary.csv: not a text file (invalid UTF-8)", "replay", d + "binary.csv", "--program", p));
        c.add(bad("replay: a 5000-character metadata line", d + "long-metadata.csv: line 1 is longer than 4096 characters", "replay", d + "long-metadata.csv", "--program", p));
        c.add(bad("replay: missing trace", d + "missing.csv: no such file", "replay", d + "missing.csv", "--program", p));
        c.add(bad("replay: .f32 cut inside a sample", d + "odd-size.f32: size 10 bytes is not a whole number of float32 samples", "replay", d + "odd-size.f32", "--rate", "20000", "--program", p));
        c.add(bad("replay: .f32 without a rate", d + "odd-size.f32: a .f32 trace needs --rate", "replay", d + "odd-size.f32", "--program", p));
        // replay: not regular files, huge program files
        c.add(bad("replay: a FIFO as CSV trace", d + "fifo.csv: is not a regular file", "replay", d + "fifo.csv", "--program", p));
        c.add(bad("replay: a FIFO as .f32 trace", d + "fifo.f32: is not a regular file", "replay", d + "fifo.f32", "--rate", "20000", "--program", p));
        c.add(bad("replay: a FIFO as stored trace", d + "fifo.hst: is not a regular file", "replay", d + "fifo.hst", "--program", p));
        c.add(bad("replay: a FIFO as program", d + "fifo.yaml:0:0: is not a regular file", "replay", d + "whole.csv", "--program", d + "fifo.yaml"));
        c.add(bad("replay: a FIFO as --compare results", d + "fifo.jsonl: is not a regular file", "replay", d + "whole.csv", "--program", p, "--compare", d + "fifo.jsonl"));
        c.add(bad("replay: a 2 MB program", d + "huge-program.yaml:0:0: is 2.0 MB, more than the 1.0 MB", "replay", d + "whole.csv", "--program", d + "huge-program.yaml"));
        c.add(bad("replay: a program with a 100 000-character id", d + "long-value.yaml:1:5: a value of 100000 characters at 'id'; at most 4096", "replay", d + "whole.csv", "--program", d + "long-value.yaml"));
        // plot
        c.add(bad("plot: an infinite sample", d + "infinite.f32: sample 4000 (at 0.2000 s) is Infinity N·m: cannot draw it", "plot", d + "infinite.f32", "--rate", "20000", "--program", p, "--out", d + "x.png"));
        c.add(bad("plot: a -1e30 N·m sample", d + "absurd.f32: sample 4000 (at 0.2000 s) is -1.0E30 N·m: cannot draw it", "plot", d + "absurd.f32", "--rate", "20000", "--program", p, "--out", d + "x.png"));
        c.add(bad("plot: --out in /proc", "/proc/x.png: cannot write it", "plot", d + "whole.csv", "--program", p, "--out", "/proc/x.png"));
        c.add(bad("plot: --out below a file", d + "whole.csv/x.png: cannot write it", "plot", d + "whole.csv", "--program", p, "--out", d + "whole.csv/x.png"));
        c.add(bad("plot: --out is a directory", d + "out-is-dir.png: cannot write it", "plot", d + "whole.csv", "--program", p, "--out", d + "out-is-dir.png"));
        c.add(bad("plot: --out neither png nor svg", "the picture's name must end in .png or .svg", "plot", d + "whole.csv", "--program", p, "--out", d + "x.gif"));
        c.add(bad("plot: a 50 ms gap", d + "gap-in-plot.csv" + line(mid) + "time steps by 50.05 ms", "plot", d + "gap-in-plot.csv", "--program", p, "--out", d + "x.png"));
        c.add(bad("plot: a FIFO as trace", d + "fifo.csv: is not a regular file", "plot", d + "fifo.csv", "--program", p, "--out", d + "x.png"));
        c.add(bad("plot: NaN in a CSV", d + "nan.csv" + line(mid) + "torque_nm 'NaN' is not a finite number", "plot", d + "nan.csv", "--program", p, "--out", d + "x.png"));
        // stats
        c.add(bad("stats: inverted torque window", d + "inverted-torque.jsonl:1: limits.torque_nm: min 230.0 is above max 180.0", "stats", d + "inverted-torque.jsonl"));
        c.add(bad("stats: inverted blow window", d + "inverted-blows.jsonl:1: limits.blows: min 30 is above max 4", "stats", d + "inverted-blows.jsonl"));
        c.add(bad("stats: blows 1e10", d + "blows-huge.jsonl:1: 'blows' is 1.0E10: expected a whole number of blows from 0 to 100000", "stats", d + "blows-huge.jsonl"));
        c.add(bad("stats: blows -3", d + "blows-negative.jsonl:1: 'blows' is -3: expected a whole number", "stats", d + "blows-negative.jsonl"));
        c.add(bad("stats: blows 2.5", d + "blows-fraction.jsonl:1: 'blows' is 2.5: expected a whole number", "stats", d + "blows-fraction.jsonl"));
        c.add(bad("stats: limits.blows.max 1e10", d + "limit-blows-huge.jsonl:1: limits.blows: 'max' is 1.0E10", "stats", d + "limit-blows-huge.jsonl"));
        c.add(bad("stats: final torque 1e30", d + "torque-absurd.jsonl:1: 'final_torque_nm' 1.0E30 N·m is beyond any torque transducer's range", "stats", d + "torque-absurd.jsonl"));
        c.add(bad("stats: torque limit -1e300", d + "limit-absurd.jsonl:1: limits.torque_nm: 'min' -1.0E300 N·m is beyond", "stats", d + "limit-absurd.jsonl"));
        c.add(bad("stats: JSON nested 1500 deep (a line that is no message: skipped, and then no joint result)", d + "nested.jsonl: no joint results (1 line that is no message, skipped (first: line 1))", "stats", d + "nested.jsonl"));
        c.add(bad("stats: not JSON (a line that is no message: skipped, and then no joint result)", d + "not-json.jsonl: no joint results (1 line that is no message, skipped (first: line 1))", "stats", d + "not-json.jsonl"));
        c.add(bad("stats: a JSON array (a line that is no message: skipped, and then no joint result)", d + "array.jsonl: no joint results (1 line that is no message, skipped (first: line 1))", "stats", d + "array.jsonl"));
        c.add(bad("stats: a joint without program", d + "no-program.jsonl:1: joint result without 'program'", "stats", d + "no-program.jsonl"));
        c.add(bad("stats: a joint without limits", d + "no-limits.jsonl:1: joint result without 'limits'", "stats", d + "no-limits.jsonl"));
        c.add(bad("stats: final torque as text", d + "torque-text.jsonl:1: 'final_torque_nm' must be a number", "stats", d + "torque-text.jsonl"));
        c.add(bad("stats: a line of 1 MB", d + "long-line.jsonl: line 1 is longer than 1048576 characters", "stats", d + "long-line.jsonl"));
        c.add(bad("stats: invalid UTF-8", d + "binary.jsonl: not a text file (invalid UTF-8)", "stats", d + "binary.jsonl"));
        c.add(bad("stats: a FIFO", d + "fifo.jsonl: is not a regular file", "stats", d + "fifo.jsonl"));
        c.add(bad("stats: a directory", d + "with-fifo: is a directory, not a file", "stats", d + "with-fifo"));
        c.add(bad("stats: a missing file", d + "missing.jsonl: no such file", "stats", d + "missing.jsonl"));
        // audit
        c.add(bad("audit: residual 1e300", d + "audit-absurd.csv:2: residual_nm 1e300 must be a positive torque", "audit", d + "audit-absurd.csv", d + "good.jsonl"));
        c.add(bad("audit: residual NaN", d + "audit-nan.csv:2: residual_nm NaN must be a positive torque", "audit", d + "audit-nan.csv", d + "good.jsonl"));
        c.add(bad("audit: residual not a number", d + "audit-text.csv:2: residual_nm '9999999999999999999999999999999999999999...' is not a number", "audit", d + "audit-text.csv", d + "good.jsonl"));
        c.add(bad("audit: unknown column", d + "audit-column.csv:1: unknown column 'residual'", "audit", d + "audit-column.csv", d + "good.jsonl"));
        c.add(bad("audit: unknown method", d + "audit-method.csv:2: method 'by-feel'", "audit", d + "audit-method.csv", d + "good.jsonl"));
        c.add(bad("audit: a 5000-character row", d + "audit-long.csv: line 2 is longer than 4096 characters", "audit", d + "audit-long.csv", d + "good.jsonl"));
        c.add(bad("audit: no header", d + "audit-no-header.csv: no header", "audit", d + "audit-no-header.csv", d + "good.jsonl"));
        c.add(bad("audit: a FIFO as audit file", d + "fifo-audit.csv: is not a regular file", "audit", d + "fifo-audit.csv", d + "good.jsonl"));
        c.add(bad("audit: a FIFO as results", d + "fifo.jsonl: is not a regular file", "audit", d + "audit-good.csv", d + "fifo.jsonl"));
        c.add(bad("audit: inverted limits in the results", d + "inverted-torque.jsonl:1: limits.torque_nm: min 230.0 is above max 180.0", "audit", d + "audit-good.csv", d + "inverted-torque.jsonl"));
        // check and the station file
        c.add(bad("check: a FIFO", d + "fifo.yaml:0:0: is not a regular file", "check", d + "fifo.yaml"));
        c.add(bad("check: a FIFO in a directory", d + "with-fifo/x.yaml:0:0: is not a regular file", "check", d + "with-fifo"));
        c.add(bad("check: a 2 MB file", d + "huge-program.yaml:0:0: is 2.0 MB", "check", d + "huge-program.yaml"));
        c.add(bad("check: a 100 000-character value", d + "long-value.yaml:1:5: a value of 100000 characters at 'id'", "check", d + "long-value.yaml"));
        c.add(bad("check: a 5000-character key", d + "long-key.yaml:8:3: a key of 5000 characters; at most 4096", "check", d + "long-key.yaml"));
        c.add(bad("check: a 9000-digit number", d + "long-number.yaml:6:13: a value of 9001 characters at 'shutoff_at'", "check", d + "long-number.yaml"));
        c.add(bad("station file: a FIFO", d + "station-fifo.yaml:0:0: is not a regular file", "check", d + "station-fifo.yaml"));
        c.add(bad("station file: a 5000-character site", d + "station-long-value.yaml:1:19: a value of 5000 characters at 'identity.site'", "check", d + "station-long-value.yaml"));
        c.add(bad("station file: 3 MB", d + "station-huge.yaml:0:0: is 3.0 MB, more than the 1.0 MB", "check", d + "station-huge.yaml"));
        c.add(bad("station file: a FIFO as pattern", d + "station-fifo-pattern.yaml:3:9: 'parts.HX-1': cannot use pattern file fifo-pattern.yaml: is not a regular file", "check", d + "station-fifo-pattern.yaml"));
        c.add(bad("check: a FIFO as pattern", d + "fifo-pattern.yaml:0:0: is not a regular file", "check", d + "fifo-pattern.yaml"));
        c.add(bad("run: a FIFO as station file", d + "station-fifo.yaml:0:0: is not a regular file", "run", "--config", d + "station-fifo.yaml", "--hardware", "mock"));
        return c;
    }

    @Test
    void theCatalogueHoldsAtLeastSixtyBadInputs() {
        assertThat(catalogue()).hasSizeGreaterThanOrEqualTo(60);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("catalogue")
    void isRefusedWithItsLineAndExitTwo(Bad bad) {
        assertThat(fifos).as("mkfifo made the FIFOs").isTrue();
        String d = dir.toString();
        String[] args = bad.args().stream().map(a -> a.replace("{d}", d)).toArray(String[]::new);
        String expect = bad.expect().replace("{d}", d);

        int exit = Main.run(args);

        String err = streams.err();
        assertThat(exit).as(err).isEqualTo(2);
        assertThat(err.lines()).as(err).anySatisfy(l -> assertThat(l).contains(expect));
        assertThat(err.lines()).allSatisfy(l -> assertThat(l.length()).isLessThanOrEqualTo(300));
        assertThat(err).doesNotContain("Exception").doesNotContain("\tat ").doesNotContain("java.")
                .doesNotContain("jackson").doesNotContain("xchart").doesNotContain("StreamReadConstraints");
    }

    @Test
    void theCleanTraceIsGo() {
        int exit = Main.run("replay", dir.resolve("whole.csv").toString(), "--program", PROGRAM);
        assertThat(exit).isZero();
        assertThat(streams.out().lines()).singleElement().satisfies(l -> assertThat(l).contains("\"verdict\":\"GO\""));
    }

    @Test
    void aRundownCutOffByTheEndOfTheFileIsIncompleteNeverGo() throws IOException {
        // the clean trace cut 20 ms after its last blow: end_after_ms (200) has not passed
        int lastBlowRow = header + 1 + (int) Math.round((0.1 + 7 * 0.027 + 0.02) * RATE);
        Path cut = dir.resolve("ends-in-rundown.csv");
        Files.writeString(cut, String.join("\n", clean.subList(0, lastBlowRow)) + "\n");
        int exit = Main.run("replay", cut.toString(), "--program", PROGRAM);
        assertThat(exit).isZero();
        assertThat(streams.out().lines()).singleElement().satisfies(l -> assertThat(l)
                .contains("\"verdict\":\"NO_GO\"").contains("TRACE_ENDED").contains("\"blows\":8"));
    }

    @Test
    void aMinusOneE30SampleInsideAnF32RundownIsSensorFaultNeverGo() throws IOException {
        // a raw .f32 is not refused sample by sample: the chain's over-range check makes the joint NO-GO
        Path trace = dir.resolve("absurd-in-rundown.f32");
        Files.write(trace, f32(rundownWith(peak - header - 1 - 40, -1e30f)));
        int exit = Main.run("replay", trace.toString(), "--rate", "20000", "--program", PROGRAM);
        assertThat(exit).isZero();
        assertThat(streams.out().lines()).isNotEmpty().allSatisfy(l -> assertThat(l).doesNotContain("\"verdict\":\"GO\""))
                .anySatisfy(l -> assertThat(l).contains("SENSOR_FAULT"));
    }

    /**
     * A 50 MB "number" on one row, replayed in a JVM of 256 MB heap (a 1 GB Pi's default): refused
     * in one line by the bounded line reader, no OutOfMemoryError and no stack trace.
     */
    @Test
    void aFiftyMegabyteNumberIsRefusedInOneLineAtA256MegabyteHeap() throws Exception {
        Path big = dir.resolve("fifty-mb-number.csv");
        try (var out = Files.newBufferedWriter(big)) {
            out.write("# rate_hz=20000\ntime_s,torque_nm\n0.0000000,1.0\n0.0000500,");
            char[] nines = new char[1 << 20];
            Arrays.fill(nines, '9');
            for (int i = 0; i < 50; i++) {
                out.write(nines);
            }
            out.write("\n");
        }
        Process p = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(), "-Xmx256m",
                "-cp", System.getProperty("java.class.path"), Main.class.getName(),
                "replay", big.toString(), "--program", PROGRAM).redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
        String err = new String(p.getErrorStream().readAllBytes(), StandardCharsets.UTF_8);
        assertThat(p.waitFor(60, TimeUnit.SECONDS)).isTrue();
        assertThat(p.exitValue()).as(err).isEqualTo(2);
        assertThat(err.lines()).singleElement().satisfies(l -> assertThat(l).isEqualTo(big + ": line 4 is longer than 4096 characters"));
        Files.delete(big);
    }
}
