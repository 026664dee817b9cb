package hammerstep.station.loop;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationId;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
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
import java.util.concurrent.atomic.AtomicLong;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The station loop in virtual time against a synthetic tool: half-sine blows whose peaks climb by a
 * fixed step while the tool is enabled; no blow starts once enable dropped.
 */
class StationAgentTest {

    private static final double RATE = 20_000;
    private static final int BLOCK = 64;
    private static final long BLOCK_NS = (long) (BLOCK * 1e9 / RATE);

    private static final JointProgram FINAL = new JointProgram("final", "", new JointProgram.Torque(180, 200, 230),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 2, 40, 7.5),
            new JointProgram.Rundown(10, 60, 4000), 200, 0);

    private final VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
    private final SampleRing ring = new SampleRing(RATE, BLOCK, 16);
    private final Fakes.RecordingLamps lamps = new Fakes.RecordingLamps(4);
    private final Fakes.RecordingTool tool = new Fakes.RecordingTool();
    private final Fakes.Inputs inputs = new Fakes.Inputs();
    private final Fakes.Scanner scanner = new Fakes.Scanner();
    private final AtomicLong ids = new AtomicLong();
    private final MemoryOutbox outbox = new MemoryOutbox();
    private final ResultSink sink = new OutboxResultSink(outbox, new StationId("s", "l", "st"),
            () -> "id-" + ids.incrementAndGet(), Clock.fixed(Instant.EPOCH, ZoneOffset.UTC));
    private final List<JointOutcome> joints = new ArrayList<>();
    private final List<PartOutcome> parts = new ArrayList<>();
    private final List<Throwable> errors = new ArrayList<>();
    private final Pattern pattern = new Pattern("p2", "", List.of("L", "R"), List.of(
            new Pattern.Pass("final", FINAL, Order.cross(2), 2, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
    private final StationAgent agent = new StationAgent(clock, new StationPorts(ring, lamps, tool, inputs, scanner),
            sink, new Sequence(clock, new Sequence.Settings("TQ-1", null, 300), false), Map.of("M", pattern),
            JointMonitor.replayConditioning(FINAL), 1_000_000_000L, new StationListener() {
                @Override
                public void onJoint(JointOutcome joint, ResultSink.Receipt receipt) {
                    joints.add(joint);
                }

                @Override
                public void onPart(PartOutcome part, ResultSink.Receipt receipt) {
                    parts.add(part);
                }
            }, errors::add);

    // synthetic tool: blow every 20 ms (3000/min), 2 ms half-sine, peak = step * n
    private double stepNm = 45;
    private boolean trigger;
    private long blowStartNs = Long.MIN_VALUE;
    private long nextBlowNs;
    private int blowNo;
    private double blowPeak;
    private long disabledAtNs = Long.MIN_VALUE;
    private int blowsStartedAfterDisable;

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
                if (disabledAtNs != Long.MIN_VALUE) {
                    blowsStartedAfterDisable++;
                }
            }
            double dt = (t - blowStartNs) * 1e-9;
            block[i] = dt >= 0 && dt < 0.002 ? (float) (blowPeak * Math.sin(Math.PI * dt / 0.002)) : 0f;
        }
        ring.offer(block, 0, BLOCK, t0);
        clock.advanceNs(BLOCK_NS);
        boolean was = tool.enabled;
        agent.doWork();
        if (was && !tool.enabled) {
            disabledAtNs = clock.nanoTime();
        }
    }

    private void tighten() {
        blowNo = 0;
        disabledAtNs = Long.MIN_VALUE;
        nextBlowNs = clock.nanoTime();
        trigger = true;
        for (int k = 0; k < 200 && tool.enabled; k++) {
            cycle();
        }
        trigger = false;
        for (int k = 0; k < 40; k++) {
            cycle();
        }
    }

    @Test
    void runsAPartToGoAndDropsTheToolWithinOneBlockOfTheCrossing() {
        agent.doWork();
        assertThat(lamps.lit(TowerLamp.WHITE)).isTrue();
        assertThat(tool.enabled).isFalse();
        scanner.queue.add(new PartIdentity("SN-100", "M"));
        cycle();
        assertThat(agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(tool.enabled).isTrue();
        assertThat(lamps.lit(TowerLamp.BLUE)).isTrue();
        tighten();
        tighten();
        assertThat(errors).isEmpty();
        assertThat(joints).hasSize(2).allSatisfy(j -> {
            assertThat(j.result().verdict()).isEqualTo(hammerstep.joint.Verdict.GO);
            assertThat(j.result().blowsAfterShutoff()).isZero();
            assertThat(j.result().finalTorqueNm()).isBetween(200.0, 230.0);
        });
        assertThat(blowsStartedAfterDisable).isZero();
        assertThat(agent.lastShutoffToRelayNs()).isBetween(0L, BLOCK_NS);
        assertThat(parts).singleElement().satisfies(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(lamps.lit(TowerLamp.GREEN)).isTrue();
        assertThat(tool.enabled).isFalse();
    }

    @Test
    void aWeakToolGoesToReworkAndTheButtonReleasesIt() {
        agent.doWork();
        stepNm = 30; // saturates below shut-off: the rundown times out at the operator's release
        scanner.queue.add(new PartIdentity("SN-101", "M"));
        cycle();
        blowNo = 0;
        nextBlowNs = clock.nanoTime();
        trigger = true;
        for (int k = 0; k < 20; k++) { // about 4 blows, peaks up to 120 N·m
            cycle();
        }
        trigger = false;
        for (int k = 0; k < 40; k++) {
            cycle();
        }
        assertThat(joints).singleElement().satisfies(j ->
                assertThat(j.result().verdict()).isEqualTo(hammerstep.joint.Verdict.NO_GO));
        assertThat(agent.sequence().phase()).isEqualTo(Phase.REWORK);
        assertThat(tool.enabled).isFalse();
        assertThat(lamps.lit(TowerLamp.RED)).isTrue();
        inputs.ack = true;
        cycle();
        inputs.ack = false;
        cycle();
        assertThat(agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(tool.enabled).isTrue();
        stepNm = 45;
        tighten();
        assertThat(joints).hasSize(2);
        assertThat(joints.get(1).attempt()).isEqualTo(2);
    }

    @Test
    void blinksAPromptedPositionLampFromTheClock() {
        scanner.queue.add(new PartIdentity("SN-102", "M"));
        agent.doWork();
        boolean first = lamps.positions[0];
        clock.advanceNs(500_000_000L);
        agent.doWork();
        assertThat(lamps.positions[0]).isNotEqualTo(first);
        assertThat(lamps.positions[1]).isFalse();
    }
}
