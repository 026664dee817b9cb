package hammerstep.trace;

import org.junit.jupiter.api.Test;

import java.lang.management.ManagementFactory;

import static org.assertj.core.api.Assertions.assertThat;

/** Feeding the recorder (on the station's sample path) allocates nothing, counted with the JVM's per-thread counter. */
class TraceRecorderAllocationTest {

    @Test
    void recordingBlocksAllocatesNothing() {
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        TraceRecorder r = TraceRecorder.forSeconds(50_000, 2);
        float[] block = new float[512];
        for (int i = 0; i < block.length; i++) {
            block[i] = (float) Math.sin(i * 0.01);
        }
        long tid = Thread.currentThread().getId();
        feed(r, block, 0);
        long before = threads.getThreadAllocatedBytes(tid);
        feed(r, block, 1);
        long allocated = threads.getThreadAllocatedBytes(tid) - before;

        // 2000 blocks, ten times round the ring; one object per block would be 16 B × 2000
        assertThat(allocated).isLessThan(1024);
    }

    private static void feed(TraceRecorder r, float[] block, int pass) {
        for (int k = 0; k < 2000; k++) {
            r.onSamples(block, 0, block.length, (pass * 2000L + k) * 10_240_000L);
        }
    }
}
