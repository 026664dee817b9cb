package hammerstep.joint;

import hammerstep.signal.Conditioning;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * Replay of a long trace on several cores, with results identical to one {@link JointMonitor}
 * reading the trace from start to end.
 *
 * <p>The trace is cut into one segment per worker at block boundaries. Each worker but the first
 * starts {@code primeS} seconds before its segment with a fresh monitor, so that its zero and
 * filter settle on the same signal; each worker but the last runs {@code handoverS} seconds past
 * its segment's end. In that overlap both workers note their {@link JointMonitor#idleState()} at
 * every block boundary. At the first boundary where both are idle with equal states, the later
 * worker is from then on in exactly the state the single monitor would be in, and its results
 * replace the earlier worker's. Where no boundary in the overlap qualifies (a trace with hardly a
 * quiet moment), the earlier worker simply carries on alone to the end, which is the single
 * monitor itself: the split can cost time but never change a result.
 */
public final class SplitReplay {

    /** Random access to a trace's samples, safe to call from several threads at once. */
    @FunctionalInterface
    public interface Samples {
        /** Copies samples {@code [from, from+length)} into {@code into[0, length)}. */
        void read(long from, float[] into, int length);
    }

    /** What a replay produced: the results in time order and how the segments were joined. */
    public record Outcome(List<JointResult> results, int workers, int handovers, int fallbacks) {
    }

    /** Priming before a segment: the zero tracker's time constant is 1 s, so 40 s leave e⁻⁴⁰ of any start-up gap. */
    public static final double PRIME_S = 40.0;
    /** Overlap after a segment in which a handover boundary is looked for. */
    public static final double HANDOVER_S = 20.0;

    private final JointProgram program;
    private final Conditioning conditioning;
    private final double rateHz;
    private final int block;
    private final long primeSamples;
    private final long handoverSamples;

    public SplitReplay(JointProgram program, Conditioning conditioning, double rateHz, int block) {
        this(program, conditioning, rateHz, block, PRIME_S, HANDOVER_S);
    }

    SplitReplay(JointProgram program, Conditioning conditioning, double rateHz, int block, double primeS,
                double handoverS) {
        this.program = Objects.requireNonNull(program);
        this.conditioning = Objects.requireNonNull(conditioning);
        this.rateHz = rateHz;
        this.block = block;
        this.primeSamples = roundUpToBlock((long) Math.ceil(primeS * rateHz));
        this.handoverSamples = roundUpToBlock((long) Math.ceil(handoverS * rateHz));
    }

    /**
     * The number of workers worth starting for {@code samples} on {@code cores}: each segment must be
     * several times longer than the overlap it carries, else one monitor alone is as fast.
     */
    public int workersFor(long samples, int cores) {
        long overlap = primeSamples + handoverSamples;
        long n = samples / (4 * overlap);
        return (int) Math.max(1, Math.min(cores, n));
    }

    /** Replays {@code samples} samples of {@code source} on {@code workers} threads. */
    public Outcome run(Samples source, long samples, int workers) throws InterruptedException {
        if (workers <= 1) {
            Worker only = new Worker(source, 0, samples, 0, 0, 0);
            only.run();
            only.monitor.finish();
            return new Outcome(only.results, 1, 0, 0);
        }
        long[] cut = new long[workers + 1];
        for (int w = 1; w < workers; w++) {
            cut[w] = roundDownToBlock(samples * w / workers);
        }
        cut[workers] = samples;
        List<Worker> crew = new ArrayList<>(workers);
        for (int w = 0; w < workers; w++) {
            long from = w == 0 ? 0 : Math.max(cut[w - 1], cut[w] - primeSamples);
            long to = w == workers - 1 ? samples : Math.min(samples, cut[w + 1] + handoverSamples);
            crew.add(new Worker(source, from, to, cut[w], w == 0 ? 0 : Math.min(handoverSamples, to - cut[w]),
                    w == workers - 1 ? -1 : cut[w + 1]));
        }
        runAll(crew);
        return join(crew, samples);
    }

