package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.config.YamlDocument;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.ProgramFile;
import hammerstep.results.JointFields;
import hammerstep.results.JsonLines;

/**
 * Start-up of {@code replay} on a second core: while the main thread has picocli read the
 * command line, this thread runs a tiny replay of a built-in strike, which loads and links the
 * YAML reader, the content hash, the signal chain and the JSON writer. On two cores this takes
 * that class loading off the main thread's path; the real run repeats none of its work.
 *
 * <p>It is an optimisation only: any failure here is left for the real run to meet and report.
 */
final class ReplayPreload implements Runnable {

    private static final String PROGRAM = """
            id: preload
            torque: { min: 1.0, target: 2.0, max: 3.0 }
            blows: { count_above: 1.0, min: 1, max: 2 }
            rundown: { start_above: 0.5, end_after_ms: 1, max_ms: 100 }
            """;

    private ReplayPreload() {
    }

    static void start() {
        // a Runnable, not a method reference: the first lambda costs the main thread tens of ms
        Thread t = new Thread(new ReplayPreload(), "replay-preload");
        t.setDaemon(true);
        t.start();
    }

    @Override
    public void run() {
        try {
            JointProgram program = ProgramFile.read(YamlDocument.parse("preload", PROGRAM));
            double rateHz = 10_000;
            float[] samples = new float[ReplayCommand.BLOCK];
            for (int i = 0; i < 20; i++) { // one 2 ms half-sine strike of 2 N·m at 10 ms
                samples[100 + i] = (float) (2.0 * Math.sin(Math.PI * i / 20));
            }
            JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), rateHz,
                    samples.length, result -> JsonLines.of(JointFields.of(result)));
            monitor.onSamples(samples, 0, samples.length, 0);
            monitor.finish();
        } catch (ConfigException | RuntimeException e) {
            // nothing to do: the real run loads the same classes and reports what fails there
        }
    }
}
