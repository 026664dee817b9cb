package hammerstep.station.loop;

import hammerstep.joint.JointMonitor;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.Outbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.sequence.Sequence;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleRing;
import hammerstep.station.VirtualClock;
import org.junit.jupiter.api.Test;

import java.io.File;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryMXBean;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static hammerstep.station.loop.StationFixture.BLOCK;
import static hammerstep.station.loop.StationFixture.BLOCK_NS;
import static hammerstep.station.loop.StationFixture.FINAL;
import static hammerstep.station.loop.StationFixture.ID;
import static hammerstep.station.loop.StationFixture.PATTERN;
import static hammerstep.station.loop.StationFixture.RATE;
import static org.assertj.core.api.Assertions.assertThat;

/**
 * Soak: 100 000 joints (50 000 parts of two positions) through the whole station loop in virtual
 * time, every result stored and marked delivered as the publisher would, in a JVM capped at
 * {@code -Xmx48m} (the failsafe execution {@code soak} of the controller's pom). Heap after a full
 * GC, live threads and open file handles are sampled every 10 000 joints and must stay flat.
 * Prints the figures. Run alone: {@code mvn -o -pl controller test-compile failsafe:integration-test@soak failsafe:verify@soak}.
 */
class HeapSoak {

    private static final int JOINTS = 100_000;
    private static final int SAMPLE_EVERY = 10_000;
    /** One 2 ms half-sine blow of unit peak at 20 kHz. */
    private static final float[] BLOW = new float[40];

    static {
        for (int i = 0; i < BLOW.length; i++) {
            BLOW[i] = (float) Math.sin(Math.PI * i / BLOW.length);
        }
    }

    private final VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
    private final SampleRing ring = new SampleRing(RATE, BLOCK, 16);
    private final Fakes.RecordingLamps lamps = new Fakes.RecordingLamps(4);
    private final Fakes.Relay tool = new Fakes.Relay();
    private final Fakes.Inputs inputs = new Fakes.Inputs();
    private final Fakes.Scanner scanner = new Fakes.Scanner();
    private final float[] block = new float[BLOCK];
    private long joints;
    private long goJoints;
    private long ids;

    private boolean trigger;
    private long sampleNo;
    private long blowAtSample = Long.MIN_VALUE;
    private long nextBlowSample;
    private int blowNo;

    @Test
    void heapThreadsAndFileHandlesStayFlatOver100000Joints() throws Exception {
        Outbox outbox = new MemoryOutbox();
        ResultSink sink = new OutboxResultSink(outbox, ID, () -> "id-" + (++ids),
                new VirtualClock(Instant.EPOCH));
        StationAgent agent = new StationAgent(clock, new StationPorts(ring, lamps, tool, inputs, scanner), sink,
                new Sequence(new Sequence.Settings("TQ-1", null, 1), false), Map.of("M", PATTERN),
                JointMonitor.replayConditioning(FINAL), 1_000_000_000L, new StationListener() {
                    @Override
                    public void onJoint(JointOutcome joint, ResultSink.Receipt receipt) {
                        joints++;
                        if (joint.result().verdict() == Verdict.GO) {
                            goJoints++;
                        }
                    }
                }, t -> { throw new AssertionError(t); });
        MemoryMXBean memory = ManagementFactory.getMemoryMXBean();
        List<long[]> figures = new ArrayList<>(); // joints, heap bytes, threads, fds
        long part = 0;
        long started = System.nanoTime();
        while (joints < JOINTS) {
            scanner.queue.add(new PartIdentity("SN-" + (++part), "M"));
            cycle(agent);
            for (int k = 0; k < 2; k++) {
                tighten(agent);
            }
            cycle(agent);
            cycle(agent);
            List<Outbox.Entry> pending;
            while (!(pending = outbox.pending(0, 256)).isEmpty()) {
                for (Outbox.Entry e : pending) {
                    outbox.markDelivered(e.position());
                }
            }
            if (joints % SAMPLE_EVERY == 0 && (figures.isEmpty() || figures.get(figures.size() - 1)[0] != joints)) {
                long[] f = sample(memory);
                f[0] = joints;
                figures.add(f);
            }
        }
        double seconds = (System.nanoTime() - started) * 1e-9;
        StringBuilder report = new StringBuilder("soak: ").append(joints).append(" joints (").append(goJoints)
                .append(" GO) in ").append(String.format("%.1f", seconds)).append(" s, max heap ")
                .append(Runtime.getRuntime().maxMemory() >> 20).append(" MB\n  joints  heap-after-gc-KB  threads  fds\n");
        for (long[] f : figures) {
            report.append(String.format("  %6d  %16d  %7d  %3d%n", f[0], f[1] >> 10, f[2], f[3]));
        }
        System.out.println(report);
        assertThat(Runtime.getRuntime().maxMemory()).as("run with -Xmx48m").isLessThanOrEqualTo(48L << 20);
        assertThat(goJoints).isEqualTo(joints);
        assertThat(outbox.backlog()).isZero();
        long[] first = figures.get(1); // after the JIT and the first allocations settled
        long[] last = figures.get(figures.size() - 1);
        assertThat(last[1] - first[1]).as("heap growth after GC, bytes\n" + report).isLessThan(1L << 20);
        assertThat(last[2]).as("threads").isEqualTo(first[2]);
        assertThat(last[3]).as("open files").isEqualTo(first[3]);
    }

    private static long[] sample(MemoryMXBean memory) {
        for (int i = 0; i < 3; i++) {
            System.gc();
        }
        File[] fds = new File("/proc/self/fd").listFiles();
        return new long[] {0, memory.getHeapMemoryUsage().getUsed(), Thread.activeCount(),
                fds == null ? -1 : fds.length};
    }

    private void tighten(StationAgent agent) throws ResultStoreException {
        long before = joints;
        blowNo = 0;
        nextBlowSample = sampleNo;
        trigger = true;
        for (int k = 0; k < 200 && tool.enabled; k++) {
            cycle(agent);
        }
        trigger = false;
        for (int k = 0; k < 40 && joints == before; k++) {
            cycle(agent);
        }
    }

    private void cycle(StationAgent agent) {
        for (int i = 0; i < BLOCK; i++) {
            long n = sampleNo + i;
            if (trigger && tool.enabled && n >= nextBlowSample) {
                blowAtSample = n;
                blowNo++;
                nextBlowSample = n + 400; // 20 ms: 3000 blows per minute
            }
            long d = n - blowAtSample;
            block[i] = d >= 0 && d < BLOW.length ? 45f * blowNo * BLOW[(int) d] : 0f;
        }
        ring.offer(block, 0, BLOCK, clock.nanoTime());
        sampleNo += BLOCK;
        clock.advanceNs(BLOCK_NS);
        agent.doWork();
    }
}
