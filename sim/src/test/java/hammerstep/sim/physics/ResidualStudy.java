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
 * The residual-torque study (docs/residual-estimate.md): rundowns simulated with their truth, the controller's own
 * chain run on their samples as {@code hammerstep replay} runs it, and each figure the station could judge on
 * set against the truth's {@code residual_torque_nm} (a breakaway audit, docs/simulator.md).
 *
 * <p>Two sets kept apart. The calibration set is what an estimator may be tuned on: the bundled tool and joint
 * presets under their single torque coefficient. The held-out set is what it was not tuned on: tools with an
 * extension bar and another supply, joints of other sizes, and every joint under the three friction laws of
 * thread and bearing face with drawn coefficients (dry or oiled). Each rundown ends as at a station: tool
 * enable drops at the end of the block in which the signal first reaches the rundown's shut-off torque, the
 * operator lets go 200 ms later; without a crossing (the tool cannot reach it) the trigger is held 1.5 s.
 *
 * <p>Run the whole study (about 20 minutes on one core) and write the plots:
 * <pre>
 * mvn -o -q -pl sim -am test-compile
 * java -cp "sim/target/test-classes:sim/target/hammerstep-sim.jar" hammerstep.sim.physics.ResidualStudyReport [seeds] [docs]
 * </pre>
 */
final class ResidualStudy {

    static final double RATE_HZ = 50_000;
    static final int BLOCK = 1000;
    static final double COUNT_ABOVE_NM = 40;
    static final double MAX_HOLD_MS = 1500;
    static final double REACTION_MS = 200;
    /** A blow turned the nut when the nut moved more than this during it, degrees (truth; the oracle figure only). */
    static final double TURNED_DEG = 0.01;

    /** Which set a program belongs to. */
    enum Set { CALIBRATION, HELD_OUT }

    /**
     * A tool, a joint and a friction law as a station would run them under one program.
     *
     * @param family    tool family for the tables (cam, twin hammer, dog clutch, oil pulse)
     * @param supply    supply bar (air) or battery volts (cordless); NaN for the preset's
     * @param shutoffNm shut-off torques drawn per rundown in [shutoffNm, 2 shutoffNm] (1.5 to 3 times the joint's full torque)
     */
    record Program(Set set, String family, String tool, ToolSpec toolSpec, double supply, String joint,
                   JointSpec jointSpec, double shutoffNm) {

        String law() {
            FrictionSpec f = jointSpec.friction();
            return f == null ? "K" : f.model().key() + "/" + f.lubrication().key();
        }

        String name() {
            return tool + " × " + joint + " (" + law() + ")";
        }
    }

    /**
     * One rundown: the truth, the dynamic figures from the controller's result, and the estimator's answer.
     *
     * @param truthNm        the truth's residual torque (breakaway audit)
     * @param results        joint results the chain gave (the last is the joint's rundown)
     * @param turningBlows   blows that turned the nut (truth)
     * @param maxPeakNm      highest blow peak (controller)
     * @param lastPeakNm     last blow's peak
     * @param meanLast3Nm    mean of the last three peaks
     * @param meanTorque3Nm  impulse over width, mean of the last three blows (signal only)
     * @param turning3Nm     the same over the last three blows that turned the nut by the truth (oracle)
     * @param estimateNm     the estimator's residual torque; NaN when it gives none
     * @param lowNm          lower end of its 95 % band
     * @param highNm         upper end of its 95 % band
     * @param noValue        the estimator's reason for giving none, or null
     */
    record Run(Program program, long seed, double truthNm, int results, int truthBlows, int turningBlows,
               double maxPeakNm, double lastPeakNm, double meanLast3Nm, double meanTorque3Nm, double turning3Nm,
               double estimateNm, double lowNm, double highNm, String noValue) {
    }

    private ResidualStudy() {
    }

    /** The program the chain runs under: counting from 40 N·m with the tool's re-contact time as dead time. */
    static JointProgram program(double deadTimeMs) throws Exception {
        String yaml = String.format(Locale.ROOT, """
                id: residual-study
                torque: { min: 10.0, target: 200.0, max: 5000.0 }
                final_torque: max_peak
                blows: { count_above: %.1f, min: 1, max: 10000, dead_time_ms: %.2f }
                rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 60000 }
                """, COUNT_ABOVE_NM, deadTimeMs);
        return ProgramFile.read(YamlDocument.parse("residual-study.yaml", yaml.getBytes(StandardCharsets.UTF_8)));
    }

