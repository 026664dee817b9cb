package hammerstep.joint;

import org.junit.jupiter.api.Test;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The verdict at the edges of its windows: a limit itself is inside. */
class EvaluatorTest {

    private final JointProgram p = Programs.hubFinal(); // 180..230 N·m, 4..30 blows, rehit within 2

    @Test
    void limitsThemselvesAreInsideTheWindows() {
        assertThat(Evaluator.reasons(p, 4, 180.0, false, 3, 0)).isEmpty();
        assertThat(Evaluator.reasons(p, 30, 230.0, false, 3, 0)).isEmpty();
    }

    @Test
    void justOutsideTheWindowsIsNoGo() {
        assertThat(Evaluator.reasons(p, 3, 179.99, false, 3, 0)).containsExactly(Reason.TORQUE_LOW, Reason.BLOWS_FEW);
        assertThat(Evaluator.reasons(p, 31, 230.01, false, 3, 0)).containsExactly(Reason.TORQUE_HIGH, Reason.BLOWS_MANY);
    }

    @Test
    void rehitCountsUpToAndIncludingTheRehitBlows() {
        assertThat(Evaluator.reasons(p, 5, 200, false, 2, 0)).containsExactly(Reason.REHIT);
        assertThat(Evaluator.reasons(p, 5, 200, false, 1, 0)).containsExactly(Reason.REHIT);
        assertThat(Evaluator.reasons(p, 5, 200, false, 3, 0)).isEmpty();
        // 0: no blow ever reached the minimum
        assertThat(Evaluator.reasons(p, 5, 170, false, 0, 0)).containsExactly(Reason.TORQUE_LOW);
    }

    @Test
    void rehitOffWhenTheProgramSetsNone() {
        JointProgram none = new JointProgram("x", "", p.torque(), p.finalTorque(), p.blows(), p.rundown(), Double.NaN, 0);
        assertThat(Evaluator.reasons(none, 5, 200, false, 1, 0)).isEmpty();
    }

    @Test
    void cutAndFaultsAddTheirReasons() {
        assertThat(Evaluator.reasons(p, 5, 200, true, 3, 0)).containsExactly(Reason.TIME_LONG);
        assertThat(Evaluator.reasons(p, 5, 200, false, 3, 4)).containsExactly(Reason.SENSOR_FAULT);
    }

    @Test
    void finalTorqueFromFewerThanThreeBlows() {
        double[] ring = new double[3];
        // blows 1 and 2 land in slots 0 and 1
        ring[0] = 100;
        ring[1] = 150;
        assertThat(Evaluator.finalTorque(FinalTorque.MEAN_LAST_3, 2, 150, ring)).isEqualTo(125);
        assertThat(Evaluator.finalTorque(FinalTorque.LAST_PEAK, 2, 150, ring)).isEqualTo(150);
        assertThat(Evaluator.finalTorque(FinalTorque.MEAN_LAST_3, 1, 100, ring)).isEqualTo(100);
        assertThat(Evaluator.finalTorque(FinalTorque.MAX_PEAK, 0, 0, ring)).isZero();
    }

    @Test
    void finalTorqueWrapsTheRingOfTheLastThree() {
        // blows 1..5 with peaks 10, 20, 30, 40, 50: slots hold 40, 50, 30
        double[] ring = {40, 50, 30};
        assertThat(Evaluator.finalTorque(FinalTorque.LAST_PEAK, 5, 50, ring)).isEqualTo(50);
        assertThat(Evaluator.finalTorque(FinalTorque.MEAN_LAST_3, 5, 50, ring)).isEqualTo(40);
    }

    @Test
    void programKeysNameTheRules() {
        assertThat(FinalTorque.keys()).containsExactly("max_peak", "last_peak", "mean_last_3", "residual_estimate");
        assertThat(FinalTorque.ofKey("last_peak")).isEqualTo(FinalTorque.LAST_PEAK);
        assertThat(FinalTorque.MEAN_LAST_3.key()).isEqualTo("mean_last_3");
    }

    @Test
    void shutoffIsOptional() {
        assertThat(p.hasShutoff()).isTrue();
        assertThat(Programs.withoutShutoff(p).hasShutoff()).isFalse();
        assertThat(JointProgram.deadTimeMsFor(3000)).isEqualTo(10.0);
    }

    @Test
    void blowRateNeedsTwoBlows() {
        JointResult one = result(new long[] {1_000_000_000L});
        assertThat(one.blowRatePerMin()).isZero();
        assertThat(one.shutoffReached()).isFalse();
        // two peaks 30 ms apart: 2000 per minute
        assertThat(result(new long[] {0L, 30_000_000L}).blowRatePerMin()).isCloseTo(2000.0, org.assertj.core.api.Assertions.within(1e-9));
        assertThat(result(new long[] {5L, 5L}).blowRatePerMin()).isZero();
    }

    private JointResult result(long[] times) {
        return new JointResult(p, 0, 0, times.length, new double[times.length], times, new double[times.length],
                new double[times.length], 0, 0, Long.MIN_VALUE, 0, 0, Verdict.NO_GO, List.of(Reason.TORQUE_LOW));
    }
}
