package hammerstep.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;

/**
 * {@link ChainBenchmark}'s chain timed by the thread's own CPU time rather than the wall clock: on a
 * machine shared with other work, wall-clock throughput mostly measures the others, while the
 * CPU time a thread was given to run the chain moves much less. Prints the best and the mean of
 * {@code repeats} runs of 200 000 blocks each, after five such runs of warm-up. Run two builds
 * alternately to compare them.
 *
 * <pre>
 * java -cp controller/target/benchmarks.jar hammerstep.bench.ChainCpuTime REJECT MAINS_HZ REPEATS
 * java -cp controller/target/benchmarks.jar hammerstep.bench.ChainCpuTime true 50 8
 * </pre>
 */
public final class ChainCpuTime {

    private static final int BLOCKS = 200_000;

    private ChainCpuTime() {
    }

    public static void main(String[] args) {
        if (args.length != 3) {
            System.err.println("usage: ChainCpuTime REJECT(true|false) MAINS_HZ(0|50|60) REPEATS");
            System.exit(2);
        }
        ChainBenchmark bench = new ChainBenchmark();
        bench.block = 512;
        bench.rejectImpulses = Boolean.parseBoolean(args[0]);
        bench.mainsHz = Double.parseDouble(args[1]);
        int repeats = Integer.parseInt(args[2]);
        bench.setUp();
        ThreadMXBean threads = ManagementFactory.getThreadMXBean();
        for (int w = 0; w < 5; w++) {
            run(bench);
        }
        double best = Double.MAX_VALUE;
        double sum = 0;
        for (int r = 0; r < repeats; r++) {
            long t0 = threads.getCurrentThreadCpuTime();
            run(bench);
            double ns = (threads.getCurrentThreadCpuTime() - t0) / (double) BLOCKS;
            best = Math.min(best, ns);
            sum += ns;
        }
        System.out.printf("rejection %s, mains %s Hz: best %.0f ns per block of %d (%.0f M samples/s), mean %.0f ns%n",
                bench.rejectImpulses ? "on" : "off", args[1], best, bench.block, bench.block * 1e3 / best,
                sum / repeats);
    }

    private static void run(ChainBenchmark bench) {
        for (int i = 0; i < BLOCKS; i++) {
            bench.chain();
        }
    }
}
