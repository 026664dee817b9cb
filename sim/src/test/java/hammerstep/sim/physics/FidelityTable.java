package hammerstep.sim.physics;

import hammerstep.config.YamlDocument;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * The simulator's truth against the controller's own chain (as {@code hammerstep replay} runs it), per
 * tool preset × joint preset × seed: blows counted by each, whether they agree, peaks within
 * max(4 %, 10 N·m), strikes per relative turn, blows per minute, clamp load against the bolt's yield load.
 * The program counts from {@code count_above} with the tool's re-contact time as its dead time
 * (docs/simulator.md, "What a blow is"). Run the whole table (about 10 minutes on one core):
 *
 * <pre>
 * mvn -o -q -pl sim -am test-compile
 * java -cp "sim/target/test-classes:sim/target/hammerstep-sim.jar" hammerstep.sim.physics.FidelityTable [seeds] [hold-ms] [tool,...]
 * </pre>
 */
public final class FidelityTable {

    static final double RATE_HZ = 50_000;
    static final int BLOCK = 1000;
    static final double COUNT_ABOVE_NM = 40;

    /** One rundown: truth against replay. */
    record Row(String tool, String joint, long seed, int truthBlows, int replayBlows, int peaksOff, int cutShort,
               double strikesPerRev, double geometricPerRev, double blowsPerMin, double clampKn, double yieldKn,
               boolean yielded, int backContacts) {

        boolean agrees() {
            return truthBlows == replayBlows;
        }
    }

    /** The program the replay side uses: count_above 40 N·m, dead time the tool's re-contact time. */
    static JointProgram program(double deadTimeMs) throws Exception {
        String yaml = String.format(Locale.ROOT, """
                id: fidelity
                torque: { min: 10.0, target: 200.0, max: 2000.0 }
                final_torque: max_peak
                blows: { count_above: %.1f, min: 1, max: 10000, dead_time_ms: %.2f }
                rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 60000 }
                """, COUNT_ABOVE_NM, deadTimeMs);
        return ProgramFile.read(YamlDocument.parse("fidelity.yaml", yaml.getBytes(StandardCharsets.UTF_8)));
    }

    static Row rundown(String tool, String joint, long seed, double holdMs) throws Exception {
        ToolSpec toolSpec = Presets.tool(tool);
        Rig rig = Rig.create(toolSpec, Presets.joint(joint), Presets.defaultTransducer(), RATE_HZ, seed);
        rig.setBlowThresholdNm(COUNT_ABOVE_NM);
        JointProgram program = program(rig.recontactS() * 1e3);
        List<JointResult> results = new ArrayList<>();
        JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), RATE_HZ, BLOCK,
                results::add);
        float[] block = new float[BLOCK];
        run(rig, monitor, block, 100);
        rig.setTrigger(true);
        run(rig, monitor, block, holdMs);
        rig.setTrigger(false);
        run(rig, monitor, block, 500);
        monitor.finish();
        int replay = 0;
        for (JointResult r : results) {
            replay += r.blows();
        }
        int n = rig.blows();
        int off = 0;
        int cut = 0;
        if (results.size() == 1 && replay == n) {
            double[] peaks = results.get(0).peaksNm();
            for (int i = 0; i < n; i++) {
                if (rig.blowCutShort(i)) {
                    cut++;
                } else if (Math.abs(rig.blowPeakNm(i) - peaks[i]) > Math.max(0.04 * Math.abs(peaks[i]), 10.0)) {
                    off++;
                }
            }
        }
        double perMin = n >= 2 ? (n - 1) * 60.0 / (rig.blowTimeS(n - 1) - rig.blowTimeS(0)) : Double.NaN;
        return new Row(tool, joint, seed, n, replay, off, cut, rig.strikesPerRev(), toolSpec.mechanism().strikesPerRev(),
                perMin, rig.clampLoadN() * 1e-3, rig.yieldLoadN() * 1e-3, rig.yielded(), rig.backContacts());
    }

    static List<Row> table(int seeds, double holdMs) throws Exception {
        List<Row> rows = new ArrayList<>();
        for (String tool : Presets.TOOLS) {
            for (String joint : Presets.JOINTS) {
                for (long seed = 1; seed <= seeds; seed++) {
                    rows.add(rundown(tool, joint, seed, holdMs));
                }
            }
        }
        return rows;
    }

    public static void main(String[] args) throws Exception {
        int seeds = args.length > 0 ? Integer.parseInt(args[0]) : 3;
        double holdMs = args.length > 1 ? Double.parseDouble(args[1]) : 1500;
        List<String> tools = args.length > 2 ? List.of(args[2].split(",")) : Presets.TOOLS;
        System.out.printf(Locale.ROOT, "count_above %.0f N·m, hold %.0f ms, %.0f Hz, seeds 1-%d%n%n", COUNT_ABOVE_NM,
                holdMs, RATE_HZ, seeds);
        System.out.println("| tool | joint | seed | truth blows | replay blows | agree | peaks off (cut short) "
                + "| strikes/rev (geometry) | blows/min | clamp / yield kN | yielded | back contacts |");
        System.out.println("|---|---|---|---|---|---|---|---|---|---|---|---|");
        int agree = 0;
        int total = 0;
        for (String tool : tools) {
            for (String joint : Presets.JOINTS) {
                for (long seed = 1; seed <= seeds; seed++) {
                    Row r = rundown(tool, joint, seed, holdMs);
                    total++;
                    agree += r.agrees() ? 1 : 0;
                    System.out.printf(Locale.ROOT, "| %s | %s | %d | %d | %d | %s | %d (%d) | %.2f (%.1f) | %.0f | %.1f / %.1f | %s | %d |%n",
                            r.tool(), r.joint(), r.seed(), r.truthBlows(), r.replayBlows(), r.agrees() ? "yes" : "NO",
                            r.peaksOff(), r.cutShort(), r.strikesPerRev(), r.geometricPerRev(), r.blowsPerMin(),
                            r.clampKn(), r.yieldKn(), r.yielded() ? "yes" : "no", r.backContacts());
                }
            }
        }
        System.out.printf(Locale.ROOT, "%nagreement: %d of %d rundowns (%.1f %%)%n", agree, total, 100.0 * agree / total);
    }

    private static void run(Rig rig, JointMonitor monitor, float[] block, double ms) {
        int samples = (int) (ms * 1e-3 * RATE_HZ);
        for (int done = 0; done < samples; done += BLOCK) {
            long t0 = Math.round(rig.samplesElapsed() * 1e9 / RATE_HZ);
            rig.fill(block, 0, BLOCK);
            monitor.onSamples(block, 0, BLOCK, t0);
        }
    }

    private FidelityTable() {
    }
}
