package hammerstep.station.loop;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.signal.Conditioning;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * The station's monitors, one per program, all on the transducer's one input stage: a part with a
 * snug pass and a final pass, the offset drifting by 8 N·m between parts while the snug program
 * watches, gives every joint exactly what one continuous chain over the same samples gives.
 */
class StationInputStageTest {

    private static final double FULL_SCALE = 500;
    /** As RunCommand conditions a 500 N·m transducer: the zero may absorb 10 N·m. */
    private static final Conditioning RUN_CONDITIONING = new Conditioning(0.01 * FULL_SCALE, 0.02 * FULL_SCALE, 1000.0,
            FULL_SCALE, 500.0, 0.0);
    /** Snug: shut off at 80 N·m (the synthetic tool's second blow, 90 N·m), 60 to 100 N·m. */
    private static final JointProgram SNUG = new JointProgram("snug", "", new JointProgram.Torque(60, 80, 100),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 1, 40, 7.5),
            new JointProgram.Rundown(10, 60, 4000), 80, 0);
    private static final Pattern TWO_PASSES = new Pattern("p2x2", "", List.of("L", "R"), List.of(
            new Pattern.Pass("snug", SNUG, Order.cross(2), 2, Acknowledge.OPERATOR, AfterNoGo.REJECT),
            new Pattern.Pass("final", StationFixture.FINAL, Order.cross(2), 2, Acknowledge.OPERATOR,
                    AfterNoGo.REJECT)));

    private final StationFixture station = new StationFixture();
    private final Random noise = new Random(11);
    private float[] seen = new float[1 << 16];
    private int seenCount;
    private double offsetNm;

    private void tightenPart(String serial) {
        station.scanPart(serial);
        for (int k = 0; k < 4; k++) {
            station.tighten(300, 40);
        }
        station.cycles(120);
    }

    @Test
    void everyJointOfBothPassesIsWhatOneContinuousChainGivesAfterADrift() {
        // what reaches the ring: torque plus the transducer's offset and a little noise, kept in order
        station.fault = x -> {
            float v = (float) (x + offsetNm + noise.nextGaussian() * 0.05);
            if (seenCount == seen.length) {
                seen = Arrays.copyOf(seen, 2 * seen.length);
            }
            seen[seenCount++] = v;
            return v;
        };
        long t0 = station.clock.nanoTime();
        station.start(new MemoryOutbox(), RUN_CONDITIONING, Map.of("M", TWO_PASSES), station.errors::add);
        station.cycles(40);
        tightenPart("SN-1");
        for (int k = 0; k < 2000; k++) { // 6.4 s while the snug program watches: the offset drifts to 8 N·m
            offsetNm = 8.0 * Math.min(1.0, k / 1500.0);
            station.cycle();
        }
        tightenPart("SN-2");

        assertThat(station.errors).isEmpty();
        assertThat(station.joints).hasSize(8);
        assertThat(station.joints).extracting(j -> j.result().program().id())
                .containsExactly("snug", "snug", "final", "final", "snug", "snug", "final", "final");
        assertThat(station.joints).allSatisfy(j -> assertThat(j.result().verdict()).isEqualTo(Verdict.GO));
        assertThat(station.agent.inputStage().conditioner().zeroNm()).isCloseTo(8.0, within(0.5));

        // one chain of the final program over the same samples: the same segmentation (both programs
        // start, end and count blows alike), so the same rundowns with the same peaks
        List<JointResult> one = new ArrayList<>();
        JointMonitor chain = new JointMonitor(StationFixture.FINAL, RUN_CONDITIONING, StationFixture.RATE,
                StationFixture.BLOCK, one::add);
        for (int off = 0; off + StationFixture.BLOCK <= seenCount; off += StationFixture.BLOCK) {
            chain.onSamples(seen, off, StationFixture.BLOCK, t0 + (off / StationFixture.BLOCK) * StationFixture.BLOCK_NS);
        }
        assertThat(one).hasSize(8);
        for (int i = 0; i < 8; i++) {
            JointOutcome j = station.joints.get(i);
            JointResult r = one.get(i);
            assertThat(j.result().peaksNm()).as("peaks of joint %d", i).containsExactly(r.peaksNm());
            assertThat(j.result().peakTimesNs()).as("peak times of joint %d", i).containsExactly(r.peakTimesNs());
            assertThat(j.result().startNs()).isEqualTo(r.startNs());
            assertThat(j.result().faults()).isZero();
        }
        assertThat(station.agent.inputStage().gapsOutsideRundowns()).isZero();
    }
}
