package hammerstep.app;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.signal.PulseTrain;
import hammerstep.testing.StandardStreams;
import hammerstep.trace.TraceWriter;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Damaged traces through {@code hammerstep replay} as a line engineer runs it: a file cut mid-row
 * or mid-sample, NaN and infinite values, time standing still or going back, empty files and
 * binary junk. Each either replays with a SENSOR_FAULT verdict or is refused with one line naming
 * the file (and the line, for CSV), exit 2, never a stack trace.
 */
class DamagedTraceReplayTest {

    private static final String PROGRAM = "src/test/resources/programs/good.yaml";
    private static final double RATE = 20_000;

    @TempDir
    Path dir;

    @RegisterExtension
    final StandardStreams streams = new StandardStreams();

    private static float[] rundown() {
        List<PulseTrain.Strike> s = new ArrayList<>();
        for (int i = 0; i < 8; i++) {
            s.add(new PulseTrain.Strike(0.1 + i * 0.027, 0.002, 100 + i * 15, 0.3, 0.2, 0));
        }
        return PulseTrain.render(RATE, 0.8, s, 0.2, 0.1, 1);
    }

    private String csv() throws Exception {
        Path p = dir.resolve("whole.csv");
        float[] x = rundown();
        try (TraceWriter w = new TraceWriter(p, RATE, Map.of())) {
            w.write(x, 0, x.length);
        }
        return Files.readString(p);
    }

    private Path write(String name, byte[] bytes) throws Exception {
        Path p = dir.resolve(name);
        Files.write(p, bytes);
        return p;
    }

    private Path write(String name, String text) throws Exception {
        return write(name, text.getBytes(StandardCharsets.UTF_8));
    }

    private void refusedWithOneLine(Path trace, String... replayArgs) {
        List<String> args = new ArrayList<>(List.of("replay", trace.toString(), "--program", PROGRAM));
        args.addAll(Arrays.asList(replayArgs));
        int exit = Main.run(args.toArray(String[]::new));
        String e = streams.err();
        assertThat(exit).isEqualTo(2);
        assertThat(e.lines()).singleElement().satisfies(l -> assertThat(l).contains(trace.toString()));
        assertThat(e).doesNotContain("Exception").doesNotContain("\tat ");
    }

    @Test
    void csvCutInTheMiddleOfARowNamesTheLastLine() throws Exception {
        String whole = csv();
        int cut = whole.lastIndexOf(',') + 1; // the last row ends after its comma: no torque value
        Path p = write("cut.csv", whole.substring(0, cut));
        refusedWithOneLine(p);
        long lines = whole.substring(0, cut).lines().count();
        assertThat(streams.err()).startsWith(p + ":" + lines + ":");
    }

    @Test
    void csvCutInsideTheTimeColumnIsRefused() throws Exception {
        String whole = csv();
        int cut = whole.lastIndexOf('\n', whole.length() - 2) + 3; // "0." of the last row's time
        refusedWithOneLine(write("cut-time.csv", whole.substring(0, cut)));
    }

    @Test
    void csvCutAtARowBoundaryStillReplaysTheRowsItHas() throws Exception {
        String whole = csv();
        String half = whole.substring(0, whole.indexOf('\n', whole.length() / 2) + 1);
        int exit = Main.run("replay", write("half.csv", half).toString(), "--program", PROGRAM);
        assertThat(exit).isZero();
        assertThat(streams.out().lines()).hasSize(1);
    }

    @Test
    void notANumberAndInfinityInCsvAreRefusedWithTheirLine() throws Exception {
        String whole = csv();
        String[] rows = whole.split("\n");
        for (String bad : List.of("NaN", "Infinity", "-inf", "1e999")) {
            streams.clearErr();
            String[] copy = rows.clone();
            String[] cols = copy[40].split(",");
            copy[40] = cols[0] + "," + bad;
            Path p = write("bad-" + bad + ".csv", String.join("\n", copy) + "\n");
            refusedWithOneLine(p);
            assertThat(streams.err()).startsWith(p + ":41:");
        }
    }

    @Test
    void timeThatStandsStillOrGoesBackIsRefused() throws Exception {
        String[] rows = csv().split("\n");
        String[] still = rows.clone();
        still[50] = rows[49].split(",")[0] + "," + rows[50].split(",")[1];
        refusedWithOneLine(write("still.csv", String.join("\n", still) + "\n"));
        streams.clearErr();
        String[] back = rows.clone();
        back[60] = "0.000000," + rows[60].split(",")[1];
        refusedWithOneLine(write("back.csv", String.join("\n", back) + "\n"));
    }

    @Test
    void emptyAndBinaryFilesAreRefusedAndAHeaderAloneHasNoRundowns() throws Exception {
        refusedWithOneLine(write("empty.csv", new byte[0]));
        streams.clearErr();
        // a header and no rows is a trace of nothing: it says so and is not an error
        int exit = Main.run("replay", write("header.csv", "# rate_hz=20000\ntime_s,torque_nm\n").toString(),
                "--program", PROGRAM, "--summary");
        assertThat(exit).isZero();
        assertThat(streams.out()).contains("0 rundowns");
        byte[] junk = new byte[4096];
        new Random(8).nextBytes(junk);
        refusedWithOneLine(write("junk.csv", junk));
    }

    @Test
    void f32CutInTheMiddleOfASampleIsRefused() throws Exception {
        float[] x = rundown();
        ByteBuffer b = ByteBuffer.allocate(x.length * 4).order(ByteOrder.LITTLE_ENDIAN);
        for (float v : x) {
            b.putFloat(v);
        }
        byte[] cut = Arrays.copyOf(b.array(), x.length * 4 - 3);
        Path p = write("cut.f32", cut);
        refusedWithOneLine(p, "--rate", "20000");
        assertThat(streams.err()).contains("not a whole number of float32 samples");
    }

    @Test
    void notANumberInsideAnF32RundownIsASensorFaultNeverAGo() throws Exception {
        float[] x = rundown();
        int peak = (int) (0.1 * RATE) + 5 * (int) (0.027 * RATE) + 10;
        x[peak] = Float.NaN;
        ByteBuffer b = ByteBuffer.allocate(x.length * 4).order(ByteOrder.LITTLE_ENDIAN);
        for (float v : x) {
            b.putFloat(v);
        }
        Path p = write("nan.f32", b.array());
        int exit = Main.run("replay", p.toString(), "--rate", "20000", "--program", PROGRAM);
        assertThat(exit).isZero();
        List<String> lines = streams.out().lines().toList();
        assertThat(lines).isNotEmpty().allSatisfy(l -> {
            JsonNode j = new ObjectMapper().readTree(l);
            assertThat(j.get("verdict").asText()).isEqualTo("NO_GO");
            assertThat(j.get("reasons").toString()).contains("SENSOR_FAULT");
        });
    }
}
