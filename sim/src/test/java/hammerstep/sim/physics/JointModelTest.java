package hammerstep.sim.physics;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.util.SplittableRandom;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class JointModelTest {

    /** Turns a fastener of {@code joint} (no scatter) by a slowly rising torque until it reaches {@code torqueNm}. */
    private static double angleAtTorque(JointSpec joint, double torqueNm) {
        JointSpec exact = new JointSpec(joint.name(), joint.prevailingTorqueNm(), joint.freeAngleRad(),
                joint.fullTorqueNm(), joint.angleToFullRad(), 1.0, 0, 0, joint.kFactor(), joint.diameterM(), 0, 100,
                null);
        Fastener f = new Fastener(exact, 1e-4, new SplittableRandom(1));
        double h = 1e-5;
        double applied = 0;
        while (f.runningTorqueNm() < torqueNm) {
            applied = Math.max(applied, f.runningTorqueNm()) + 1e-3;
            f.advance(h, applied);
        }
        return Math.toDegrees(f.angleRad() - joint.freeAngleRad());
    }

    @Test
    @DisplayName("iso-hard reaches full torque about 30° after seating (ISO 5393 joint definition; memory)")
    void isoHardReachesFullTorqueThirtyDegreesAfterSeating() throws Exception {
        JointSpec j = Presets.joint("iso-hard");
        assertThat(angleAtTorque(j, j.fullTorqueNm())).isCloseTo(30.0, within(1.0));
    }

    @Test
    @DisplayName("iso-soft reaches full torque about 720° after seating (ISO 5393 joint definition; memory)")
    void isoSoftReachesFullTorqueSevenHundredTwentyDegreesAfterSeating() throws Exception {
        JointSpec j = Presets.joint("iso-soft");
        assertThat(angleAtTorque(j, j.fullTorqueNm())).isCloseTo(720.0, within(5.0));
    }

    @Test
    @DisplayName("clamp load follows T = K·F·d: M12 at 88.0 N·m, K 0.2 clamps 36.7 kN (short-form torque-tension relation, worked by hand)")
    void clampLoadFollowsTheShortFormTorqueTension() {
        JointSpec m12 = new JointSpec("m12", 0, 0, 100, 1, 1.1, 0, 0, 0.2, 0.012, 0, 100, null);
        assertThat(m12.clampLoadN(88.0)).isCloseTo(36_667, within(10.0));
    }

    @Test
    void fastenerTurnsOnlyWhenTheTorqueExceedsItsHold() throws Exception {
        JointSpec j = Presets.joint("iso-hard");
        Fastener f = new Fastener(j, 1e-4, new SplittableRandom(2));
        for (int i = 0; i < 10_000; i++) {
            f.advance(1e-5, 0.95 * f.runningTorqueNm());
        }
        assertThat(f.angleRad()).isZero();
        for (int i = 0; i < 100; i++) {
            f.advance(1e-5, 2.0 * f.runningTorqueNm());
        }
        assertThat(f.angleRad()).isPositive();
    }

    @Test
    void restingFastenerRelaxesTowardItsLoss() throws Exception {
        JointSpec j = Presets.joint("flange-m16");
        Fastener f = new Fastener(j, 1e-4, new SplittableRandom(3));
        double h = 1e-5;
        while (f.angleRad() < j.freeAngleRad() + j.angleToFullRad()) {
            f.advance(h, 1.5 * j.staticFrictionRatio() * f.runningTorqueNm() + 50);
        }
        while (f.speedRadS() > 0) {
            f.advance(h, 0);
        }
        double installed = f.clampLoadN();
        for (int i = 0; i < 1_000_000; i++) {
            f.advance(h, 0);
        }
        assertThat(f.clampLoadN() / installed).isCloseTo(1.0 - j.relaxationLoss(), within(0.01));
    }
}