    private Outcome join(List<Worker> crew, long samples) {
        List<JointResult> results = new ArrayList<>();
        int handovers = 0;
        Worker current = crew.get(0);
        int firstResult = 0;
        for (int w = 1; w < crew.size(); w++) {
            Worker next = crew.get(w);
            int at = handover(current, next);
            if (at < 0) {
                current.continueTo(samples);
                current.monitor.finish();
                results.addAll(current.results.subList(firstResult, current.results.size()));
                return new Outcome(results, crew.size(), handovers, 1);
            }
            results.addAll(current.results.subList(firstResult, current.outCounts[at]));
            firstResult = next.inCounts[at];
            current = next;
            handovers++;
        }
        current.monitor.finish();
        results.addAll(current.results.subList(firstResult, current.results.size()));
        return new Outcome(results, crew.size(), handovers, 0);
    }

    /** The first overlap boundary (index) where both workers are idle in equal states, or -1. */
    private static int handover(Worker earlier, Worker later) {
        for (int k = 0; k < earlier.outStates.length && k < later.inStates.length; k++) {
            JointMonitor.IdleState a = earlier.outStates[k];
            if (a != null && a.equals(later.inStates[k])) {
                return k;
            }
        }
        return -1;
    }

    private static void runAll(List<Worker> crew) throws InterruptedException {
        ExecutorService pool = Executors.newFixedThreadPool(crew.size() - 1, r -> {
            Thread t = new Thread(r, "replay-segment");
            t.setDaemon(true);
            return t;
        });
        try {
            List<Future<?>> running = new ArrayList<>();
            for (Worker w : crew.subList(1, crew.size())) {
                running.add(pool.submit(w));
            }
            crew.get(0).run();
            for (Future<?> f : running) {
                try {
                    f.get();
                } catch (ExecutionException e) {
                    Throwable cause = e.getCause();
                    if (cause instanceof RuntimeException re) {
                        throw re;
                    }
                    throw new IllegalStateException(cause);
                }
            }
        } finally {
            pool.shutdownNow();
        }
    }

    private long roundUpToBlock(long n) {
        return (n + block - 1) / block * block;
    }

    private long roundDownToBlock(long n) {
        return n / block * block;
    }

    /** One monitor over {@code [from, to)}, noting its idle states in its incoming and outgoing overlaps. */
    private final class Worker implements Runnable {
        final Samples source;
        final JointMonitor monitor;
        final List<JointResult> results = new ArrayList<>();
        final float[] samples = new float[block];
        final double periodNs = 1e9 / rateHz;
        final long from;
        final long to;
        final long inFrom;
        final JointMonitor.IdleState[] inStates;
        final int[] inCounts;
        final long outFrom;
        final JointMonitor.IdleState[] outStates;
        final int[] outCounts;

        /**
         * @param inFrom  first boundary of the incoming overlap, {@code inLength} samples long
         * @param outFrom first boundary of the outgoing overlap, or -1 for the last worker
         */
        Worker(Samples source, long from, long to, long inFrom, long inLength, long outFrom) {
            this.source = source;
            this.monitor = new JointMonitor(program, conditioning, rateHz, block, results::add);
            this.from = from;
            this.to = to;
            this.inFrom = inFrom;
            this.inStates = new JointMonitor.IdleState[(int) (inLength / block)];
            this.inCounts = new int[inStates.length];
            this.outFrom = outFrom;
            int outBlocks = outFrom < 0 ? 0 : (int) ((to - outFrom) / block);
            this.outStates = new JointMonitor.IdleState[outBlocks];
            this.outCounts = new int[outBlocks];
        }

        @Override
        public void run() {
            feed(from, to, true);
        }

        /** Goes on alone from where {@link #run()} stopped to {@code end}. */
        void continueTo(long end) {
            feed(to, end, false);
        }

        private void feed(long start, long end, boolean noting) {
            for (long s = start; s < end; s += block) {
                if (noting) {
                    note(s);
                }
                int k = (int) Math.min(block, end - s);
                source.read(s, samples, k);
                monitor.onSamples(samples, 0, k, (long) (s * periodNs));
            }
        }

        private void note(long s) {
            long i = (s - inFrom) / block;
            if (s >= inFrom && i < inStates.length) {
                inStates[(int) i] = monitor.idleState();
                inCounts[(int) i] = results.size();
            }
            long o = (s - outFrom) / block;
            if (outFrom >= 0 && s >= outFrom && o < outStates.length) {
                outStates[(int) o] = monitor.idleState();
                outCounts[(int) o] = results.size();
            }
        }
    }
}
