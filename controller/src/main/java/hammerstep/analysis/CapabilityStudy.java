package hammerstep.analysis;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Capability of the final torque and of the blow count, per program and per position of a
 * program, from judged joints. The specification limits come from each joint's own
 * {@code limits}: joints of one program judged against different windows are never merged:
 * each window gets its own entry, and every entry of that program is marked
 * {@link Entry#mixedLimits()}. Joints with a sensor fault are left out (their figures are no
 * measurement) and counted.
 */
public final class CapabilityStudy {

    /** A figure below 1.67, or a study smaller than 25 joints, as named in reports. */
    public enum Flag { CM_LOW, CMK_LOW, BLOWS_CM_LOW, BLOWS_CMK_LOW, FEW_JOINTS, SD_ZERO }

    /**
     * Figures of one group of joints.
     *
     * @param position      the position label; "" for the whole program
     * @param mixedLimits   the program's joints were judged against more than one window
     * @param finalTorquesNm the group's final torques in file order (for run charts)
     */
    public record Entry(String program, String position, JointRecord.Limits limits, boolean mixedLimits,
                        Capability torque, Capability blows, List<Double> finalTorquesNm, List<Flag> flags) {

        public Entry {
            finalTorquesNm = List.copyOf(finalTorquesNm);
            flags = List.copyOf(flags);
        }

        public boolean perPosition() {
            return !position.isEmpty();
        }
    }

    /** The whole study: program entries first, each followed by its positions' entries. */
    public record Report(List<Entry> entries, int joints, int sensorFaults) {

        public Report {
            entries = List.copyOf(entries);
        }

        /** Programs judged against more than one window. */
        public List<String> programsWithMixedLimits() {
            List<String> out = new ArrayList<>();
            for (Entry e : entries) {
                if (e.mixedLimits() && !e.perPosition() && !out.contains(e.program())) {
                    out.add(e.program());
                }
            }
            return out;
        }
    }

    private CapabilityStudy() {
    }

    public static Report of(List<JointRecord> joints, boolean perPosition) {
        Map<String, Map<JointRecord.Limits, List<JointRecord>>> byProgram = new LinkedHashMap<>();
        int faults = 0;
        for (JointRecord j : joints) {
            if (j.sensorFault()) {
                faults++;
                continue;
            }
            byProgram.computeIfAbsent(j.program(), k -> new LinkedHashMap<>())
                    .computeIfAbsent(j.limits(), k -> new ArrayList<>()).add(j);
        }
        List<Entry> entries = new ArrayList<>();
        for (Map.Entry<String, Map<JointRecord.Limits, List<JointRecord>>> p : byProgram.entrySet()) {
            boolean mixed = p.getValue().size() > 1;
            for (Map.Entry<JointRecord.Limits, List<JointRecord>> w : p.getValue().entrySet()) {
                entries.add(entry(p.getKey(), "", w.getKey(), mixed, w.getValue()));
                if (perPosition) {
                    Map<String, List<JointRecord>> byPosition = new LinkedHashMap<>();
                    for (JointRecord j : w.getValue()) {
                        if (!j.position().isEmpty()) {
                            byPosition.computeIfAbsent(j.position(), k -> new ArrayList<>()).add(j);
                        }
                    }
                    for (Map.Entry<String, List<JointRecord>> pos : byPosition.entrySet()) {
                        entries.add(entry(p.getKey(), pos.getKey(), w.getKey(), mixed, pos.getValue()));
                    }
                }
            }
        }
        return new Report(entries, joints.size(), faults);
    }

    private static Entry entry(String program, String position, JointRecord.Limits l, boolean mixed,
                               List<JointRecord> group) {
        double[] torques = new double[group.size()];
        double[] blows = new double[group.size()];
        List<Double> run = new ArrayList<>(group.size());
        for (int i = 0; i < torques.length; i++) {
            torques[i] = group.get(i).finalTorqueNm();
            blows[i] = group.get(i).blows();
            run.add(torques[i]);
        }
        Capability t = Capability.of(torques, l.torqueMinNm(), l.torqueMaxNm());
        Capability b = Capability.of(blows, l.blowsMin(), l.blowsMax());
        List<Flag> flags = new ArrayList<>();
        if (t.cmLow()) {
            flags.add(Flag.CM_LOW);
        }
        if (t.cmkLow()) {
            flags.add(Flag.CMK_LOW);
        }
        if (b.cmLow()) {
            flags.add(Flag.BLOWS_CM_LOW);
        }
        if (b.cmkLow()) {
            flags.add(Flag.BLOWS_CMK_LOW);
        }
        if (group.size() < Capability.MIN_STUDY) {
            flags.add(Flag.FEW_JOINTS);
        }
        if (t.n() >= 2 && t.sd() == 0) {
            flags.add(Flag.SD_ZERO);
        }
        return new Entry(program, position, l, mixed, t, b, run, flags);
    }
}
