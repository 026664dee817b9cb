package hammerstep.sim.physics;

import hammerstep.config.YamlDocument;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Back contacts (docs/simulator.md, "Back contacts"): the hammer's back dog face meeting the jaw behind
 * it, thrown back by the cam spring after a rebound or when the brake stops the spindle. The truth names
 * them ({@code back_contacts}, negative torque); they are never blows, and the controller's chain,
 * replaying the trace, never reads them as a loosening.
 */
class BackContactTest {

    static final int BLOCK = 500;

    static final String PROGRAM = """
            id: back-contact
            torque: { min: 40.0, target: 380.0, max: 2000.0 }
            final_torque: max_peak
            blows: { count_above: 40.0, min: 1, max: 500, dead_time_ms: %s }
            rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 3000 }
            """;

    @ParameterizedTest(name = "{0} on {1} at {2} Hz, trigger {3} ms, seed {4}")
    @CsvSource({
            // the demo's rundowns (config/demo: two-dog on the wheel stud, 20 kHz, 300 ms)
            "cordless-two-dog, wheel-stud-m14, 20000, 300, 11, false",
            "cordless-two-dog, wheel-stud-m14, 20000, 300, 12, false",
            // rundowns whose trace shows back contacts
            "cordless-skip-dog, wheel-stud-m14, 50000, 1500, 1, true",
            "cordless-skip-dog, wheel-stud-m14, 50000, 1500, 2, true",
            "cordless-two-dog, iso-hard, 50000, 1500, 2, true"})
    void backContactsAreNamedInTheTruthAndNeverReadAsALoosening(String tool, String joint, double rateHz,
                                                                double holdMs, long seed, boolean shows)
            throws Exception {
        Rig rig = Rig.create(Presets.tool(tool), Presets.joint(joint), Presets.defaultTransducer(), rateHz, seed);
        rig.setBlowThresholdNm(40);
        String yaml = String.format(PROGRAM, Double.toString(rig.recontactS() * 1e3));
        JointProgram program = ProgramFile.read(YamlDocument.parse("back-contact.yaml",
                yaml.getBytes(StandardCharsets.UTF_8)));
        List<JointResult> results = new ArrayList<>();
        JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), rateHz, BLOCK,
                results::add);
        float[] block = new float[BLOCK];
        run(rig, monitor, block, 100, rateHz);
        rig.setTrigger(true);
        run(rig, monitor, block, holdMs, rateHz);
        rig.setTrigger(false);
        run(rig, monitor, block, 400, rateHz);
        monitor.finish();

        for (int i = 0; i < rig.backContacts(); i++) {
            assertThat(rig.backContactNm(i)).as("back contact " + i).isLessThanOrEqualTo(-40);
        }
        if (shows) {
            assertThat(rig.backContacts()).isPositive();
        }
        assertThat(results).hasSize(1);
        JointResult r = results.get(0);
        assertThat(r.loosening()).as("a tightening with its back contacts").isFalse();
        assertThat(r.blows()).isEqualTo(rig.blows());
    }

    /**
     * The demo's tool and joint (config/demo/station.yaml: three-dog on the flange, 20 kHz) with its final
     * program's shut-off at 285 N·m: about 45 ms after the shut-off the hammer, released over a jaw by the
     * stopping spindle, swings back onto the back of that jaw (docs/simulator.md, "Back contacts").
     */
    @org.junit.jupiter.params.ParameterizedTest(name = "seed {0}")
    @org.junit.jupiter.params.provider.ValueSource(longs = {1, 2, 3})
    void theDemosSpikeAfterTheShutoffIsABackContactAndStaysATightening(long seed) throws Exception {
        double rateHz = 20_000;
        Rig rig = Rig.create(Presets.tool("cordless-three-dog"), Presets.joint("flange-m16"),
                Presets.defaultTransducer(), rateHz, seed);
        rig.setBlowThresholdNm(100);
        String yaml = String.format(PROGRAM.replace("count_above: 40.0", "count_above: 100.0"),
                Double.toString(rig.recontactS() * 1e3));
        JointProgram program = ProgramFile.read(YamlDocument.parse("back-contact.yaml",
                yaml.getBytes(StandardCharsets.UTF_8)));
        List<JointResult> results = new ArrayList<>();
        JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), rateHz, 20,
                results::add);
        float[] block = new float[20];
        run(rig, monitor, block, 50, rateHz);
        rig.setTrigger(true);
        while (rig.blows() == 0 || rig.blowPeakNm(rig.blows() - 1) < 285) {
            run(rig, monitor, block, 1, rateHz);
        }
        rig.setTrigger(false);
        double shutoffS = rig.timeS();
        int before = rig.backContacts();
        int blows = rig.blows();
        run(rig, monitor, block, 400, rateHz);
        monitor.finish();

        assertThat(rig.backContacts()).isGreaterThan(before);
        assertThat(rig.backContactNm(before)).isLessThan(-150);
        assertThat(rig.backContactTimeS(before) - shutoffS).isBetween(0.03, 0.06);
        assertThat(rig.blows()).isEqualTo(blows);
        assertThat(results).hasSize(1);
        assertThat(results.get(0).loosening()).isFalse();
        assertThat(results.get(0).blows()).isEqualTo(blows);
    }

    private static void run(Rig rig, JointMonitor monitor, float[] block, double ms, double rateHz) {
        int samples = (int) (ms * 1e-3 * rateHz);
        for (int done = 0; done < samples; done += block.length) {
            long t0 = Math.round(rig.samplesElapsed() * 1e9 / rateHz);
            rig.fill(block, 0, block.length);
            monitor.onSamples(block, 0, block.length, t0);
        }
    }
}
