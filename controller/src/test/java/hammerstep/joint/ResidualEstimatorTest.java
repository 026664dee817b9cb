package hammerstep.joint;

import hammerstep.signal.BlowForms;
import hammerstep.signal.SignalFaults;
import org.junit.jupiter.api.Test;

import java.time.LocalDate;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class ResidualEstimatorTest {

    private static final double RATE = 50_000;
    /** Blows 27 ms apart (about 2200 per minute). */
    private static final int EVERY = 1350;

    /** Each blow at the start of its own 27 ms slot, light noise on top; quiet at both ends. */
    static float[] rundown(float[]... blows) {
        float[] x = new float[(blows.length + 12) * EVERY];
        int at = 2 * EVERY;
        for (float[] b : blows) {
            System.arraycopy(b, 0, x, at, b.length);
            at += EVERY;
        }
        Random r = new Random(7);
        for (int i = 0; i < x.length; i++) {
            x[i] += (float) (0.2 * r.nextGaussian());
        }
        return x;
    }

    static JointProgram program(boolean leftHand, ResidualCalibration calibration) {
        JointProgram p = Programs.withoutShutoff(Programs.hubFinal());
        return new JointProgram(p.id(), p.revision(), new JointProgram.Torque(150, 220, 300), p.finalTorque(),
                new JointProgram.Blows(40, 20, 1, 30, 7.5), p.rundown(), Double.NaN, 0, leftHand, calibration);
    }

    static JointResult judge(JointProgram p, float[] x, int block) {
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(p, JointMonitor.replayConditioning(p), RATE, block, ev);
        for (int off = 0; off < x.length; off += block) {
            m.onSamples(x, off, Math.min(block, x.length - off), (long) (off * 1e9 / RATE));
        }
        m.finish();
        assertThat(ev.results).hasSize(1);
        return ev.results.get(0);
    }

    /** Turning blows against friction torques {@code frictionNm}, each breaking away 20 % above it. */
    static float[][] turning(double... frictionNm) {
        float[][] b = new float[frictionNm.length][];
        for (int i = 0; i < b.length; i++) {
            b[i] = BlowForms.turning(1.2 * frictionNm[i], frictionNm[i], 12, 40, 15, 0);
        }
        return b;
    }

    static float[][] append(float[][] a, float[]... more) {
        float[][] all = new float[a.length + more.length][];
        System.arraycopy(a, 0, all, 0, a.length);
        System.arraycopy(more, 0, all, a.length, more.length);
        return all;
    }

    @Test
    void theEstimateIsTheFactorTimesTheSlideTorqueOfTheLastThreeTurningBlows() {
        // six blows turn the nut against a friction torque rising to 200 N·m, then two press on it elastically
        float[][] blows = append(turning(150, 160, 170, 190, 195, 200),
                BlowForms.elastic(230, 60, 0), BlowForms.elastic(235, 60, 0));
        JointResult r = judge(program(false, null), rundown(blows), 512);
        ResidualEstimate e = r.residual();
        assertThat(r.blows()).isEqualTo(8);
        assertThat(e.present()).isTrue();
        assertThat(e.turningBlows()).isEqualTo(6);
        assertThat(e.blowsUsed()).isEqualTo(3);
        // the slides of the last three turning blows run at 190, 195 and 200 N·m: 195 on average (within 2 %)
        assertThat(e.slipNm()).isCloseTo(195, within(3.9));
        assertThat(e.torqueNm()).isEqualTo(ResidualEstimator.DEFAULT_FACTOR * e.slipNm());
        assertThat(e.uncalibratedNm()).isEqualTo(e.torqueNm());
        assertThat(e.lowNm()).isCloseTo(e.torqueNm() * (1 - ResidualEstimator.DEFAULT_BAND), within(1e-9));
        assertThat(e.highNm()).isCloseTo(e.torqueNm() * (1 + ResidualEstimator.DEFAULT_BAND), within(1e-9));
        assertThat(e.calibrated()).isFalse();
        // the peak-based figure stays what it was: the highest peak
        assertThat(r.finalTorqueNm()).isCloseTo(240, within(1.0));
    }

    @Test
    void blocksOfAnyLengthGiveTheSameEstimate() {
        float[] x = rundown(turning(150, 170, 190, 200));
        // the replay conditioning's zero follows whole quiet blocks, so the conditioned samples differ by
        // a fraction of a newton-metre with the block length; the lobes are read alike across block edges
        JointResult whole = judge(program(false, null), x, 4096);
        for (int block : new int[] {7, 1000}) {
            JointResult r = judge(program(false, null), x, block);
            assertThat(r.residual().torqueNm()).as("block %d", block).isCloseTo(whole.residual().torqueNm(), within(0.5));
        }
    }

    @Test
    void halfSinesOnAStuckNutGiveNoEstimateAndSaySo() {
        float[] x = rundown(BlowForms.elastic(200, 60, 0), BlowForms.elastic(220, 60, 0), BlowForms.elastic(230, 60, 0));
        ResidualEstimate e = judge(program(false, null), x, 512).residual();
        assertThat(e.present()).isFalse();
        assertThat(e.reason()).isEqualTo(ResidualEstimate.Reason.NO_TURNING_BLOW);
        assertThat(e.torqueNm()).isNaN();
        assertThat(e.turningBlows()).isZero();
    }

    @Test
    void aStrikeSnappingBackIntoTheFloorIsNoSlideAndGivesNoEstimate() {
        // a 400 N·m strike halving every sample down to the floor, then a light elastic press: no flat run
        // and no knee anywhere, so no value, rather than the snap-back's mean read as a running torque
        // (before the rule it gave a value: 1.12 times a "slide" of about 240 N·m)
        float[] x = rundown(BlowForms.snapBack(400, 8, 0.5, 0), BlowForms.elastic(60, 60, 0));
        ResidualEstimate e = judge(program(false, null), x, 512).residual();
        assertThat(e.present()).isFalse();
        assertThat(e.reason()).isEqualTo(ResidualEstimate.Reason.NO_TURNING_BLOW);
        assertThat(e.turningBlows()).isZero();
    }

    @Test
    void hydraulicPulsesGiveNoEstimateEvenAfterATurningBlow() {
        float[][] blows = append(turning(180), BlowForms.hydraulic(200, 30, 15, 0), BlowForms.hydraulic(205, 30, 15, 0),
                BlowForms.hydraulic(210, 30, 15, 0));
        ResidualEstimate e = judge(program(false, null), rundown(blows), 512).residual();
        assertThat(e.reason()).isEqualTo(ResidualEstimate.Reason.HYDRAULIC_PULSES);
        assertThat(e.turningBlows()).isEqualTo(1);
    }

    @Test
    void aProgramsCalibrationFromAuditsIsAppliedToTheEstimateWithItsBand() {
        ResidualCalibration cal = new ResidualCalibration(0.95, 6.0, 4.5, 5, LocalDate.of(2026, 12, 3));
        float[] x = rundown(turning(170, 185, 200));
        ResidualEstimate plain = judge(program(false, null), x, 512).residual();
        ResidualEstimate e = judge(program(false, cal), x, 512).residual();
        assertThat(e.calibrated()).isTrue();
        assertThat(e.uncalibratedNm()).isEqualTo(plain.torqueNm());
        assertThat(e.torqueNm()).isCloseTo(0.95 * plain.torqueNm() + 6.0, within(1e-9));
        assertThat(e.lowNm()).isCloseTo(e.torqueNm() - 4.5, within(1e-9));
        assertThat(e.highNm()).isCloseTo(e.torqueNm() + 4.5, within(1e-9));
    }

    @Test
    void aLeftHandJointGivesTheSameEstimateFromItsNegativeSignal() {
        float[] x = rundown(turning(170, 185, 200));
        double right = judge(program(false, null), x, 512).residual().torqueNm();
        double left = judge(program(true, null), BlowForms.negated(x), 512).residual().torqueNm();
        assertThat(left).isCloseTo(right, within(1e-6 * right));
    }

    @Test
    void aSensorFaultLeavesNoEstimate() {
        ResidualEstimator estimator = new ResidualEstimator();
        ResidualEstimate e = estimator.estimate(SignalFaults.OVER_RANGE, null);
        assertThat(e.reason()).isEqualTo(ResidualEstimate.Reason.SENSOR_FAULT);
        assertThat(e.present()).isFalse();
    }

    @Test
    void aLooseningCarriesNoEstimate() {
        float[] x = BlowForms.negated(rundown(turning(170, 185, 200)));
        JointResult r = judge(program(false, null), x, 512);
        assertThat(r.loosening()).isTrue();
        assertThat(r.residual()).isNull();
    }
}
