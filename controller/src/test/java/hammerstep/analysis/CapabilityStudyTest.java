package hammerstep.analysis;

import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class CapabilityStudyTest {

    static final JointRecord.Limits NARROW = new JointRecord.Limits(80, 100, 4, 12);
    static final JointRecord.Limits WIDE = new JointRecord.Limits(75, 105, 4, 12);

    static JointRecord joint(String program, String position, double nm, int blows, JointRecord.Limits l) {
        return new JointRecord(1, "", program, position, "", nm, blows, "GO", List.of(), l);
    }

    @Test
    void groupsPerProgramThenPerPositionInOrderOfAppearance() {
        List<JointRecord> joints = List.of(joint("a", "1", 92, 6, NARROW), joint("a", "2", 94, 7, NARROW),
                joint("b", "1", 50, 5, NARROW), joint("a", "1", 96, 8, NARROW));

        CapabilityStudy.Report r = CapabilityStudy.of(joints, true);

        assertThat(r.entries()).extracting(e -> e.program() + "/" + e.position())
                .containsExactly("a/", "a/1", "a/2", "b/", "b/1");
        assertThat(r.entries().get(0).torque().n()).isEqualTo(3);
        assertThat(r.entries().get(1).finalTorquesNm()).containsExactly(92.0, 96.0);
    }

    /*
     * Per-position figures worked by hand (window 80..100):
     *   position 1: 92, 96, 95 -> mean 94.3333, squares 5.4444 + 2.7778 + 0.4444 = 8.6667,
     *               s = sqrt(8.6667 / 2) = 2.081666, Cm = 20 / 12.49 = 1.601282,
     *               Cmk = (100 - 94.3333) / 6.244998 = 0.907393
     *   position 2: 94, 93 -> mean 93.5, s = 0.707107, Cm = 4.714045, Cmk = 6.5 / 2.121320 = 3.064129
     */
    @Test
    void perPositionFiguresMatchTheHandCalculation() {
        List<JointRecord> joints = List.of(joint("f", "1", 92, 6, NARROW), joint("f", "2", 94, 7, NARROW),
                joint("f", "1", 96, 8, NARROW), joint("f", "2", 93, 7, NARROW), joint("f", "1", 95, 7, NARROW));

        CapabilityStudy.Report r = CapabilityStudy.of(joints, true);

        Capability p1 = r.entries().get(1).torque();
        Capability p2 = r.entries().get(2).torque();
        assertThat(p1.sd()).isCloseTo(2.081666, within(1e-6));
        assertThat(p1.cm()).isCloseTo(1.601282, within(1e-6));
        assertThat(p1.cmk()).isCloseTo(0.907393, within(1e-6));
        assertThat(p2.cm()).isCloseTo(4.714045, within(1e-6));
        assertThat(p2.cmk()).isCloseTo(3.064129, within(1e-6));
        assertThat(r.entries().get(1).flags()).contains(CapabilityStudy.Flag.CM_LOW, CapabilityStudy.Flag.CMK_LOW,
                CapabilityStudy.Flag.FEW_JOINTS);
        assertThat(r.entries().get(2).flags()).doesNotContain(CapabilityStudy.Flag.CM_LOW, CapabilityStudy.Flag.CMK_LOW);
    }

    @Test
    void keepsJointsJudgedAgainstDifferentWindowsApartAndSaysSo() {
        List<JointRecord> joints = List.of(joint("a", "1", 92, 6, NARROW), joint("a", "1", 94, 7, WIDE),
                joint("a", "1", 93, 6, NARROW), joint("b", "1", 90, 6, NARROW));

        CapabilityStudy.Report r = CapabilityStudy.of(joints, false);

        assertThat(r.entries()).hasSize(3);
        assertThat(r.entries().get(0).limits()).isEqualTo(NARROW);
        assertThat(r.entries().get(0).torque().n()).isEqualTo(2);
        assertThat(r.entries().get(1).limits()).isEqualTo(WIDE);
        assertThat(r.entries().get(0).mixedLimits()).isTrue();
        assertThat(r.entries().get(2).mixedLimits()).isFalse();
        assertThat(r.programsWithMixedLimits()).containsExactly("a");
    }

    @Test
    void leavesSensorFaultsOutAndCountsThem() {
        List<JointRecord> joints = new ArrayList<>(List.of(joint("a", "1", 92, 6, NARROW), joint("a", "1", 94, 7, NARROW)));
        joints.add(new JointRecord(3, "", "a", "1", "", 0, 0, "NO_GO", List.of("SENSOR_FAULT"), NARROW));

        CapabilityStudy.Report r = CapabilityStudy.of(joints, false);

        assertThat(r.sensorFaults()).isEqualTo(1);
        assertThat(r.entries().get(0).torque().n()).isEqualTo(2);
    }

    @Test
    void flagsAStudyOfFewerThan25Joints() {
        List<JointRecord> joints = new ArrayList<>();
        for (int i = 0; i < 25; i++) {
            joints.add(joint("a", "", 90 + (i % 5) * 0.5, 7, NARROW));
        }
        assertThat(CapabilityStudy.of(joints, false).entries().get(0).flags()).doesNotContain(CapabilityStudy.Flag.FEW_JOINTS);
        assertThat(CapabilityStudy.of(joints.subList(0, 24), false).entries().get(0).flags())
                .contains(CapabilityStudy.Flag.FEW_JOINTS);
    }
}
