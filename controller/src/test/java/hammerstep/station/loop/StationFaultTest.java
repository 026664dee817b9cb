package hammerstep.station.loop;

import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.StationEvent;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
import hammerstep.signal.Conditioning;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Faults of the torque signal and of the operator's inputs, injected into the whole station loop in
 * virtual time: a 500 N·m transducer conditioned as {@code hammerstep run} does it (zero within 2 %
 * of full scale, over-range at full scale, flat line after 500 ms), read with a little ADC noise, and
 * a synthetic tool whose blows climb while it is enabled. Every fault must end in NO-GO or a lockout
 * with its reason, never in a GO.
 */
class StationFaultTest {

    private static final double FULL_SCALE = 500;

    /** As RunCommand conditions a transducer of full scale {@code fs}. */
    private static final Conditioning RUN_CONDITIONING = new Conditioning(0.01 * FULL_SCALE, 0.02 * FULL_SCALE, 1000.0,
            FULL_SCALE, 500.0, 0.0);

    private final StationFixture station = new StationFixture();
    private final MemoryOutbox outbox = new MemoryOutbox();
    private final Random noise = new Random(42);

    @BeforeEach
    void healthySignal() {
        // what the fault does to the true torque on its way to the station (ADC noise when healthy)
        station.fault = x -> x + noise.nextGaussian() * 0.05;
    }

    private void start() {
        station.start(outbox, RUN_CONDITIONING);
        station.cycles(40); // 128 ms of healthy signal: the zero settles
    }

    /** The operator pulls the trigger for up to {@code maxCycles} and lets go. */
    private void tighten(int maxCycles) {
        station.pullTrigger();
        for (int k = 0; k < maxCycles && (station.tool.enabled || k < 5); k++) {
            station.cycle();
        }
        station.trigger = false;
        station.cycles(60);
    }

