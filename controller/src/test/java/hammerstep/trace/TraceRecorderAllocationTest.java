package hammerstep.trace;

import hammerstep.signal.Conditioner;
import hammerstep.signal.Conditioning;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.lang.management.ManagementFactory;
import java.nio.file.Path;

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

    @Test
    void keepingTheChainStateBeforeEveryBlockAllocatesNothing(@TempDir Path dir) throws Exception {
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        TraceKeeper keeper = new TraceKeeper(TraceRecorder.forSeconds(20_000, 2),
                new TraceStore(dir, 10, Long.MAX_VALUE, StoredTrace.Encoding.INT16), 50);
        Conditioner input = new Conditioner(new Conditioning(4, 5, 300, 1000, 0, 3000), 20_000);
        float[] block = new float[16];
        float[] out = new float[16];
        long tid = Thread.currentThread().getId();
        for (int k = 0; k < 2000; k++) {
            keeper.onBlock(block, 0, 16, k * 800_000L, input);
            input.process(block, 0, 16, out, true);
        }
        long before = threads.getThreadAllocatedBytes(tid);
        for (int k = 2000; k < 6000; k++) {
            keeper.onBlock(block, 0, 16, k * 800_000L, input);
            input.process(block, 0, 16, out, true);
            if (k % 500 == 0) {
                keeper.rundownStarted(k * 800_000L);
            }
        }
        long allocated = threads.getThreadAllocatedBytes(tid) - before;

        // 4000 blocks; one object per block would be at least 16 B × 4000
        assertThat(allocated).isLessThan(1024);
    }

    private static void feed(TraceRecorder r, float[] block, int pass) {
        for (int k = 0; k < 2000; k++) {
            r.onSamples(block, 0, block.length, (pass * 2000L + k) * 10_240_000L);
        }
    }
}
