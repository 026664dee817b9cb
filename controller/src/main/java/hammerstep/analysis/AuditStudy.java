package hammerstep.analysis;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.DoubleUnaryOperator;

/**
 * Pairs residual-torque audits with the dynamic figures of the same joints and relates them (and,
 * beside that, with the joints' residual estimates: {@link EstimateFit}):
 * per program and audit method (never mixed: each method reads the joint differently), the
 * mean offset residual − dynamic, Pearson's r, the line residual = a + b·dynamic with its
 * standard errors, and the dynamic window whose edges keep a single joint's residual torque
 * inside its specification with a two-sided prediction interval (t-distribution, n − 2
 * degrees of freedom).
 *
 * <p>An audit names its joint by the joint message's id, or by part serial and position; by
 * position it pairs with the last joint result for that position in the file (the rundown that
 * left the bolt as audited).
 */
public final class AuditStudy {

    /** A dynamic final-torque window, N·m. {@code extrapolated}: an edge lies outside the audited dynamic range. */
    public record Window(double minNm, double maxNm, boolean extrapolated) { }

    /**
     * Figures of one program and method.
     *
     * @param fit    null with fewer than 3 pairs or no spread in the dynamic figures
     * @param window null when none can be given; {@code note} says why
     * @param currentLimits the windows the audited joints were judged against (first seen)
     * @param estimate the audits fitted against the joints' residual estimate (beside the dynamic fit); null
     *                 when fewer than {@link EstimateFit#MIN_AUDITS} audited joints carry an estimate
     */
    public record Group(String program, Audit.Method method, int n, double meanDynamicNm, double meanResidualNm,
                        double meanOffsetNm, double sdOffsetNm, double minDynamicNm, double maxDynamicNm,
                        LinearFit fit, boolean slopeSignificant, Window window, String note,
                        JointRecord.Limits currentLimits, double[] dynamicNm, double[] residualNm,
                        EstimateFit estimate) { }

    public record Report(List<Group> groups, List<Audit> unpaired, double confidence, double specMinNm, double specMaxNm) {

        public boolean hasSpec() {
            return !Double.isNaN(specMinNm);
        }
    }

    private AuditStudy() {
    }

    /**
     * @param specMinNm residual-torque specification, or NaN for none (no window is suggested)
     * @param confidence two-sided confidence of the prediction interval, e.g. 0.95
     */
    public static Report of(List<Audit> audits, List<JointRecord> joints, double specMinNm, double specMaxNm,
                            double confidence) {
        Map<String, JointRecord> byId = new HashMap<>();
        Map<String, JointRecord> byPosition = new HashMap<>();
        for (JointRecord j : joints) {
            if (!j.id().isEmpty()) {
                byId.put(j.id(), j);
            }
            if (!j.partSerial().isEmpty() && !j.position().isEmpty()) {
                byPosition.put(j.partSerial() + "\u0000" + j.position(), j);
            }
        }
        Map<String, List<double[]>> pairs = new LinkedHashMap<>();
        Map<String, JointRecord> firstJoint = new HashMap<>();
        Map<String, Audit.Method> methods = new HashMap<>();
        List<Audit> unpaired = new ArrayList<>();
        for (Audit a : audits) {
            JointRecord j = !a.jointId().isEmpty() ? byId.get(a.jointId())
                    : byPosition.get(a.partSerial() + "\u0000" + a.position());
            if (j == null || j.sensorFault() || j.blows() == 0) {
                unpaired.add(a);
                continue;
            }
            String key = j.program() + "\u0000" + a.method();
            pairs.computeIfAbsent(key, k -> new ArrayList<>())
                    .add(new double[] {j.finalTorqueNm(), a.residualNm(), j.residualEstimateNm()});
            firstJoint.putIfAbsent(key, j);
            methods.put(key, a.method());
        }
        List<Group> groups = new ArrayList<>();
        for (Map.Entry<String, List<double[]>> e : pairs.entrySet()) {
            groups.add(group(firstJoint.get(e.getKey()), methods.get(e.getKey()), e.getValue(), specMinNm, specMaxNm,
                    confidence));
        }
        return new Report(groups, unpaired, confidence, specMinNm, specMaxNm);
    }