    private void assertNeverGo() {
        assertThat(station.errors).isEmpty();
        assertThat(station.joints).noneSatisfy(j -> assertThat(j.result().verdict()).isEqualTo(Verdict.GO));
        assertThat(station.parts).noneSatisfy(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(station.lamps.lit(TowerLamp.GREEN)).isFalse();
    }

    private void assertLockedOutFor(String faultName) {
        Sequence s = station.agent.sequence();
        assertThat(s.sensorLockout()).isNotZero();
        assertThat(station.tool.enabled).isFalse();
        assertThat(s.toolEnabled()).isFalse();
        assertThat(s.tower(TowerLamp.RED)).isEqualTo(hammerstep.station.LampMode.BLINKING);
        assertThat(station.events).anySatisfy(e -> {
            assertThat(e.code()).isEqualTo("SENSOR_FAULT");
            assertThat(e.severity()).isEqualTo(StationEvent.Severity.ALARM);
            assertThat(e.message()).contains(faultName);
        });
    }

    @Test
    void aHealthySignalStillGivesGo() {
        start();
        station.scanPart("SN-1");
        tighten(200);
        tighten(200);
        assertThat(station.joints).hasSize(2).allSatisfy(j -> assertThat(j.result().verdict()).isEqualTo(Verdict.GO));
        assertThat(station.parts).singleElement().satisfies(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(station.events).noneSatisfy(e -> assertThat(e.code()).isEqualTo("SENSOR_FAULT"));
    }

    @Test
    void aSignalSaturatingAtTheRailDuringARundownIsNoGoWithSensorFaultAndLocksTheTool() {
        start();
        station.scanPart("SN-2");
        station.fault = x -> Math.min(x * 12, FULL_SCALE); // amplifier gain fault: the first blow clips at the rail
        tighten(200);
        assertNeverGo();
        assertThat(station.joints).isNotEmpty().allSatisfy(j -> {
            assertThat(j.result().verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(j.result().reasons()).contains(Reason.SENSOR_FAULT);
        });
        assertLockedOutFor("OVER_RANGE");
    }

    @Test
    void anOpenWireReadingTheRailLocksTheToolBeforeAnyRundown() {
        start();
        station.scanPart("SN-3");
        station.fault = x -> FULL_SCALE + 12; // bridge burn-out current drives the input to the rail
        station.cycles(400);
        assertNeverGo();
        assertLockedOutFor("OVER_RANGE");
    }

    @Test
    void anOpenWireReadingAFlatLineLocksTheToolAndTheTriggerDoesNothing() {
        start();
        station.scanPart("SN-4");
        station.fault = x -> 0.0; // input floats to an exactly constant reading: no noise, no blows
        station.cycles(200); // 640 ms > 500 ms flat-line time
        assertLockedOutFor("FLAT_LINE");
        tighten(200);
        assertNeverGo();
        assertThat(station.joints).isEmpty();
        assertThat(station.tool.commands).endsWith(false);
    }

    @Test
    void aDeadChannelReadingNotANumberLocksTheTool() {
        start();
        station.scanPart("SN-5");
        station.fault = x -> Double.NaN;
        station.cycles(20);
        assertNeverGo();
        assertLockedOutFor("NOT_FINITE");
    }

    @Test
    void zeroDriftBeyondTheLimitLocksTheToolWhileIdle() {
        start();
        station.scanPart("SN-6");
        double[] offset = {0};
        station.fault = x -> x + (offset[0] += 15.0 / 60_000) + noise.nextGaussian() * 0.05; // 15 N·m over 3 s, limit 10
        station.cycles(1000);
        assertNeverGo();
        assertLockedOutFor("ZERO_DRIFT");
    }

    @Test
    void aNoiseBurstWhilePromptedNeverGivesGo() {
        for (long seed = 1; seed <= 20; seed++) {
            station.joints.clear();
            station.parts.clear();
            station.events.clear();
            Random burst = new Random(seed);
            double sigma = 30 + seed * 10; // 40 to 230 N·m rms: EMI from a welding line next door
            start();
            station.scanPart("SN-7-" + seed);
            long end = station.clock.nanoTime() + 300_000_000L;
            station.fault = x -> station.clock.nanoTime() - end < 0 ? x + burst.nextGaussian() * sigma : x + noise.nextGaussian() * 0.05;
            station.cycles(400);
            assertNeverGo();
            assertThat(station.agent.sequence().sensorLockout() != 0
                    || station.joints.stream().anyMatch(j -> j.result().verdict() == Verdict.NO_GO))
                    .as("seed %d: a lockout or a NO-GO joint", seed).isTrue();
        }
    }

    @Test
    void theLockoutHoldsWhileTheFaultStandsAndTheKeyReleasesItOnlyOnceTheSignalIsHealthy() {
        start();
        station.scanPart("SN-8");
        station.fault = x -> 0.0;
        station.cycles(200);
        assertLockedOutFor("FLAT_LINE");
        station.inputs.key = true;
        station.cycle();
        station.inputs.key = false;
        station.cycle();
        assertThat(station.agent.sequence().sensorLockout()).as("key while the fault stands").isNotZero();
        station.fault = x -> x + noise.nextGaussian() * 0.05;
        station.cycles(5);
        station.inputs.key = true;
        station.cycle();
        station.inputs.key = false;
        station.cycle();
        assertThat(station.agent.sequence().sensorLockout()).isZero();
        assertThat(station.events).anySatisfy(e -> assertThat(e.code()).isEqualTo("SENSOR_FAULT_CLEARED"));
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(station.tool.enabled).isTrue();
        tighten(200);
        tighten(200);
        assertThat(station.parts).singleElement().satisfies(p -> assertThat(p.verdict()).isEqualTo("GO"));
    }

    // ---- operator inputs ----------------------------------------------------------------------

    private void failFirstPosition() {
        failFirstPosition(Phase.REWORK);
    }

    private void failFirstPosition(Phase expected) {
        station.stepNm = 30; // too weak to reach the minimum before the operator lets go
        station.pullTrigger();
        station.cycles(20);
        station.trigger = false;
        station.cycles(60);
        station.stepNm = 45;
        assertThat(station.agent.sequence().phase()).isEqualTo(expected);
    }

    @Test
    void anAcknowledgeButtonStuckDownDoesNotReleaseTheNextRework() {
        start();
        station.scanPart("SN-9");
        station.inputs.ack = true; // stuck from before the NO-GO
        station.cycle();
        failFirstPosition();
        station.cycles(100);
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.REWORK);
        assertThat(station.tool.enabled).isFalse();
        assertNeverGo();
        station.inputs.ack = false; // freed and pressed again: a real press releases it
        station.cycle();
        station.inputs.ack = true;
        station.cycle();
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.PROMPT);
    }

    @Test
    void aBouncingAcknowledgeButtonReleasesOneReworkOnly() {
        start();
        station.scanPart("SN-10");
        failFirstPosition();
        for (int k = 0; k < 12; k++) { // contact bounce across cycles
            station.inputs.ack = k % 2 == 0;
            station.cycle();
        }
        station.inputs.ack = false;
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        failFirstPosition(Phase.REJECTED); // second attempt also NO-GO: the last one the pass allows
        for (int k = 0; k < 12; k++) {
            station.inputs.ack = k % 2 == 0;
            station.cycle();
        }
        station.inputs.ack = false;
        station.cycles(5);
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.REJECTED);
        assertThat(station.tool.enabled).isFalse();
        assertNeverGo();
    }