    /** Calibration set: every bundled tool on every bundled joint, single torque coefficient. */
    static List<Program> calibration() throws Exception {
        List<Program> out = new ArrayList<>();
        for (String tool : Presets.TOOLS) {
            for (String joint : Presets.JOINTS) {
                JointSpec j = Presets.joint(joint);
                out.add(new Program(Set.CALIBRATION, family(Presets.tool(tool)), tool, Presets.tool(tool), Double.NaN,
                        joint, j, 1.5 * j.fullTorqueNm()));
            }
        }
        return out;
    }

    /**
     * Held-out set: four tools the estimator never saw (each family's preset with a 150 mm extension bar, another
     * supply), on the bundled joints and two new ones, under each friction law; lubrication fixed per joint.
     */
    static List<Program> heldOut() throws Exception {
        List<Program> out = new ArrayList<>();
        List<Object[]> tools = List.of(
                new Object[] {"cordless-two-dog", "cordless-two-dog+ext 16 V", 16.0},
                new Object[] {"air-twin-hammer", "air-twin-hammer+ext 5.5 bar", 5.5},
                new Object[] {"air-three-jaw", "air-three-jaw+ext 7 bar", 7.0},
                new Object[] {"oil-pulse", "oil-pulse+ext 6 bar", 6.0});
        for (Object[] t : tools) {
            ToolSpec base = Presets.tool((String) t[0]);
            ToolSpec tool = withExtension(base, (String) t[1]);
            for (JointSpec joint : heldOutJoints()) {
                for (FrictionSpec.Model model : FrictionSpec.Model.values()) {
                    FrictionSpec.Lubrication lub = oiled(joint.name()) ? FrictionSpec.Lubrication.OILED
                            : FrictionSpec.Lubrication.DRY;
                    JointSpec j = joint.withFriction(joint.name(), new FrictionSpec(model, lub));
                    out.add(new Program(Set.HELD_OUT, family(base), (String) t[1], tool, (Double) t[2], joint.name(), j,
                            1.5 * joint.fullTorqueNm()));
                }
            }
        }
        return out;
    }

    /** The bundled joints and two of other sizes (M12 8.8 hard, M20 10.9 between hard and soft). */
    static List<JointSpec> heldOutJoints() throws Exception {
        List<JointSpec> out = new ArrayList<>();
        for (String name : Presets.JOINTS) {
            out.add(Presets.joint(name));
        }
        // M12 8.8: 80 N·m at K 0.17 clamps 39 kN (82 % of the 48.1 kN proof load, ISO 898-1 As 84.3 mm², Sp 580 MPa)
        out.add(new JointSpec("m12-hard", 0.5, Math.toRadians(720), 80, Math.toRadians(25), 1.1, 0.03, 0.01, 0.17, 0.012,
                0.03, 300, new Bolt("M12", 12, 1.75, "8.8")));
        // M20 10.9: 420 N·m at K 0.16 clamps 131 kN (73 % of the 203 kN proof load, As 245 mm², Sp 830 MPa)
        out.add(new JointSpec("m20-medium", 2.0, Math.toRadians(720), 420, Math.toRadians(120), 1.1, 0.03, 0.01, 0.16,
                0.020, 0.04, 400, new Bolt("M20", 20, 2.5, "10.9")));
        return out;
    }

    private static boolean oiled(String joint) {
        return joint.equals("iso-soft") || joint.equals("wheel-stud-m14") || joint.equals("m12-hard");
    }

    /** A 150 mm extension bar: 30 000 N·m/rad in series, 4·10⁻⁵ kg·m² more at the nut (our figures). */
    static ToolSpec withExtension(ToolSpec base, String name) {
        ToolSpec.TrainSpec t = base.train();
        return new ToolSpec(name, base.drive(), base.mechanism(), new ToolSpec.TrainSpec(t.anvilStiffness(),
                t.socketStiffness(), 30_000, t.inertiaKgM2() + 4e-5, t.dampingRatio()));
    }

    static String family(ToolSpec tool) {
        MechanismSpec m = tool.mechanism();
        if (m instanceof MechanismSpec.Cam) {
            return "cam";
        }
        if (m instanceof MechanismSpec.TwinHammer) {
            return "twin hammer";
        }
        if (m instanceof MechanismSpec.OilPulse) {
            return "oil pulse";
        }
        return "dog clutch";
    }