    private static Group group(JointRecord first, Audit.Method method, List<double[]> pairs, double specMin,
                               double specMax, double confidence) {
        int n = pairs.size();
        double[] x = new double[n];
        double[] y = new double[n];
        double sx = 0;
        double sy = 0;
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            x[i] = pairs.get(i)[0];
            y[i] = pairs.get(i)[1];
            sx += x[i];
            sy += y[i];
            lo = Math.min(lo, x[i]);
            hi = Math.max(hi, x[i]);
        }
        double meanOffset = (sy - sx) / n;
        double ss = 0;
        for (int i = 0; i < n; i++) {
            double d = y[i] - x[i] - meanOffset;
            ss += d * d;
        }
        double sdOffset = n > 1 ? Math.sqrt(ss / (n - 1)) : Double.NaN;
        LinearFit fit = null;
        boolean significant = false;
        Window window = null;
        String note;
        if (n < 3) {
            note = "fewer than 3 audits: no line and no window (audit more joints)";
        } else if (!(hi > lo)) {
            note = "all audited joints have the same dynamic torque: no line can be fitted";
        } else {
            fit = LinearFit.of(x, y);
            significant = fit.b() > 0 && fit.slopeSignificant(confidence);
            if (!significant) {
                note = "residual torque does not follow the dynamic torque (slope not significant at "
                        + percent(confidence) + "): no dynamic window can be derived";
            } else if (Double.isNaN(specMin)) {
                note = "give --spec MIN:MAX for a suggested dynamic window";
            } else {
                window = window(fit, specMin, specMax, confidence, lo, hi);
                note = window == null ? "the scatter is too wide for the specification: no dynamic window keeps residual"
                        + " torque inside it at " + percent(confidence) : (window.extrapolated()
                        ? "an edge of the window lies outside the audited dynamic range: audit joints there to confirm"
                        : "");
            }
        }
        return new Group(first.program(), method, n, sx / n, sy / n, meanOffset, sdOffset, lo, hi, fit, significant,
                window, note, first.limits(), x, y, estimateFit(pairs, confidence));
    }

    /** The audits against the residual estimate of those joints that carry one. */
    private static EstimateFit estimateFit(List<double[]> pairs, double confidence) {
        int m = 0;
        for (double[] p : pairs) {
            m += Double.isNaN(p[2]) ? 0 : 1;
        }
        double[] estimate = new double[m];
        double[] audit = new double[m];
        int k = 0;
        for (double[] p : pairs) {
            if (!Double.isNaN(p[2])) {
                estimate[k] = p[2];
                audit[k++] = p[1];
            }
        }
        return EstimateFit.of(estimate, audit, confidence);
    }

    /**
     * The dynamic window [L, U] with ŷ(L) − h(L) = specMin and ŷ(U) + h(U) = specMax, h the
     * prediction half-width. With a significant positive slope both edges are increasing in x
     * (their slopes are at least b − t·SE(b) &gt; 0), so each has one root, found by bisection.
     */
    static Window window(LinearFit fit, double specMin, double specMax, double confidence, double lo, double hi) {
        DoubleUnaryOperator lower = v -> fit.predict(v) - fit.predictionHalfWidth(v, confidence);
        DoubleUnaryOperator upper = v -> fit.predict(v) + fit.predictionHalfWidth(v, confidence);
        double l = root(lower, specMin, fit.meanX(), Math.max(1.0, hi - lo));
        double u = root(upper, specMax, fit.meanX(), Math.max(1.0, hi - lo));
        if (!(l <= u)) {
            return null;
        }
        return new Window(l, u, l < lo || u > hi);
    }

    private static double root(DoubleUnaryOperator f, double target, double centre, double span) {
        double a = centre - span;
        double b = centre + span;
        for (int i = 0; i < 60 && f.applyAsDouble(a) > target; i++) {
            a -= span * (1L << Math.min(i, 40));
        }
        for (int i = 0; i < 60 && f.applyAsDouble(b) < target; i++) {
            b += span * (1L << Math.min(i, 40));
        }
        for (int i = 0; i < 200; i++) {
            double m = 0.5 * (a + b);
            if (f.applyAsDouble(m) < target) {
                a = m;
            } else {
                b = m;
            }
        }
        return 0.5 * (a + b);
    }

    private static String percent(double confidence) {
        return Math.round(confidence * 1000) / 10.0 + " %";
    }
}
