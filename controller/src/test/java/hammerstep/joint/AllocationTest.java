package hammerstep.joint;

import hammerstep.signal.PulseTrain;
import org.junit.jupiter.api.Test;

import java.lang.management.ManagementFactory;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The sample path allocates nothing per block: idle blocks, blocks inside a rundown, blows and
 * the shut-off crossing. (Only the end of a rundown allocates its one result.) Counted with the
 * JVM's per-thread allocation counter, so the test is about behaviour, not time.
 */
class AllocationTest {

    @Test
    void blocksAllocateNothingUntilARundownEnds() {
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        List<PulseTrain.Strike> strikes = new ArrayList<>();
        // 60 blows 30 ms apart that repeat seamlessly: one rundown that never goes quiet for end_after_ms
        for (int i = 0; i < 60; i++) {
            strikes.add(new PulseTrain.Strike(0.005 + i * 0.03, 0.002, 60 + 2.5 * i, 0.3, 0.3, 0.2));
        }
        float[] x = PulseTrain.render(50_000, 60 * 0.03, strikes, 0.3, 0.2, 5);
        JointProgram p = Programs.withMaxMs(Programs.hubFinal(), 60_000);
        int[] rundowns = new int[1];
        JointEvents events = result -> rundowns[0]++;
        JointMonitor m = new JointMonitor(p, JointMonitor.replayConditioning(p), 50_000, 512, events);
        long tid = Thread.currentThread().getId();
        // a first pass warms up class loading and the counters themselves
        feed(m, x, 0);
        long before = threads.getThreadAllocatedBytes(tid);
        for (int pass = 0; pass < 10; pass++) {
            feed(m, x, pass + 1);
        }
        long allocated = threads.getThreadAllocatedBytes(tid) - before;
        assertThat(rundowns[0]).isZero();
        assertThat(m.blowsSoFar()).isEqualTo(660);
        assertThat(m.inputStage().gapsDuringRundowns()).as("the passes follow each other without a gap").isZero();
        // one object per block would be at least 16 B × 1750 blocks; the counter itself and the JIT's
        // bookkeeping account for a few hundred bytes at most
        assertThat(allocated).as("bytes allocated over %d blocks", 10 * (x.length / 512)).isLessThan(1024);
    }

    @Test
    void aSharedStageFeedingTwoProgramsAndItsGapChecksAllocateNothing() {
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        float[] quiet = PulseTrain.render(50_000, 0.5, List.of(), 0.3, 0.2, 9);
        JointProgram p = Programs.hubFinal();
        JointProgram q = Programs.withMaxMs(Programs.hubFinal(), 9000);
        InputStage stage = new InputStage(JointMonitor.replayConditioning(p), 50_000, 512);
        int[] faults = new int[1];
        JointEvents events = new JointEvents() {
            @Override
            public void onFault(int f, long atNs) {
                faults[0] |= f;
            }

            @Override
            public void onRundown(JointResult result) {
            }
        };
        JointMonitor a = new JointMonitor(p, stage, events);
        JointMonitor b = new JointMonitor(q, stage, events);
        long tid = Thread.currentThread().getId();
        long ns = 0;
        long before = 0;
        for (int pass = 0; pass < 11; pass++) {
            if (pass == 1) {
                before = threads.getThreadAllocatedBytes(tid); // the first pass warms up
            }
            for (int off = 0; off + 512 <= quiet.length; off += 512) {
                JointMonitor m = (off / 512) % 2 == 0 ? a : b;
                if (off == 1024) {
                    stage.gap(); // announced by the ring
                }
                if (off == 2048) {
                    ns += 512 * 20_000L; // a block lost, seen in the stamps
                }
                m.onSamples(quiet, off, 512, ns);
                ns += 512 * 20_000L;
            }
        }
        long allocated = threads.getThreadAllocatedBytes(tid) - before;
        assertThat(stage.gapsOutsideRundowns()).isEqualTo(22);
        assertThat(faults[0]).isZero();
        assertThat(allocated).as("bytes allocated over %d blocks", 10 * (quiet.length / 512)).isLessThan(1024);
    }

    @org.junit.jupiter.params.ParameterizedTest(name = "mains {0} Hz named")
    @org.junit.jupiter.params.provider.ValueSource(doubles = {0, 50})
    void humLearningInTheIdleAllocatesNothing(double mainsHz) {
        // 2 s of idle with 8 N·m of 50 Hz hum: 20 learning windows, each ending with a table rebuild
        // (named) or a watcher's measurement (unnamed)
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        float[] x = new float[100_000];
        java.util.Random r = new java.util.Random(4);
        for (int i = 0; i < x.length; i++) {
            x[i] = (float) (8 * Math.sin(2 * Math.PI * 50 * i / 50_000.0) + 0.3 * r.nextGaussian());
        }
        JointProgram p = Programs.hubFinal();
        int[] rundowns = new int[1];
        JointMonitor m = new JointMonitor(p, JointMonitor.replayConditioning(p).withMains(mainsHz), 50_000, 512,
                result -> rundowns[0]++);
        long tid = Thread.currentThread().getId();
        feed(m, x, 0);
        long before = threads.getThreadAllocatedBytes(tid);
        for (int pass = 0; pass < 5; pass++) {
            feed(m, x, pass + 1);
        }
        long allocated = threads.getThreadAllocatedBytes(tid) - before;
        assertThat(allocated).as("bytes allocated over %d idle blocks", 5 * (x.length / 512)).isLessThan(1024);
    }

    /** One pass over {@code x}, in time after the passes before it (the blocks follow without a gap). */
    private static void feed(JointMonitor m, float[] x, int pass) {
        long passStart = (long) pass * (x.length / 512) * 512;
        for (int off = 0; off + 512 <= x.length; off += 512) {
            m.onSamples(x, off, 512, (passStart + off) * 20_000L);
        }
    }
}
