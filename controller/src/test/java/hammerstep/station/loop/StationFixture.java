package hammerstep.station.loop;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.results.JointOutcome;
import hammerstep.results.JournalWriter;
import hammerstep.results.Outbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.results.StationId;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.signal.Conditioning;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleRing;
import hammerstep.station.VirtualClock;
import org.agrona.ErrorHandler;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicLong;
import java.util.function.DoubleUnaryOperator;

/**
 * The station loop on the test's thread in virtual time: the fake ports of {@link Fakes}, part
 * model {@code M} with the two-position {@link #PATTERN}, a result sink on the outbox the test
 * chooses, a {@link RecordingListener}, and a synthetic tool. The tool strikes a
 * 2 ms half-sine blow every {@link #intervalNs} while the trigger is held and the tool enabled; the
 * n-th blow of a pull peaks at {@link #stepNm} × n, and every sample passes through {@link #fault}
 * on its way to the ring. One {@link #cycle()} is one block of samples, then one {@code doWork()}.
 */
final class StationFixture {

    static final double RATE = 20_000;
    static final int BLOCK = 64;
    static final long BLOCK_NS = (long) (BLOCK * 1e9 / RATE);
    static final StationId ID = new StationId("s", "l", "st");
    /** Final torque 180 to 230 N·m, target 200. */
    static final JointProgram FINAL = new JointProgram("final", "", new JointProgram.Torque(180, 200, 230),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 2, 40, 7.5),
            new JointProgram.Rundown(10, 60, 4000), 200, 0);
    /** Positions L and R in cross order, one final pass, two attempts, the operator acknowledges a NO-GO. */
    static final Pattern PATTERN = new Pattern("p2", "", List.of("L", "R"), List.of(
            new Pattern.Pass("final", FINAL, Order.cross(2), 2, Acknowledge.OPERATOR, AfterNoGo.REJECT)));

    final VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
    final SampleRing ring = new SampleRing(RATE, BLOCK, 16);
    final Fakes.RecordingLamps lamps = new Fakes.RecordingLamps(4);
    final Fakes.RecordingTool tool = new Fakes.RecordingTool();
    final Fakes.Inputs inputs = new Fakes.Inputs();
    final Fakes.Scanner scanner = new Fakes.Scanner();
    final RecordingListener reports = new RecordingListener();
    final List<JointOutcome> joints = reports.joints;
    final List<PartOutcome> parts = reports.parts;
    final List<StationEvent> events = reports.events;
    final List<String> storeFailures = reports.storeFailures;
    final List<Throwable> errors = new ArrayList<>();
    /** A listener told of everything after {@link #reports} (set before {@code start}). */
    StationListener extra = StationListener.NONE;
    private final AtomicLong ids = new AtomicLong();
    StationAgent agent;
    /** The journal's writer when it runs apart from the station ({@link #startOnWriter}), else null. */
    JournalWriter writer;
    /** How long each forced write of the separate writer takes, in virtual time. */
    long writeStallNs;
    private long writeDoneAtNs;
    private boolean writing;

    // the synthetic tool
    double stepNm = 45;
    long intervalNs = 20_000_000L;
    DoubleUnaryOperator fault = DoubleUnaryOperator.identity();
    boolean trigger;
    int blowNo;
    long nextBlowNs;
    /** Blows started after the loop dropped the tool in this pull (only a fresh enable may start one). */
    int blowsStartedAfterDisable;
    private long blowStartNs = Long.MIN_VALUE;
    private double blowPeak;
    private long disabledAtNs = Long.MIN_VALUE;

    /** Builds the loop on {@code outbox}; errors the loop catches are collected in {@link #errors}. */
    StationAgent start(Outbox outbox, Conditioning conditioning) {
        return start(outbox, conditioning, errors::add);
    }

    StationAgent start(Outbox outbox, Conditioning conditioning, ErrorHandler errorHandler) {
        return start(outbox, conditioning, Map.of("M", PATTERN), errorHandler);
    }

    /** Builds the loop for part model → pattern {@code patterns}. */
    StationAgent start(Outbox outbox, Conditioning conditioning, Map<String, Pattern> patterns,
                       ErrorHandler errorHandler) {
        ResultSink sink = new OutboxResultSink(outbox, ID, () -> "id-" + ids.incrementAndGet(),
                new VirtualClock(Instant.EPOCH));
        agent = new StationAgent(clock, new StationPorts(ring, lamps, tool, inputs, scanner), sink,
                new Sequence(new Sequence.Settings("TQ-1", null, 300), false), patterns,
                conditioning, 1_000_000_000L, StationListener.both(reports, extra), errorHandler);
        return agent;
    }

    /**
     * Builds the loop on a {@link JournalWriter} of its own, as the service runs it, and steps that
     * writer as a thread whose every forced write takes {@code stallNs} of virtual time: the writer
     * takes up a waiting record, and its {@code doWork()} (the write and the answer) runs only once
     * {@code stallNs} has passed. The station goes on cycling meanwhile.
     */
    StationAgent startOnWriter(Outbox outbox, Conditioning conditioning, long stallNs) {
        ResultSink sink = new OutboxResultSink(outbox, ID, () -> "id-" + ids.incrementAndGet(),
                new VirtualClock(Instant.EPOCH));
        writer = new JournalWriter(sink, outbox, JournalWriter.DEFAULT_CAPACITY);
        writeStallNs = stallNs;
        agent = new StationAgent(clock, new StationPorts(ring, lamps, tool, inputs, scanner), writer,
                new Sequence(new Sequence.Settings("TQ-1", null, 300), false), Map.of("M", PATTERN),
                conditioning, 1_000_000_000L, reports, errors::add);
        return agent;
    }

    /** The separate writer's thread at the end of a block period: finishes a write that is due, takes up the next. */
    private void stepWriter() {
        long now = clock.nanoTime();
        if (writing) {
            if (now - writeDoneAtNs < 0) {
                return;
            }
            writer.doWork();
            writing = false;
        }
        if (writer.waiting() > 0) {
            writing = true;
            writeDoneAtNs = now + writeStallNs;
        }
    }

    /** As {@code hammerstep replay} conditions {@link #FINAL}. */
    static Conditioning replayConditioning() {
        return JointMonitor.replayConditioning(FINAL);
    }

    /** One block of the tool's samples into the ring, the clock one block on, one duty cycle of the loop. */
    void cycle() {
        produce();
        boolean was = tool.enabled;
        agent.doWork();
        if (writer != null) {
            stepWriter();
        }
        if (was && !tool.enabled) {
            disabledAtNs = clock.nanoTime();
        }
    }

    /**
     * The station thread stalls for {@code blocks} blocks: the tool runs on and its samples go to the
     * ring, which drops the blocks it has no room for.
     */
    void stall(int blocks) {
        for (int k = 0; k < blocks; k++) {
            produce();
        }
    }

    /** One block of the tool's samples into the ring (dropped there when it is full), the clock one block on. */
    private void produce() {
        long t0 = clock.nanoTime();
        float[] block = new float[BLOCK];
        for (int i = 0; i < BLOCK; i++) {
            long t = t0 + (long) (i * 1e9 / RATE);
            if (trigger && tool.enabled && t - nextBlowNs >= 0) {
                blowStartNs = t;
                blowNo++;
                blowPeak = stepNm * blowNo;
                nextBlowNs = t + intervalNs;
                if (disabledAtNs != Long.MIN_VALUE) {
                    blowsStartedAfterDisable++;
                }
            }
            double dt = (t - blowStartNs) * 1e-9;
            double torque = dt >= 0 && dt < 0.002 ? blowPeak * Math.sin(Math.PI * dt / 0.002) : 0;
            block[i] = (float) fault.applyAsDouble(torque);
        }
        ring.offer(block, 0, BLOCK, t0);
        clock.advanceNs(BLOCK_NS);
    }

    void cycles(int n) {
        for (int k = 0; k < n; k++) {
            cycle();
        }
    }

    /** The operator pulls the trigger: the blow count starts again and the first blow comes at once. */
    void pullTrigger() {
        blowNo = 0;
        disabledAtNs = Long.MIN_VALUE;
        nextBlowNs = clock.nanoTime();
        trigger = true;
    }

    /** Holds the trigger while the tool is enabled, for at most {@code maxCycles}, then lets go for {@code afterCycles}. */
    void tighten(int maxCycles, int afterCycles) {
        pullTrigger();
        for (int k = 0; k < maxCycles && tool.enabled; k++) {
            cycle();
        }
        trigger = false;
        cycles(afterCycles);
    }

    void tighten() {
        tighten(200, 40);
    }

    /** The part's serial is scanned and the loop sees it. */
    void scanPart(String serial) {
        scanner.queue.add(new PartIdentity(serial, "M"));
        cycle();
    }
}