    /** One rundown of {@code p} with {@code seed}: the shut-off torque drawn from the seed. */
    static Run rundown(Program p, long seed) throws Exception {
        Rig rig = Rig.create(p.toolSpec(), p.jointSpec(), Presets.defaultTransducer(), RATE_HZ, seed);
        rig.setBlowThresholdNm(COUNT_ABOVE_NM);
        if (!Double.isNaN(p.supply())) {
            rig.setSupplyPressureBar(p.supply());
            rig.setBatteryVoltage(p.supply());
        }
        double shutoff = p.shutoffNm() * (1.0 + new java.util.SplittableRandom(seed * 7919L).nextDouble());
        JointProgram program = program(rig.recontactS() * 1e3);
        List<JointResult> results = new ArrayList<>();
        JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), RATE_HZ, BLOCK,
                results::add);
        float[] block = new float[BLOCK];
        run(rig, monitor, block, 100);
        rig.setTrigger(true);
        double heldMs = 0;
        double releaseAtMs = MAX_HOLD_MS;
        double blockMs = BLOCK * 1e3 / RATE_HZ;
        while (heldMs < releaseAtMs) {
            fill(rig, monitor, block);
            heldMs += blockMs;
            if (releaseAtMs == MAX_HOLD_MS && max(block) >= shutoff) {
                rig.setEnabled(false);
                releaseAtMs = heldMs + REACTION_MS;
            }
        }
        rig.setTrigger(false);
        rig.setEnabled(true);
        run(rig, monitor, block, 500);
        monitor.finish();
        return measure(p, seed, rig, results);
    }

    private static Run measure(Program p, long seed, Rig rig, List<JointResult> results) {
        double truth = rig.residualTorqueNm();
        int truthBlows = rig.blows();
        int turning = 0;
        for (int i = 0; i < Math.min(truthBlows, Rig.MAX_BLOWS); i++) {
            turning += rig.blowTurnedDeg(i) > TURNED_DEG ? 1 : 0;
        }
        // the joint's rundown is the last result (a free-running start may make a short one before it)
        if (results.isEmpty() || results.get(results.size() - 1).blows() == 0) {
            return new Run(p, seed, truth, results.size(), truthBlows, turning, Double.NaN, Double.NaN, Double.NaN,
                    Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, "NO_RUNDOWN");
        }
        JointResult r = results.get(results.size() - 1);
        double[] peaks = r.peaksNm();
        int n = peaks.length;
        double max = 0;
        for (double v : peaks) {
            max = Math.max(max, v);
        }
        double last3 = 0;
        double torque3 = 0;
        int k = Math.min(3, n);
        for (int i = n - k; i < n; i++) {
            last3 += peaks[i];
            torque3 += meanTorqueNm(r, i);
        }
        // the oracle: the last three blows that turned the nut, by the truth, the chain's blows matched to the
        // truth's from the last one back when the chain counted no more than the truth
        double turning3 = Double.NaN;
        int shift = truthBlows - n;
        if (r.blows() == n && shift >= 0 && truthBlows <= Rig.MAX_BLOWS) {
            double sum = 0;
            int m = 0;
            for (int i = n - 1; i >= 0 && m < 3; i--) {
                if (rig.blowTurnedDeg(i + shift) > TURNED_DEG) {
                    sum += meanTorqueNm(r, i);
                    m++;
                }
            }
            turning3 = m > 0 ? sum / m : Double.NaN;
        }
        double estimate = ResidualEstimates.estimateNm(r);
        String reason = ResidualEstimates.noValueReason(r);
        return new Run(p, seed, truth, 1, truthBlows, turning, max, peaks[n - 1], last3 / k, torque3 / k, turning3,
                estimate, ResidualEstimates.lowNm(r), ResidualEstimates.highNm(r), reason);
    }

    /** Blow {@code i}'s impulse over its width: its mean torque, N·m. */
    static double meanTorqueNm(JointResult r, int i) {
        return r.impulsesNms()[i] / (r.widthsMs()[i] * 1e-3);
    }

    private static double max(float[] block) {
        float m = block[0];
        for (float v : block) {
            m = Math.max(m, v);
        }
        return m;
    }

    private static void fill(Rig rig, JointMonitor monitor, float[] block) {
        long t0 = Math.round(rig.samplesElapsed() * 1e9 / RATE_HZ);
        rig.fill(block, 0, BLOCK);
        monitor.onSamples(block, 0, BLOCK, t0);
    }

    private static void run(Rig rig, JointMonitor monitor, float[] block, double ms) {
        int samples = (int) (ms * 1e-3 * RATE_HZ);
        for (int done = 0; done < samples; done += BLOCK) {
            fill(rig, monitor, block);
        }
    }
}
