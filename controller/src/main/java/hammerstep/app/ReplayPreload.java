package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.config.YamlDocument;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointResult;
import hammerstep.joint.SplitReplay;
import hammerstep.joint.JointProgram;
import hammerstep.joint.ProgramFile;
import hammerstep.results.JointFields;
import hammerstep.results.JsonLines;
import hammerstep.trace.F32Trace;

/**
 * Start-up of {@code replay} on a second core: while the main thread has picocli read the
 * command line and load the program, this thread replays a built-in shift of rundowns, which
 * loads and links the YAML reader, the content hash, the signal chain and the JSON writer, and
 * runs the chain's loops often enough for the JIT to compile them before the real trace arrives.
 * It stops as soon as the real replay begins ({@link #stop()}) or after 80 s of signal.
 *
 * <p>It is an optimisation only: its results are thrown away, and any failure here is left for
 * the real run to meet and report.
 */
final class ReplayPreload implements Runnable {

    private static final String PROGRAM = """
            id: preload
            torque: { min: 180.0, target: 200.0, max: 230.0 }
            blows: { count_above: 40.0, min: 4, max: 30 }
            rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 5000 }
            """;
    private static final double RATE_HZ = 50_000;
    /** The most signal warmed on: 40 rounds of the 2 s shift. */
    private static final int ROUNDS = 40;

    private static volatile boolean stopped;

    private ReplayPreload() {
    }

    static void start() {
        // a Runnable, not a method reference: the first lambda costs the main thread tens of ms
        Thread t = new Thread(new ReplayPreload(), "replay-preload");
        t.setDaemon(true);
        t.start();
    }

    /** The real replay begins: give the core back. */
    static void stop() {
        stopped = true;
    }

    @Override
    public void run() {
        try {
            JointProgram program = ProgramFile.read(YamlDocument.parse("preload", PROGRAM));
            // the same classes the real replay calls through (trace buffer, split replay, its events),
            // so that what the JIT compiles here is not thrown away there
            F32Trace trace = F32Trace.of(shift());
            SplitReplay replay = new SplitReplay(program, JointMonitor.replayConditioning(program), RATE_HZ,
                    ReplayCommand.BLOCK);
            for (int round = 0; round < ROUNDS && !stopped; round++) {
                for (JointResult r : replay.run(trace::read, trace.samples(), 1).results()) {
                    JsonLines.of(JointFields.of(r));
                }
            }
        } catch (ConfigException | RuntimeException e) {
            // nothing to do: the real run loads the same classes and reports what fails there
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /** Two seconds: 0.4 s quiet, 36 strikes 30 ms apart rising from 50 to 220 N·m, then quiet. */
    private static float[] shift() {
        float[] x = new float[25 * ReplayCommand.BLOCK];
        for (int k = 0; k < 36; k++) {
            int start = (int) ((0.4 + 0.03 * k) * RATE_HZ);
            double peak = 50 + 170.0 * k / 35;
            for (int i = 0; i < 100; i++) { // a 2 ms half-sine
                x[start + i] = (float) (peak * Math.sin(Math.PI * i / 100));
            }
        }
        for (int i = 0; i < x.length; i++) {
            x[i] += (float) (0.02 * Math.sin(i * 0.37)); // a little noise so the zero tracks
        }
        return x;
    }
}
