package hammerstep.bench;

import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultMessages;
import hammerstep.results.StationId;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceStore;

import java.io.BufferedOutputStream;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;

/**
 * Writes an archive for the what-if benchmark, the way a station keeps it: {@code COUNT} stored
 * traces ({@code .hst}, int16, 20 kHz, through {@link TraceStore}) of an invented flange line,
 * parts of 4 positions, each tightened in a snug and a final pass, and the joint and part messages
 * the station would have delivered for them ({@code results.jsonl}: the joint judged by the chain
 * against its program, the trace named; every 500th joint message twice, as a subscriber sees a
 * redelivery). The rundowns are drawn from 1000 different ones per pass, each judged once, so that
 * writing 100 000 traces costs little more than the files. Seeded, so the same arguments write the
 * same archive:
 *
 * <pre>
 * java -cp controller/target/benchmarks.jar hammerstep.bench.ArchiveMaker /tmp/archive 100000 1 \
 *     config/demo/programs/flange-snug.yaml config/demo/programs/flange-final.yaml
 * </pre>
 *
 * A final rundown: 50 ms of idle noise, 4 to 10 strikes of 2 ms about 55 ms apart, the last
 * around 285 N·m (spread 12 N·m, so some land outside the window), then the quiet that ends the
 * rundown; a snug rundown: 2 to 5 strikes up to about 150 N·m. About 0.4 to 0.8 s, 16 to 32 kB.
 */
public final class ArchiveMaker {

    private static final double RATE_HZ = 20_000;
    private static final int POSITIONS = 4;
    /** Different rundowns per pass; a joint is one of them, drawn at random. */
    private static final int SHAPES = 1000;
    /** Idle noise of 0.4 N·m rms, drawn once: each rundown takes a stretch of it at a random place. */
    private static final float[] NOISE = new float[1 << 20];

    /** A half-sine strike of 2 ms at 20 kHz, 41 samples. */
    private static final double[] SINE = new double[41];

    static {
        for (int i = 0; i < SINE.length; i++) {
            SINE[i] = Math.sin(Math.PI * i / (SINE.length - 1));
        }
        Random r = new Random(12345);
        for (int i = 0; i < NOISE.length; i++) {
            NOISE[i] = (float) (0.4 * r.nextGaussian());
        }
    }

    private ArchiveMaker() {
    }

