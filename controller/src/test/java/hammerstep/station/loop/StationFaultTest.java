package hammerstep.station.loop;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointProgram;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.results.StationId;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
import hammerstep.signal.Conditioning;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleRing;
import hammerstep.station.TowerLamp;
import hammerstep.station.VirtualClock;
import org.junit.jupiter.api.Test;

import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.atomic.AtomicLong;
import java.util.function.DoubleUnaryOperator;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Faults of the torque signal and of the operator's inputs, injected into the whole station loop in
 * virtual time: a 500 N·m transducer conditioned as {@code hammerstep run} does it (zero within 2 %
 * of full scale, over-range at full scale, flat line after 500 ms), read with a little ADC noise, and
 * a synthetic tool whose blows climb while it is enabled. Every fault must end in NO-GO or a lockout
 * with its reason, never in a GO.
 */
class StationFaultTest {

    private static final double RATE = 20_000;
    private static final int BLOCK = 64;
    private static final long BLOCK_NS = (long) (BLOCK * 1e9 / RATE);
    private static final double FULL_SCALE = 500;

    private static final JointProgram FINAL = new JointProgram("final", "", new JointProgram.Torque(180, 200, 230),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 2, 40, 7.5),
            new JointProgram.Rundown(10, 60, 4000), 200, 0);

    /** As RunCommand conditions a transducer of full scale {@code fs}. */
    private static final Conditioning STATION = new Conditioning(0.01 * FULL_SCALE, 0.02 * FULL_SCALE, 1000.0,
            FULL_SCALE, 500.0, 0.0);

    private final VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
    private final SampleRing ring = new SampleRing(RATE, BLOCK, 16);
    private final Fakes.RecordingLamps lamps = new Fakes.RecordingLamps(4);
    private final Fakes.RecordingTool tool = new Fakes.RecordingTool();
    private final Fakes.Inputs inputs = new Fakes.Inputs();
    private final Fakes.Scanner scanner = new Fakes.Scanner();
    private final AtomicLong ids = new AtomicLong();
    private final ResultSink sink = new OutboxResultSink(new MemoryOutbox(), new StationId("s", "l", "st"),
            () -> "id-" + ids.incrementAndGet(), Clock.fixed(Instant.EPOCH, ZoneOffset.UTC));
    private final List<JointOutcome> joints = new ArrayList<>();
    private final List<PartOutcome> parts = new ArrayList<>();
    private final List<StationEvent> events = new ArrayList<>();
    private final List<Throwable> errors = new ArrayList<>();
    private final Pattern pattern = new Pattern("p2", "", List.of("L", "R"), List.of(
            new Pattern.Pass("final", FINAL, Order.cross(2), 2, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
    private StationAgent agent;

    private final Random noise = new Random(42);
    private double stepNm = 45;
    private boolean trigger;
    private long blowStartNs = Long.MIN_VALUE;
    private long nextBlowNs;
    private int blowNo;
    private double blowPeak;
    /** What the fault does to the true torque on its way to the station (identity when healthy). */
    private DoubleUnaryOperator fault = x -> x + noise.nextGaussian() * 0.05;

    private void start() {
        agent = new StationAgent(clock, new StationPorts(ring, lamps, tool, inputs, scanner), sink,
                new Sequence(clock, new Sequence.Settings("TQ-1", null, 300), false), Map.of("M", pattern),
                STATION, 1_000_000_000L, new StationListener() {
                    @Override
                    public void onJoint(JointOutcome joint, ResultSink.Receipt receipt) {
                        joints.add(joint);
                    }

                    @Override
                    public void onPart(PartOutcome part, ResultSink.Receipt receipt) {
                        parts.add(part);
                    }

                    @Override
                    public void onEvent(StationEvent event, ResultSink.Receipt receipt) {
                        events.add(event);
                    }
                }, errors::add);
        for (int k = 0; k < 40; k++) { // 128 ms of healthy signal: the zero settles
            cycle();
        }
    }

    private void cycle() {
        long t0 = clock.nanoTime();
        float[] block = new float[BLOCK];
        for (int i = 0; i < BLOCK; i++) {
            long t = t0 + (long) (i * 1e9 / RATE);
            if (trigger && tool.enabled && t - nextBlowNs >= 0) {
                blowStartNs = t;
                blowNo++;
                blowPeak = stepNm * blowNo;
                nextBlowNs = t + 20_000_000L;
            }
            double dt = (t - blowStartNs) * 1e-9;
            double torque = dt >= 0 && dt < 0.002 ? blowPeak * Math.sin(Math.PI * dt / 0.002) : 0;
            block[i] = (float) fault.applyAsDouble(torque);
        }
        ring.offer(block, 0, BLOCK, t0);
        clock.advanceNs(BLOCK_NS);
        agent.doWork();
    }

    private void cycles(int n) {
        for (int k = 0; k < n; k++) {
            cycle();
        }
    }

    /** The operator pulls the trigger for up to {@code maxCycles} and lets go. */
    private void tighten(int maxCycles) {
        blowNo = 0;
        nextBlowNs = clock.nanoTime();
        trigger = true;
        for (int k = 0; k < maxCycles && (tool.enabled || k < 5); k++) {
            cycle();
        }
        trigger = false;
        cycles(60);
    }

    private void scanPart(String serial) {
        scanner.queue.add(new PartIdentity(serial, "M"));
        cycle();
    }

    private void assertNeverGo() {
        assertThat(errors).isEmpty();
        assertThat(joints).noneSatisfy(j -> assertThat(j.result().verdict()).isEqualTo(Verdict.GO));
        assertThat(parts).noneSatisfy(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(lamps.lit(TowerLamp.GREEN)).isFalse();
    }

    private void assertLockedOutFor(String faultName) {
        Sequence s = agent.sequence();
        assertThat(s.sensorLockout()).isNotZero();
        assertThat(tool.enabled).isFalse();
        assertThat(s.toolEnabled()).isFalse();
        assertThat(s.tower(TowerLamp.RED)).isEqualTo(hammerstep.station.LampMode.BLINKING);
        assertThat(events).anySatisfy(e -> {
            assertThat(e.code()).isEqualTo("SENSOR_FAULT");
            assertThat(e.severity()).isEqualTo(StationEvent.Severity.ALARM);
            assertThat(e.message()).contains(faultName);
        });
    }

    @Test
    void aHealthySignalStillGivesGo() {
        start();
        scanPart("SN-1");
        tighten(200);
        tighten(200);
        assertThat(joints).hasSize(2).allSatisfy(j -> assertThat(j.result().verdict()).isEqualTo(Verdict.GO));
        assertThat(parts).singleElement().satisfies(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(events).noneSatisfy(e -> assertThat(e.code()).isEqualTo("SENSOR_FAULT"));
    }

    @Test
    void aSignalSaturatingAtTheRailDuringARundownIsNoGoWithSensorFaultAndLocksTheTool() {
        start();
        scanPart("SN-2");
        fault = x -> Math.min(x * 12, FULL_SCALE); // amplifier gain fault: the first blow clips at the rail
        tighten(200);
        assertNeverGo();
        assertThat(joints).isNotEmpty().allSatisfy(j -> {
            assertThat(j.result().verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(j.result().reasons()).contains(Reason.SENSOR_FAULT);
        });
        assertLockedOutFor("OVER_RANGE");
    }

    @Test
    void anOpenWireReadingTheRailLocksTheToolBeforeAnyRundown() {
        start();
        scanPart("SN-3");
        fault = x -> FULL_SCALE + 12; // bridge burn-out current drives the input to the rail
        cycles(400);
        assertNeverGo();
        assertLockedOutFor("OVER_RANGE");
    }

    @Test
    void anOpenWireReadingAFlatLineLocksTheToolAndTheTriggerDoesNothing() {
        start();
        scanPart("SN-4");
        fault = x -> 0.0; // input floats to an exactly constant reading: no noise, no blows
        cycles(200); // 640 ms > 500 ms flat-line time
        assertLockedOutFor("FLAT_LINE");
        tighten(200);
        assertNeverGo();
        assertThat(joints).isEmpty();
        assertThat(tool.commands).endsWith(false);
    }

    @Test
    void aDeadChannelReadingNotANumberLocksTheTool() {
        start();
        scanPart("SN-5");
        fault = x -> Double.NaN;
        cycles(20);
        assertNeverGo();
        assertLockedOutFor("NOT_FINITE");
    }

    @Test
    void zeroDriftBeyondTheLimitLocksTheToolWhileIdle() {
        start();
        scanPart("SN-6");
        double[] offset = {0};
        fault = x -> x + (offset[0] += 15.0 / 60_000) + noise.nextGaussian() * 0.05; // 15 N·m over 3 s, limit 10
        cycles(1000);
        assertNeverGo();
        assertLockedOutFor("ZERO_DRIFT");
    }

    @Test
    void aNoiseBurstWhilePromptedNeverGivesGo() {
        for (long seed = 1; seed <= 20; seed++) {
            joints.clear();
            parts.clear();
            events.clear();
            Random burst = new Random(seed);
            double sigma = 30 + seed * 10; // 40 to 230 N·m rms: EMI from a welding line next door
            start();
            scanPart("SN-7-" + seed);
            long end = clock.nanoTime() + 300_000_000L;
            fault = x -> clock.nanoTime() - end < 0 ? x + burst.nextGaussian() * sigma : x + noise.nextGaussian() * 0.05;
            cycles(400);
            assertNeverGo();
            assertThat(agent.sequence().sensorLockout() != 0
                    || joints.stream().anyMatch(j -> j.result().verdict() == Verdict.NO_GO))
                    .as("seed %d: a lockout or a NO-GO joint", seed).isTrue();
        }
    }

    @Test
    void theLockoutHoldsWhileTheFaultStandsAndTheKeyReleasesItOnlyOnceTheSignalIsHealthy() {
        start();
        scanPart("SN-8");
        fault = x -> 0.0;
        cycles(200);
        assertLockedOutFor("FLAT_LINE");
        inputs.key = true;
        cycle();
        inputs.key = false;
        cycle();
        assertThat(agent.sequence().sensorLockout()).as("key while the fault stands").isNotZero();
        fault = x -> x + noise.nextGaussian() * 0.05;
        cycles(5);
        inputs.key = true;
        cycle();
        inputs.key = false;
        cycle();
        assertThat(agent.sequence().sensorLockout()).isZero();
        assertThat(events).anySatisfy(e -> assertThat(e.code()).isEqualTo("SENSOR_FAULT_CLEARED"));
        assertThat(agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(tool.enabled).isTrue();
        tighten(200);
        tighten(200);
        assertThat(parts).singleElement().satisfies(p -> assertThat(p.verdict()).isEqualTo("GO"));
    }

    // ---- operator inputs ----------------------------------------------------------------------

    private void failFirstPosition() {
        failFirstPosition(Phase.REWORK);
    }

    private void failFirstPosition(Phase expected) {
        stepNm = 30; // too weak to reach the minimum before the operator lets go
        blowNo = 0;
        nextBlowNs = clock.nanoTime();
        trigger = true;
        cycles(20);
        trigger = false;
        cycles(60);
        stepNm = 45;
        assertThat(agent.sequence().phase()).isEqualTo(expected);
    }

    @Test
    void anAcknowledgeButtonStuckDownDoesNotReleaseTheNextRework() {
        start();
        scanPart("SN-9");
        inputs.ack = true; // stuck from before the NO-GO
        cycle();
        failFirstPosition();
        cycles(100);
        assertThat(agent.sequence().phase()).isEqualTo(Phase.REWORK);
        assertThat(tool.enabled).isFalse();
        assertNeverGo();
        inputs.ack = false; // freed and pressed again: a real press releases it
        cycle();
        inputs.ack = true;
        cycle();
        assertThat(agent.sequence().phase()).isEqualTo(Phase.PROMPT);
    }

    @Test
    void aBouncingAcknowledgeButtonReleasesOneReworkOnly() {
        start();
        scanPart("SN-10");
        failFirstPosition();
        for (int k = 0; k < 12; k++) { // contact bounce across cycles
            inputs.ack = k % 2 == 0;
            cycle();
        }
        inputs.ack = false;
        assertThat(agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        failFirstPosition(Phase.REJECTED); // second attempt also NO-GO: the last one the pass allows
        for (int k = 0; k < 12; k++) {
            inputs.ack = k % 2 == 0;
            cycle();
        }
        inputs.ack = false;
        cycles(5);
        assertThat(agent.sequence().phase()).isEqualTo(Phase.REJECTED);
        assertThat(tool.enabled).isFalse();
        assertNeverGo();
    }

    @Test
    void aBouncingSupervisorKeyEndsARejectedPartOnceAndStartsNothing() {
        start();
        scanPart("SN-11");
        failFirstPosition();
        inputs.ack = true;
        cycle();
        inputs.ack = false;
        cycle();
        failFirstPosition(Phase.REJECTED);
        for (int k = 0; k < 12; k++) {
            inputs.key = k % 2 == 0;
            cycle();
        }
        inputs.key = false;
        cycles(5);
        assertThat(parts).singleElement().satisfies(p -> {
            assertThat(p.verdict()).isEqualTo("NO_GO");
            assertThat(p.ended()).isEqualTo("REJECTED");
        });
        assertThat(agent.sequence().phase()).isEqualTo(Phase.WAITING);
        assertThat(tool.enabled).isFalse();
    }

    @Test
    void thePartPresentSensorDroppingWhilePromptedAbandonsThePart() {
        inputs.partSensor = true;
        start();
        scanPart("SN-12");
        tighten(200);
        assertThat(joints).hasSize(1);
        inputs.present = false; // a glitch of 3 ms
        cycle();
        inputs.present = true;
        cycles(20);
        assertThat(parts).singleElement().satisfies(p -> {
            assertThat(p.verdict()).isEqualTo("NO_GO");
            assertThat(p.ended()).isEqualTo("ABANDONED");
            assertThat(p.jointIds()).hasSize(1);
        });
        assertThat(agent.sequence().phase()).isEqualTo(Phase.WAITING);
        assertThat(tool.enabled).isFalse();
        joints.clear();
        tighten(200); // the operator carries on: no position is prompted, nothing is judged GO
        assertNeverGo();
    }

    @Test
    void thePartPresentSensorDroppingDuringARundownStopsTheToolAndKeepsTheJoint() {
        inputs.partSensor = true;
        start();
        scanPart("SN-13");
        blowNo = 0;
        nextBlowNs = clock.nanoTime();
        trigger = true;
        cycles(8); // a few blows into the rundown
        assertThat(agent.sequence().phase()).isEqualTo(Phase.RUNDOWN);
        inputs.present = false;
        cycle();
        assertThat(tool.enabled).as("tool off once the part is gone").isFalse();
        cycles(5);
        trigger = false;
        inputs.present = true;
        cycles(80);
        assertThat(joints).as("the tightening that happened is recorded").singleElement()
                .satisfies(j -> assertThat(j.result().verdict()).isEqualTo(Verdict.NO_GO));
        assertThat(parts).singleElement().satisfies(p -> {
            assertThat(p.ended()).isEqualTo("ABANDONED");
            assertThat(p.jointIds()).hasSize(1);
        });
        assertNeverGo();
    }
}
