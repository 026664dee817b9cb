package hammerstep.station.loop;

import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.signal.Conditioning;
import hammerstep.signal.SignalFaults;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Gaps in the samples, in the whole station loop in virtual time: the station thread stalls while
 * the tool runs on, the sample ring fills and drops blocks. A gap during a rundown makes the joint
 * NO-GO with {@code SENSOR_FAULT} ({@code DATA_GAP}); before or between rundowns it is counted and
 * the joints are judged as usual.
 */
class StationDataGapTest {

    private static final double FULL_SCALE = 500;
    /** As RunCommand conditions a 500 N·m transducer. */
    private static final Conditioning RUN_CONDITIONING = new Conditioning(0.01 * FULL_SCALE, 0.02 * FULL_SCALE, 1000.0,
            FULL_SCALE, 500.0, 0.0);
    /** More blocks than the fixture's ring of 16 holds. */
    private static final int STALL_BLOCKS = 20;

    private final StationFixture station = new StationFixture();
    private final MemoryOutbox outbox = new MemoryOutbox();
    private final Random noise = new Random(7);

    @BeforeEach
    void start() {
        station.fault = x -> x + noise.nextGaussian() * 0.05;
        station.start(outbox, RUN_CONDITIONING);
        station.cycles(40);
        station.scanPart("SN-1");
    }

    /** Pulls the trigger until the tool is cut (at most 200 blocks), then lets go for 60 blocks. */
    private void tighten() {
        station.pullTrigger();
        for (int k = 0; k < 200 && (station.tool.enabled || k < 5); k++) {
            station.cycle();
        }
        station.trigger = false;
        station.cycles(60);
    }

    private void stallAndCatchUp() {
        station.stall(STALL_BLOCKS);
        station.cycles(10);
        assertThat(station.ring.droppedBlocks()).isPositive();
        assertThat(station.ring.waiting()).isZero();
    }

    private static boolean go(JointOutcome j) {
        return j.result().verdict() == Verdict.GO;
    }

    @Test
    void aBlockLostInMidRundownMakesTheJointASensorFaultNeverGo() {
        station.pullTrigger();
        station.cycles(8); // two blows in
        assertThat(station.agent.inRundown()).isTrue();
        station.stall(STALL_BLOCKS);
        for (int k = 0; k < 200 && station.tool.enabled; k++) {
            station.cycle();
        }
        station.trigger = false;
        station.cycles(60);

        assertThat(station.errors).isEmpty();
        assertThat(station.ring.droppedBlocks()).isPositive();
        assertThat(station.joints).singleElement().satisfies(j -> {
            assertThat(j.result().verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(j.result().reasons()).contains(Reason.SENSOR_FAULT);
            assertThat(j.result().faults() & SignalFaults.DATA_GAP).isNotZero();
        });
        assertThat(station.lamps.lit(TowerLamp.GREEN)).isFalse();
        assertThat(station.events).anySatisfy(e -> {
            assertThat(e.code()).isEqualTo("SENSOR_FAULT");
            assertThat(e.message()).contains("DATA_GAP");
        });
        assertThat(station.agent.inputStage().gapsDuringRundowns()).isEqualTo(1);
        assertThat(station.agent.inputStage().gapsOutsideRundowns()).isZero();
    }

    @Test
    void conversionsMissedInMidRundownMakeTheJointASensorFault() {
        station.pullTrigger();
        station.cycles(8);
        station.ring.lost(); // as the acquisition reports missed conversions
        for (int k = 0; k < 200 && station.tool.enabled; k++) {
            station.cycle();
        }
        station.trigger = false;
        station.cycles(60);

        assertThat(station.ring.droppedBlocks()).isZero();
        assertThat(station.joints).singleElement().satisfies(j -> {
            assertThat(j.result().verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(j.result().faults()).isEqualTo(SignalFaults.DATA_GAP);
        });
    }

    @Test
    void aBlockLostBeforeTheRundownIsCountedAndTheJointsAreGo() {
        stallAndCatchUp();
        tighten();
        tighten();

        assertThat(station.errors).isEmpty();
        assertThat(station.joints).hasSize(2).allMatch(StationDataGapTest::go);
        assertThat(station.parts).singleElement().satisfies(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(station.events).noneSatisfy(e -> assertThat(e.code()).isEqualTo("SENSOR_FAULT"));
        assertThat(station.agent.sequence().sensorLockout()).isZero();
        assertThat(station.agent.inputStage().gapsOutsideRundowns()).isEqualTo(1);
        assertThat(station.agent.inputStage().gapsDuringRundowns()).isZero();
    }

    @Test
    void aBlockLostBetweenRundownsIsCountedAndTheJointsAreGo() {
        tighten();
        assertThat(station.agent.inRundown()).isFalse();
        stallAndCatchUp();
        tighten();

        assertThat(station.joints).hasSize(2).allMatch(StationDataGapTest::go);
        assertThat(station.parts).singleElement().satisfies(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(station.events).noneSatisfy(e -> assertThat(e.code()).isEqualTo("SENSOR_FAULT"));
        assertThat(station.agent.inputStage().gapsOutsideRundowns()).isEqualTo(1);
        assertThat(station.agent.inputStage().gapsDuringRundowns()).isZero();
    }
}