    public static void main(String[] args) throws Exception {
        if (args.length != 5) {
            System.err.println("usage: ArchiveMaker DIR COUNT SEED SNUG_PROGRAM FINAL_PROGRAM");
            System.exit(2);
        }
        Path dir = Path.of(args[0]);
        int count = Integer.parseInt(args[1]);
        Random random = new Random(Long.parseLong(args[2]));
        JointProgram snug = ProgramFile.load(Path.of(args[3]));
        JointProgram fin = ProgramFile.load(Path.of(args[4]));
        TraceStore store = new TraceStore(dir.resolve("traces"), Math.max(1, count), Long.MAX_VALUE, StoredTrace.Encoding.INT16);
        StationId station = new StationId("demo-plant", "line-1", "flange-1");
        // SHAPES different rundowns per pass, each judged once by the chain; the joints draw from them
        float[][][] shapes = new float[2][SHAPES][];
        JointResult[][] results = new JointResult[2][SHAPES];
        float[] work = new float[(int) (2 * RATE_HZ)];
        List<JointResult> judged = new ArrayList<>();
        for (int pass = 0; pass < 2; pass++) {
            JointProgram program = pass == 0 ? snug : fin;
            for (int k = 0; k < SHAPES; k++) {
                int n = pass == 0 ? rundown(work, random, 2 + random.nextInt(4), 150)
                        : rundown(work, random, 4 + random.nextInt(7), 285 + 12 * random.nextGaussian());
                shapes[pass][k] = java.util.Arrays.copyOf(work, n);
                judged.clear();
                JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), RATE_HZ,
                        n, judged::add);
                monitor.onSamples(work, 0, n, 0);
                monitor.finish();
                results[pass][k] = judged.get(0);
            }
        }
        long t0 = System.nanoTime();
        int written = 0;
        long jointSeq = 0;
        long partSeq = 0;
        Instant at = Instant.parse("2026-10-01T06:00:00Z");
        try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(dir.resolve("results.jsonl")), 1 << 16)) {
            for (int part = 1; written < count; part++) {
                String serial = String.format("FL-%06d", part);
                List<String> jointIds = new ArrayList<>();
                boolean partGo = true;
                for (int pass = 0; pass < 2 && written < count; pass++) {
                    JointProgram program = pass == 0 ? snug : fin;
                    for (int position = 1; position <= POSITIONS && written < count; position++) {
                        int k = random.nextInt(SHAPES);
                        float[] x = shapes[pass][k];
                        int n = x.length;
                        JointResult r = results[pass][k];
                        at = at.plusMillis(4000);
                        Map<String, String> meta = new LinkedHashMap<>();
                        meta.put("part_serial", serial);
                        meta.put("position", Integer.toString(position));
                        meta.put("pass", pass == 0 ? "snug" : "final");
                        meta.put("attempt", "1");
                        meta.put("program", program.id());
                        meta.put("program_revision", program.revision());
                        meta.put("verdict", r.verdict().name());
                        Path trace = store.save(serial + "_" + position + "_" + meta.get("pass") + "_1", meta, x, n,
                                RATE_HZ, 0);
                        JointOutcome joint = new JointOutcome(serial, "flange-8", "flange-4", Integer.toString(position),
                                position, meta.get("pass"), 1, r, "TX-0001", null, at, trace.toString());
                        String id = String.format("%s-j-%09d", station.station(), ++jointSeq);
                        byte[] message = ResultMessages.joint(station, id, jointSeq, joint);
                        out.write(message);
                        out.write('\n');
                        if (jointSeq % 500 == 0) {
                            out.write(message);
                            out.write('\n');
                        }
                        jointIds.add(id);
                        partGo &= r.verdict() == hammerstep.joint.Verdict.GO;
                        written++;
                    }
                }
                PartOutcome p = new PartOutcome(serial, "flange-8", "flange-4", partGo ? "GO" : "NO_GO", "COMPLETE",
                        jointIds, at.minusSeconds(30), at);
                out.write(ResultMessages.part(station, String.format("%s-p-%09d", station.station(), ++partSeq), partSeq, p));
                out.write('\n');
            }
        }
        System.out.printf("%d traces in %s, %d bytes, %.1f s%n", store.count(), store.directory(), store.bytes(),
                (System.nanoTime() - t0) / 1e9);
    }

    /** One rundown into {@code x}; returns its length in samples. */
    private static int rundown(float[] x, Random random, int strikes, double lastPeakNm) {
        int lead = (int) (0.05 * RATE_HZ);
        int tail = (int) (0.2 * RATE_HZ);
        int at = lead;
        int width = SINE.length - 1;
        double first = 0.55 * lastPeakNm;
        java.util.Arrays.fill(x, 0f);
        for (int s = 0; s < strikes; s++) {
            double peak = strikes == 1 ? lastPeakNm : first + (lastPeakNm - first) * s / (strikes - 1);
            for (int i = 0; i <= width; i++) {
                x[at + i] += (float) (peak * SINE[i]);
            }
            for (int i = 1; i <= width; i++) { // the rebound lobe after the strike
                x[at + width + i] -= (float) (0.12 * peak * SINE[i]);
            }
            at += (int) ((0.050 + 0.010 * random.nextDouble()) * RATE_HZ);
        }
        int n = at + tail;
        int from = random.nextInt(NOISE.length - n);
        for (int i = 0; i < n; i++) {
            x[i] += NOISE[from + i];
        }
        return n;
    }
}