    @Test
    void aBouncingSupervisorKeyEndsARejectedPartOnceAndStartsNothing() {
        start();
        station.scanPart("SN-11");
        failFirstPosition();
        station.inputs.ack = true;
        station.cycle();
        station.inputs.ack = false;
        station.cycle();
        failFirstPosition(Phase.REJECTED);
        for (int k = 0; k < 12; k++) {
            station.inputs.key = k % 2 == 0;
            station.cycle();
        }
        station.inputs.key = false;
        station.cycles(5);
        assertThat(station.parts).singleElement().satisfies(p -> {
            assertThat(p.verdict()).isEqualTo("NO_GO");
            assertThat(p.ended()).isEqualTo("REJECTED");
        });
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.WAITING);
        assertThat(station.tool.enabled).isFalse();
    }

    @Test
    void thePartPresentSensorDroppingWhilePromptedAbandonsThePart() {
        station.inputs.partSensor = true;
        start();
        station.scanPart("SN-12");
        tighten(200);
        assertThat(station.joints).hasSize(1);
        station.inputs.present = false; // a glitch of 3 ms
        station.cycle();
        station.inputs.present = true;
        station.cycles(20);
        assertThat(station.parts).singleElement().satisfies(p -> {
            assertThat(p.verdict()).isEqualTo("NO_GO");
            assertThat(p.ended()).isEqualTo("ABANDONED");
            assertThat(p.jointIds()).hasSize(1);
        });
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.WAITING);
        assertThat(station.tool.enabled).isFalse();
        station.joints.clear();
        tighten(200); // the operator carries on: no position is prompted, nothing is judged GO
        assertNeverGo();
    }

    @Test
    void thePartPresentSensorDroppingDuringARundownStopsTheToolAndKeepsTheJoint() {
        station.inputs.partSensor = true;
        start();
        station.scanPart("SN-13");
        station.pullTrigger();
        station.cycles(8); // a few blows into the rundown
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.RUNDOWN);
        station.inputs.present = false;
        station.cycle();
        assertThat(station.tool.enabled).as("tool off once the part is gone").isFalse();
        station.cycles(5);
        station.trigger = false;
        station.inputs.present = true;
        station.cycles(80);
        assertThat(station.joints).as("the tightening that happened is recorded").singleElement()
                .satisfies(j -> assertThat(j.result().verdict()).isEqualTo(Verdict.NO_GO));
        assertThat(station.parts).singleElement().satisfies(p -> {
            assertThat(p.ended()).isEqualTo("ABANDONED");
            assertThat(p.jointIds()).hasSize(1);
        });
        assertNeverGo();
    }
}
