package hammerstep.sim.physics;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.SplittableRandom;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** Bolts from their ISO 898-1 property class, and an elastic–plastic bolt in the fastener. */
class BoltTest {

    @ParameterizedTest(name = "M{0}: stress area {1} mm² (ISO 898-1)")
    @CsvSource({"10, 58.0", "12, 84.3", "14, 115", "16, 157"})
    void stressAreaOfCoarseThreadsIsTheStandardsFigure(double d, double areaMm2) {
        Bolt b = new Bolt("M" + (int) d, d, Bolt.coarsePitchMm(d), "8.8");
        // ISO 898-1 tabulates As rounded to three significant figures
        assertThat(b.stressAreaMm2()).isCloseTo(areaMm2, within(0.005 * areaMm2));
    }

    @ParameterizedTest(name = "M{0} {1}: proof load {2} kN (ISO 898-1)")
    @CsvSource({"10, 8.8, 33.7", "12, 8.8, 48.9", "14, 8.8, 66.7", "16, 8.8, 91.0",
            "10, 10.9, 48.1", "12, 10.9, 70.0", "14, 10.9, 95.5", "16, 10.9, 130"})
    void proofLoadIsTheStandardsFigure(double d, String cls, double proofKn) {
        Bolt b = new Bolt("M" + (int) d, d, Bolt.coarsePitchMm(d), cls);
        assertThat(b.proofLoadN() * 1e-3).isCloseTo(proofKn, within(0.005 * proofKn));
    }

    @Test
    @DisplayName("M16 10.9 yields near Rp0.2 × As = 940 × 157 = 148 kN (ISO 898-1, memory; check a licensed copy)")
    void m16TenNineYieldsNearOneHundredFortyEightKilonewtons() {
        Bolt b = new Bolt("M16", 16, 2, "10.9");
        assertThat(b.yieldLoadN() * 1e-3).isCloseTo(148, within(1.0));
        assertThat(b.tensileLoadN() * 1e-3).isCloseTo(163, within(1.0));
    }

    @Test
    @DisplayName("fine thread M14x1.5 has the larger stress area, about 125 mm² (ISO 898-1 formula for As)")
    void fineThreadHasTheLargerStressArea() {
        assertThat(new Bolt("M14x1.5", 14, 1.5, "10.9").stressAreaMm2()).isCloseTo(124.5, within(0.5));
    }

    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {"8.8", "10.9", "12.9"})
    void hardeningSaturatesBelowOnePointOneFiveTimesTheYieldLoad(String cls) {
        Bolt b = new Bolt("M16", 16, 2, cls);
        assertThat(b.saturationLoadN()).isGreaterThan(b.yieldLoadN()).isLessThan(1.15 * b.yieldLoadN());
    }

    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {"iso-hard", "iso-soft", "wheel-stud-m14", "flange-m16"})
    void everyJointPresetNamesItsBolt(String name) throws Exception {
        JointSpec j = Presets.joint(name);
        assertThat(j.bolt()).isNotNull();
        assertThat(j.bolt().diameterMm() * 1e-3).isCloseTo(j.diameterM(), within(1e-9));
    }

    /** Drives a fastener of {@code joint} (no scatter) by a slowly rising torque for {@code degrees} past snug. */
    private static Fastener turnPastSnug(JointSpec joint, double degrees) {
        JointSpec exact = new JointSpec(joint.name(), joint.prevailingTorqueNm(), joint.freeAngleRad(),
                joint.fullTorqueNm(), joint.angleToFullRad(), 1.0, 0, 0, joint.kFactor(), joint.diameterM(), 0, 100,
                joint.bolt());
        Fastener f = new Fastener(exact, 1e-4, new SplittableRandom(1));
        double h = 1e-5;
        double target = joint.freeAngleRad() + Math.toRadians(degrees);
        while (f.angleRad() < target) {
            f.advance(h, f.runningTorqueNm() + 5.0);
        }
        return f;
    }

    @Test
    @DisplayName("iso-hard (M16 10.9) turned far past yield: clamp load saturates within 1.15 × yield load, angle keeps growing (bolted-joint practice, Bickford, memory)")
    void clampLoadSaturatesWhileTheNutTurnsOn() throws Exception {
        JointSpec j = Presets.joint("iso-hard");
        double yieldN = j.bolt().yieldLoadN();
        Fastener atYield = turnPastSnug(j, 60);
        assertThat(atYield.yielded()).isFalse();
        Fastener past = turnPastSnug(j, 200);
        Fastener far = turnPastSnug(j, 720);
        assertThat(past.yielded()).isTrue();
        assertThat(past.clampLoadN()).isBetween(yieldN, 1.15 * yieldN);
        assertThat(far.clampLoadN()).isBetween(past.clampLoadN(), 1.15 * yieldN);
        // elastic, 520° more would have added 520/30 × 200 N·m; yielded, the torque barely rises
        assertThat(far.runningTorqueNm() - past.runningTorqueNm()).isLessThan(0.1 * past.runningTorqueNm());
    }

    @Test
    void yieldedBoltUnloadsElasticallyWithAPermanentSet() throws Exception {
        JointSpec j = Presets.joint("iso-hard");
        Fastener f = turnPastSnug(j, 200);
        double loaded = f.clampLoadN();
        f.setReverse(true);
        double h = 1e-5;
        double start = f.angleRad();
        while (start - f.angleRad() < Math.toRadians(20)) {
            f.advance(h, Fastener.LOOSENING_RATIO * f.runningTorqueNm() + 5.0);
        }
        // back 20° of the elastic rate: the load falls by the elastic rate, not along the plastic curve
        double expected = loaded - j.clampRateNPerRad() * (start - f.angleRad());
        assertThat(f.clampLoadN()).isCloseTo(expected, within(0.02 * loaded));
        assertThat(f.yielded()).isTrue();
    }

    @Test
    void withoutABoltTheJointStaysElastic() {
        JointSpec j = new JointSpec("elastic", 1, 0, 200, Math.toRadians(30), 1.0, 0, 0, 0.2, 0.016, 0, 100, null);
        Fastener f = turnPastSnug(j, 300);
        assertThat(f.yielded()).isFalse();
        assertThat(f.runningTorqueNm()).isCloseTo(1 + 199.0 * 10, within(20.0));
    }
}
