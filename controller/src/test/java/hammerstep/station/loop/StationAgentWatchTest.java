package hammerstep.station.loop;

import hammerstep.health.ToolHealth;
import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.results.StationId;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleRing;
import hammerstep.station.TowerLamp;
import hammerstep.station.VirtualClock;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceKeeper;
import hammerstep.trace.TraceRecorder;
import hammerstep.trace.TraceStore;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicLong;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The station loop with the engineer's watches attached: every joint's trace kept and named in its
 * result, and tool health raising TOOL_WEAK with the yellow lamp when the synthetic tool slows down.
 */
class StationAgentWatchTest {

    private static final double RATE = 20_000;
    private static final int BLOCK = 64;
    private static final long BLOCK_NS = (long) (BLOCK * 1e9 / RATE);

    private static final JointProgram FINAL = new JointProgram("final", "", new JointProgram.Torque(180, 200, 230),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 2, 40, 7.5),
            new JointProgram.Rundown(10, 60, 4000), 200, 0);

    @TempDir
    Path dir;

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
    private final List<StationEvent> events = new ArrayList<>();
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
                public void onEvent(StationEvent event, ResultSink.Receipt receipt) {
                    events.add(event);
                }
            }, errors::add);

    // synthetic tool: 2 ms half-sine blows every intervalNs, peak = 30 N·m × n while enabled
    private long intervalNs = 20_000_000L;
    private boolean trigger;
    private long blowStartNs = Long.MIN_VALUE;
    private long nextBlowNs;
    private int blowNo;

    private void cycle() {
        long t0 = clock.nanoTime();
        float[] block = new float[BLOCK];
        for (int i = 0; i < BLOCK; i++) {
            long t = t0 + (long) (i * 1e9 / RATE);
            if (trigger && tool.enabled && t - nextBlowNs >= 0) {
                blowStartNs = t;
                blowNo++;
                nextBlowNs = t + intervalNs;
            }
            double dt = (t - blowStartNs) * 1e-9;
            block[i] = dt >= 0 && dt < 0.002 ? (float) (30.0 * blowNo * Math.sin(Math.PI * dt / 0.002)) : 0f;
        }
        ring.offer(block, 0, BLOCK, t0);
        clock.advanceNs(BLOCK_NS);
        agent.doWork();
    }

    private void tightenPart(String serial) {
        scanner.queue.add(new PartIdentity(serial, "M"));
        cycle();
        for (int j = 0; j < 2; j++) {
            blowNo = 0;
            nextBlowNs = clock.nanoTime();
            trigger = true;
            for (int k = 0; k < 300 && tool.enabled; k++) {
                cycle();
            }
            trigger = false;
            for (int k = 0; k < 40; k++) {
                cycle();
            }
        }
        for (int k = 0; k < 200; k++) {
            cycle();
        }
    }

    @Test
    void keepsEveryJointsTraceAndRaisesToolWeakWithTheYellowLampWhenTheToolSlows() throws Exception {
        agent.keepTraces(new TraceKeeper(TraceRecorder.forSeconds(RATE, 2),
                new TraceStore(dir, 100, Long.MAX_VALUE, StoredTrace.Encoding.INT16), 20));
        agent.watchTool("AW-1", new ToolHealth(new ToolHealth.Settings(4, 3, 0.15, 3)));
        agent.doWork();

        for (int p = 0; p < 4; p++) {
            tightenPart("SN-" + p);
        }
        assertThat(events).isEmpty();
        assertThat(lamps.lit(TowerLamp.YELLOW)).isFalse();

        intervalNs = 26_000_000L; // 3000 → about 2300 blows/min: 23 % slower
        for (int p = 4; p < 7; p++) {
            tightenPart("SN-" + p);
        }

        assertThat(errors).isEmpty();
        assertThat(joints).hasSize(14).allSatisfy(j -> {
            assertThat(j.tracePath()).isNotNull();
            assertThat(Path.of(j.tracePath())).exists();
        });
        assertThat(StoredTrace.readHeader(Path.of(joints.get(0).tracePath())).metadata())
                .containsEntry("part_serial", "SN-0").containsEntry("program", "final");
        assertThat(events).singleElement().satisfies(e -> {
            assertThat(e.code()).isEqualTo("TOOL_WEAK");
            assertThat(e.severity()).isEqualTo(StationEvent.Severity.WARNING);
            assertThat(e.message()).contains("tool AW-1 on program final: blow rate fell");
        });
        assertThat(lamps.lit(TowerLamp.YELLOW)).isTrue();

        intervalNs = 20_000_000L;
        for (int p = 7; p < 10; p++) {
            tightenPart("SN-" + p);
        }
        assertThat(events).extracting(StationEvent::code).containsExactly("TOOL_WEAK", "TOOL_OK");
        assertThat(lamps.lit(TowerLamp.YELLOW)).isFalse();
    }
}
