package hammerstep.sim.app;

import hammerstep.sim.physics.Rig;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** The ground truth of one rundown under the field names of the truth file (docs/simulator.md). */
final class Truth {

    private Truth() {
    }

    static Map<String, Object> rundown(Rig rig, double startS) {
        return rundown(rig, startS, 0, 0.0);
    }

    /**
     * The rundown of the present fastener's blows from {@code firstBlow} on; times less {@code skippedS},
     * the virtual time that was not written to the trace (the unrecorded tightening before a loosening).
     * A loosening ({@code direction} {@code loosen}) has negative peaks.
     */
    static Map<String, Object> rundown(Rig rig, double startS, int firstBlow, double skippedS) {
        int n = rig.blows() - firstBlow;
        List<Double> times = new ArrayList<>(n);
        List<Double> peaks = new ArrayList<>(n);
        List<Integer> cutShort = new ArrayList<>();
        for (int i = firstBlow; i < Math.min(firstBlow + n, Rig.MAX_BLOWS); i++) {
            times.add(round(rig.blowTimeS(i) - skippedS, 1e6));
            peaks.add(round(rig.blowPeakNm(i), 100));
            if (rig.blowCutShort(i)) {
                cutShort.add(i - firstBlow);
            }
        }
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("start_s", round(startS, 1e6));
        m.put("direction", rig.reverse() ? "loosen" : "tighten");
        m.put("blows", n);
        m.put("blow_times_s", times);
        m.put("peaks_nm", peaks);
        m.put("cut_short_blows", cutShort);
        m.put("residual_torque_nm", round(rig.residualTorqueNm(), 100));
        m.put("angle_deg", round(rig.angleDeg(), 100));
        m.put("angle_after_snug_deg", round(rig.angleAfterSnugDeg(), 100));
        m.put("clamp_load_kn", round(rig.clampLoadN() * 1e-3, 100));
        m.put("yield_load_kn", Double.isNaN(rig.yieldLoadN()) ? null : round(rig.yieldLoadN() * 1e-3, 100));
        m.put("yielded", rig.yielded());
        m.put("blow_rate_per_min", round(blowRatePerMin(rig, firstBlow), 10));
        double spr = rig.strikesPerRev(firstBlow);
        m.put("strikes_per_rev", Double.isNaN(spr) ? null : round(spr, 1000));
        List<Map<String, Object>> back = new ArrayList<>();
        for (int i = 0; i < Math.min(rig.backContacts(), Rig.MAX_BACK_CONTACTS); i++) {
            if (rig.backContactTimeS(i) - skippedS < startS) {
                continue;
            }
            Map<String, Object> b = new LinkedHashMap<>();
            b.put("time_s", round(rig.backContactTimeS(i) - skippedS, 1e6));
            b.put("peak_nm", round(rig.backContactNm(i), 100));
            back.add(b);
        }
        m.put("back_contacts", back);
        return m;
    }

    /** Blows per minute from first to last peak, as the controller reports it; 0 with fewer than two. */
    static double blowRatePerMin(Rig rig) {
        return blowRatePerMin(rig, 0);
    }

    /** As {@link #blowRatePerMin(Rig)} over the blows from {@code firstBlow} on. */
    static double blowRatePerMin(Rig rig, int firstBlow) {
        int last = Math.min(rig.blows(), Rig.MAX_BLOWS) - 1;
        if (last - firstBlow < 1) {
            return 0.0;
        }
        double span = rig.blowTimeS(last) - rig.blowTimeS(firstBlow);
        return span > 0 ? (last - firstBlow) * 60.0 / span : 0.0;
    }

    static double round(double v, double scale) {
        return Math.round(v * scale) / scale;
    }
}
