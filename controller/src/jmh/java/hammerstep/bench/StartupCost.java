package hammerstep.bench;

import hammerstep.app.ReplayCommand;
import hammerstep.config.ConfigException;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.joint.Verdict;
import hammerstep.results.JointFields;
import hammerstep.results.JsonLines;
import hammerstep.trace.TraceException;
import hammerstep.trace.TraceReader;
import picocli.CommandLine;

import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Random;

/**
 * What one step of {@code replay} costs the first time it runs in a fresh JVM: the figures behind
 * "Replay speed" in docs/design.md. Run one step per process (a second step in the same JVM finds
 * shared classes loaded and compiled):
 *
 * <pre>
 * B=controller/target/benchmarks.jar
 * java -cp $B hammerstep.bench.StartupCost picocli
 * java -cp $B hammerstep.bench.StartupCost program config/demo/example-program.yaml
 * java -cp $B hammerstep.bench.StartupCost sha256
 * java -cp $B hammerstep.bench.StartupCost json
 * java -cp $B hammerstep.bench.StartupCost chain /tmp/shift.f32 config/demo/example-program.yaml
 * </pre>
 *
 * {@code chain} runs one monitor over a 50 kHz trace and prints the milliseconds taken by each
 * 2.5 million samples: the first ones run interpreted, the later ones compiled.
 */
public final class StartupCost {

    private StartupCost() {
    }

    public static void main(String[] args) throws Exception {
        String step = args.length > 0 ? args[0] : "";
        long t0 = System.nanoTime();
        switch (step) {
            case "picocli" -> new CommandLine(new ReplayCommand())
                    .parseArgs("trace.f32", "--rate", "50000", "--program", "p.yaml");
            case "program" -> ProgramFile.load(Path.of(args[1]));
            case "sha256" -> sha256();
            case "json" -> json();
            case "chain" -> {
                chain(Path.of(args[1]), ProgramFile.load(Path.of(args[2])));
                return;
            }
            default -> {
                System.err.println("usage: StartupCost picocli | program FILE | sha256 | json | chain TRACE.f32 PROGRAM");
                System.exit(2);
            }
        }
        System.out.printf(Locale.ROOT, "%s: %.1f ms%n", step, (System.nanoTime() - t0) / 1e6);
    }

    private static void sha256() throws NoSuchAlgorithmException {
        MessageDigest.getInstance("SHA-256").digest(new byte[300]);
    }

    /** 500 result lines of 20 blows each, as replay prints them. */
    private static void json() {
        JointProgram p = new JointProgram("bench", "", new JointProgram.Torque(320, 380, 450),
                hammerstep.joint.FinalTorque.MAX_PEAK, new JointProgram.Blows(100, 50, 4, 20, 7.5),
                new JointProgram.Rundown(10, 200, 3000), Double.NaN, 0);
        Random rnd = new Random(1);
        long chars = 0;
        for (int i = 0; i < 500; i++) {
            double[] peaks = new double[20];
            for (int j = 0; j < peaks.length; j++) {
                peaks[j] = 100 + 300 * rnd.nextDouble();
            }
            JointResult r = new JointResult(p, i * 2_000_000_000L, i * 2_000_000_000L + 800_000_000L, 20, peaks,
                    new long[20], new double[20], new double[20], 390.1, 800.0, Long.MIN_VALUE, 0, 0,
                    Verdict.GO, List.of());
            chars += JsonLines.of(JointFields.of(r)).length();
        }
        if (chars == 0) {
            throw new IllegalStateException();
        }
    }

    private static void chain(Path trace, JointProgram program) throws TraceException {
        int block = 4096; // as replay's
        double rateHz = 50_000;
        long slice = 2_500_000;
        List<JointResult> results = new ArrayList<>();
        JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), rateHz,
                block, results::add);
        StringBuilder line = new StringBuilder("ms per 2.5 M samples:");
        long[] seen = {0, System.nanoTime()};
        TraceReader.readF32(trace, rateHz, new float[block], (x, offset, length, firstNs) -> {
            monitor.onSamples(x, offset, length, firstNs);
            if ((seen[0] + length) / slice != seen[0] / slice) {
                long now = System.nanoTime();
                line.append(String.format(Locale.ROOT, " %.0f", (now - seen[1]) / 1e6));
                seen[1] = now;
            }
            seen[0] += length;
        });
        monitor.finish();
        System.out.println(line + "; " + results.size() + " rundowns");
    }
}
