package hammerstep.sim.physics;

import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ResidualEstimate;
import hammerstep.joint.ResidualEstimator;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;

/**
 * The residual estimate ({@link ResidualEstimator}) against the simulator's truth ({@code residual_torque_nm},
 * a breakaway audit) on the CALIBRATION set: today's tool and joint presets with today's friction law, per
 * tool × joint × seed × trigger hold, through the controller's own chain as {@code hammerstep replay} runs it
 * ({@link FidelityTable#program}). Prints per pair the rundowns with an estimate, the reasons of those
 * without, truth ÷ slide torque (the factor) and the estimate's error (mean and 2σ); then the factor and 2σ
 * band over every rundown with an estimate: where {@link ResidualEstimator#DEFAULT_FACTOR} and
 * {@link ResidualEstimator#DEFAULT_BAND} come from. About 8 minutes on one core with the defaults:
 *
 * <pre>
 * mvn -o -q -pl sim -am test-compile
 * java -cp "sim/target/test-classes:sim/target/hammerstep-sim.jar" hammerstep.sim.physics.ResidualTable [seeds] [hold-ms,...] [tool,...]
 * </pre>
 */
public final class ResidualTable {

    /** One rundown: the truth and what the chain estimated. */
    record Row(String tool, String joint, long seed, double holdMs, double truthNm, ResidualEstimate estimate) {

        double factor() {
            return truthNm / estimate.slipNm();
        }

        /** Estimate over truth, less one. */
        double error() {
            return estimate.torqueNm() / truthNm - 1.0;
        }
    }

    static Row rundown(String tool, String joint, long seed, double holdMs) throws Exception {
        Rig rig = Rig.create(Presets.tool(tool), Presets.joint(joint), Presets.defaultTransducer(),
                FidelityTable.RATE_HZ, seed);
        rig.setBlowThresholdNm(FidelityTable.COUNT_ABOVE_NM);
        JointProgram program = FidelityTable.program(rig.recontactS() * 1e3);
        List<JointResult> results = new ArrayList<>();
        JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program),
                FidelityTable.RATE_HZ, FidelityTable.BLOCK, results::add);
        float[] block = new float[FidelityTable.BLOCK];
        run(rig, monitor, block, 100);
        rig.setTrigger(true);
        run(rig, monitor, block, holdMs);
        rig.setTrigger(false);
        run(rig, monitor, block, 500);
        monitor.finish();
        // the joint's rundown: the last one (a free-running start may make a short one before it)
        ResidualEstimate estimate = results.isEmpty() ? null : results.get(results.size() - 1).residual();
        return new Row(tool, joint, seed, holdMs, rig.residualTorqueNm(), estimate);
    }

    private static void run(Rig rig, JointMonitor monitor, float[] block, double ms) {
        int samples = (int) (ms * 1e-3 * FidelityTable.RATE_HZ);
        for (int done = 0; done < samples; done += FidelityTable.BLOCK) {
            long t0 = Math.round(rig.samplesElapsed() * 1e9 / FidelityTable.RATE_HZ);
            rig.fill(block, 0, FidelityTable.BLOCK);
            monitor.onSamples(block, 0, FidelityTable.BLOCK, t0);
        }
    }

    /** Mean and standard deviation (n − 1). */
    static double[] meanSd(List<Double> v) {
        double m = 0;
        for (double x : v) {
            m += x;
        }
        m /= v.size();
        double s = 0;
        for (double x : v) {
            s += (x - m) * (x - m);
        }
        return new double[] {m, v.size() > 1 ? Math.sqrt(s / (v.size() - 1)) : 0.0};
    }

    public static void main(String[] args) throws Exception {
        int seeds = args.length > 0 ? Integer.parseInt(args[0]) : 3;
        List<Double> holds = new ArrayList<>();
        for (String h : (args.length > 1 ? args[1] : "1500,3000").split(",")) {
            holds.add(Double.parseDouble(h));
        }
        List<String> tools = args.length > 2 ? List.of(args[2].split(",")) : Presets.TOOLS;
        System.out.printf(Locale.ROOT, "calibration set: presets with today's friction law, count_above %.0f N·m, "
                        + "%.0f Hz, seeds 1-%d, holds %s ms; default factor %.3f, band ±%.1f %%%n%n",
                FidelityTable.COUNT_ABOVE_NM, FidelityTable.RATE_HZ, seeds, holds, ResidualEstimator.DEFAULT_FACTOR,
                100 * ResidualEstimator.DEFAULT_BAND);
        System.out.println("| tool | joint | rundowns | with estimate | no estimate (reasons) | truth ÷ slide torque "
                + "(mean, sd %) | error of estimate: mean, 2σ % |");
        System.out.println("|---|---|---|---|---|---|---|");
        List<Double> allFactors = new ArrayList<>();
        List<Double> allErrors = new ArrayList<>();
        for (String tool : tools) {
            for (String joint : Presets.JOINTS) {
                List<Double> factors = new ArrayList<>();
                List<Double> errors = new ArrayList<>();
                Map<String, Integer> reasons = new TreeMap<>();
                int total = 0;
                for (double hold : holds) {
                    for (long seed = 1; seed <= seeds; seed++) {
                        Row r = rundown(tool, joint, seed, hold);
                        total++;
                        if (r.estimate() == null) {
                            reasons.merge("NO_RUNDOWN", 1, Integer::sum);
                        } else if (!r.estimate().present()) {
                            reasons.merge(r.estimate().reason().name(), 1, Integer::sum);
                        } else {
                            factors.add(r.factor());
                            errors.add(r.error());
                        }
                    }
                }
                allFactors.addAll(factors);
                allErrors.addAll(errors);
                double[] f = factors.isEmpty() ? new double[] {Double.NaN, Double.NaN} : meanSd(factors);
                double[] e = errors.isEmpty() ? new double[] {Double.NaN, Double.NaN} : meanSd(errors);
                System.out.printf(Locale.ROOT, "| %s | %s | %d | %d | %s | %.3f, %.1f | %+.1f, %.1f |%n", tool, joint,
                        total, factors.size(), reasons.isEmpty() ? "" : reasons.toString(), f[0], 100 * f[1] / f[0],
                        100 * e[0], 200 * e[1]);
            }
        }
        double[] f = meanSd(allFactors);
        double[] e = meanSd(allErrors);
        System.out.printf(Locale.ROOT, "%nover %d rundowns with an estimate: truth ÷ slide torque %.4f (sd %.4f); "
                        + "error of the estimate at the default factor: mean %+.2f %%, 2σ %.2f %%, "
                        + "|mean| + 2σ %.2f %%%n", allFactors.size(), f[0], f[1], 100 * e[0], 200 * e[1],
                100 * (Math.abs(e[0]) + 2 * e[1]));
    }

    private ResidualTable() {
    }
}
