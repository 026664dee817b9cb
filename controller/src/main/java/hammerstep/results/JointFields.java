package hammerstep.results;

import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.ResidualEstimate;
import hammerstep.signal.SignalFaults;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The figures of a judged joint under the field names that replay output and the MQTT joint
 * message share ({@code blows}, {@code peaks_nm}, {@code final_torque_nm}, {@code duration_ms},
 * {@code verdict}, {@code reasons}, {@code limits}, ...). {@code direction} is {@code tighten} or
 * {@code loosen}; a loosening's peaks and final torque are negative (against the tightening sense). Values are rounded for reading:
 * torques to 0.01 N·m, times to 0.1 ms.
 */
public final class JointFields {

    private JointFields() {
    }

    /** The shared fields in a stable order, ready for a JSON writer. */
    public static Map<String, Object> of(JointResult r) {
        JointProgram p = r.program();
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("program", p.id());
        m.put("direction", r.direction().key());
        m.put("blows", r.blows());
        List<Double> peaks = new ArrayList<>(r.peaksNm().length);
        for (double v : r.peaksNm()) {
            peaks.add(round(v, 100));
        }
        m.put("peaks_nm", peaks);
        m.put("final_torque_nm", round(r.finalTorqueNm(), 100));
        m.put("duration_ms", round(r.durationMs(), 10));
        m.put("blow_rate_per_min", round(r.blowRatePerMin(), 10));
        m.put("blows_after_shutoff", r.blowsAfterShutoff());
        m.put("verdict", r.verdict().name());
        List<String> reasons = new ArrayList<>(r.reasons().size());
        for (Reason reason : r.reasons()) {
            reasons.add(reason.name());
        }
        m.put("reasons", reasons);
        if (r.faults() != 0) {
            m.put("sensor_faults", SignalFaults.names(r.faults()));
        }
        if (r.rejectedImpulses() > 0) {
            m.put("rejected_impulses", r.rejectedImpulses());
        }
        if (r.residual() != null) {
            m.put("residual_estimate", residual(r.residual()));
        }
        m.put("limits", limits(p));
        return m;
    }

    /**
     * The residual-torque estimate: {@code torque_nm} with its 95 % band ({@code low_nm}, {@code high_nm}),
     * {@code uncalibrated_nm} (by the default factor; what audits are fitted against), {@code slide_nm}
     * (the measured slide torque), {@code blows_used}, {@code turning_blows} and {@code calibrated}; or,
     * without an estimate, {@code reason} and {@code turning_blows}.
     */
    public static Map<String, Object> residual(ResidualEstimate e) {
        Map<String, Object> m = new LinkedHashMap<>();
        if (!e.present()) {
            m.put("reason", e.reason().name());
            m.put("turning_blows", e.turningBlows());
            return m;
        }
        m.put("torque_nm", round(e.torqueNm(), 100));
        m.put("low_nm", round(e.lowNm(), 100));
        m.put("high_nm", round(e.highNm(), 100));
        m.put("uncalibrated_nm", round(e.uncalibratedNm(), 100));
        m.put("slide_nm", round(e.slipNm(), 100));
        m.put("blows_used", e.blowsUsed());
        m.put("turning_blows", e.turningBlows());
        m.put("calibrated", e.calibrated());
        return m;
    }

    /** The windows the joint was judged against, so a result explains itself without its program file. */
    public static Map<String, Object> limits(JointProgram p) {
        Map<String, Object> torque = new LinkedHashMap<>();
        torque.put("min", p.torque().minNm());
        torque.put("max", p.torque().maxNm());
        Map<String, Object> blows = new LinkedHashMap<>();
        blows.put("min", p.blows().min());
        blows.put("max", p.blows().max());
        Map<String, Object> limits = new LinkedHashMap<>();
        limits.put("torque_nm", torque);
        limits.put("blows", blows);
        return limits;
    }

    public static double round(double v, int scale) {
        return Math.round(v * scale) / (double) scale;
    }
}
