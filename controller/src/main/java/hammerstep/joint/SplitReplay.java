package hammerstep.joint;

import hammerstep.signal.Conditioning;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.locks.LockSupport;

/**
 * Replay of a long trace on several cores, with results identical to one {@link JointMonitor}
 * reading the trace from start to end.
 *
 * <p>The trace is cut into one segment per worker at block boundaries. Each worker but the first
 * starts {@code primeS} seconds before its segment with a fresh monitor, so that its zero and
 * filter settle on the same signal, and notes its {@link JointMonitor#idleState()} at every block
 * boundary of the first {@code windowS} seconds of its segment. Each worker but the last, having
 * done its own segment, carries on into the next one, comparing its state with the one noted
 * there at each boundary. At the first boundary where both are idle with equal states, the later
 * worker is from then on in exactly the state the single monitor would be in: the earlier worker
 * stops, and the later worker's results from that boundary on replace its own. A worker that never
 * meets an equal state simply carries on to the end, which is the single monitor itself: the split
 * can cost time but never change a result.
 */
public final class SplitReplay {

    /** Random access to a trace's samples, safe to call from several threads at once. */
    @FunctionalInterface
    public interface Samples {
        /** Copies samples {@code [from, from+length)} into {@code into[0, length)}. */
        void read(long from, float[] into, int length);
    }

    /**
     * What a replay produced: the results in time order, how many segments were handed over, and
     * how many samples workers ran past their own segment before one was (the cost of the split).
     */
    public record Outcome(List<JointResult> results, int workers, int handovers, long samplesPastSegments) {
    }

    /**
     * Priming before a segment. On simulated shifts (1.5 s rundowns, 0.5 s pauses) two zero trackers
     * met after about 110 s; priming for part of that leaves the earlier worker less to run on.
     */
    public static final double PRIME_S = 40.0;
    /** How far into its segment a worker notes its states for the worker before it to meet. */
    public static final double WINDOW_S = 600.0;

    private final JointProgram program;
    private final Conditioning conditioning;
    private final double rateHz;
    private final int block;
    private final long primeSamples;
    private final long windowSamples;

    public SplitReplay(JointProgram program, Conditioning conditioning, double rateHz, int block) {
        this(program, conditioning, rateHz, block, PRIME_S, WINDOW_S);
    }

    SplitReplay(JointProgram program, Conditioning conditioning, double rateHz, int block, double primeS,
                double windowS) {
        this.program = Objects.requireNonNull(program);
        this.conditioning = Objects.requireNonNull(conditioning);
        this.rateHz = rateHz;
        this.block = block;
        this.primeSamples = roundUpToBlock((long) Math.ceil(primeS * rateHz));
        this.windowSamples = roundUpToBlock((long) Math.ceil(windowS * rateHz));
    }

    /**
     * The number of workers worth starting for {@code samples} on {@code cores}: each segment must be
     * several times longer than its priming, else one monitor alone is as fast.
     */
    public int workersFor(long samples, int cores) {
        long n = samples / (8 * Math.max(primeSamples, block));
        return (int) Math.max(1, Math.min(cores, n));
    }

    /** Replays {@code samples} samples of {@code source} on {@code workers} threads. */
    public Outcome run(Samples source, long samples, int workers) throws InterruptedException {
        int n = Math.max(1, workers);
        long[] cut = new long[n + 1];
        for (int w = 1; w < n; w++) {
            cut[w] = roundDownToBlock(samples * w / n);
        }
        cut[n] = samples;
        List<Worker> crew = new ArrayList<>(n);
        for (int w = 0; w < n; w++) {
            long from = w == 0 ? 0 : Math.max(cut[w - 1], cut[w] - primeSamples);
            long noted = w == 0 ? 0 : Math.min(windowSamples, cut[w + 1] - cut[w]) / block;
            crew.add(new Worker(source, crew, w, from, cut[w], cut[w + 1], samples, (int) noted));
        }
        runAll(crew);
        return join(crew);
    }

    private Outcome join(List<Worker> crew) {
        List<JointResult> results = new ArrayList<>();
        int handovers = 0;
        long past = 0;
        Worker w = crew.get(0);
        int first = 0;
        while (true) {
            past += w.stoppedAt - w.segmentEnd;
            if (w.next == null) {
                results.addAll(w.results.subList(first, w.results.size()));
                return new Outcome(results, crew.size(), handovers, past);
            }
            results.addAll(w.results.subList(first, w.resultsAtHandover));
            first = w.next.counts[w.nextIndex];
            w = w.next;
            handovers++;
        }
    }

    private static void runAll(List<Worker> crew) throws InterruptedException {
        if (crew.size() == 1) {
            crew.get(0).run();
            return;
        }
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

    /**
     * One monitor from {@code from}: primes up to {@code segmentStart}, notes its states at the
     * first {@code noted} boundaries of its segment, then runs on past {@code segmentEnd} until it
     * meets a later worker's noted state or the trace ends.
     */
    private final class Worker implements Runnable {
        final Samples source;
        final JointMonitor monitor;
        final List<JointResult> results = new ArrayList<>();
        final float[] samples = new float[block];
        final double periodNs = 1e9 / rateHz;
        final long from;
        final long segmentStart;
        final long segmentEnd;
        final JointMonitor.IdleState[] states;
        final int[] counts;
        /** Boundaries noted so far; written by this worker, read by the one before it. */
        volatile int published;
        volatile boolean done;

        final List<Worker> crew;
        final int index;
        final long traceEnd;
        long stoppedAt;
        Worker next;
        int nextIndex;
        int resultsAtHandover;

        Worker(Samples source, List<Worker> crew, int index, long from, long segmentStart, long segmentEnd,
               long traceEnd, int noted) {
            this.source = source;
            this.crew = crew;
            this.index = index;
            this.traceEnd = traceEnd;
            this.monitor = new JointMonitor(program, conditioning, rateHz, block, results::add);
            this.from = from;
            this.segmentStart = segmentStart;
            this.segmentEnd = segmentEnd;
            this.states = new JointMonitor.IdleState[noted];
            this.counts = new int[noted];
        }

        @Override
        public void run() {
            try {
                for (long s = from; s < traceEnd; s += block) {
                    if (s >= segmentEnd && meets(s)) {
                        stoppedAt = s;
                        return;
                    }
                    if (s >= segmentStart) {
                        note(s);
                    }
                    int k = (int) Math.min(block, traceEnd - s);
                    source.read(s, samples, k);
                    monitor.onSamples(samples, 0, k, (long) (s * periodNs));
                }
                stoppedAt = traceEnd;
                monitor.finish();
            } finally {
                done = true;
                published = states.length;
            }
        }

        private void note(long s) {
            int i = (int) ((s - segmentStart) / block);
            if (i < states.length) {
                states[i] = monitor.idleState();
                counts[i] = results.size();
                published = i + 1;
            }
        }

        /** True when this worker's state at boundary {@code s} equals the one a later worker noted there. */
        private boolean meets(long s) {
            for (int j = crew.size() - 1; j > index; j--) {
                Worker later = crew.get(j);
                if (s >= later.segmentStart) {
                    int i = (int) ((s - later.segmentStart) / block);
                    if (i >= later.states.length) {
                        return false;
                    }
                    while (later.published <= i && !later.done) {
                        LockSupport.parkNanos(20_000);
                    }
                    JointMonitor.IdleState mine = monitor.idleState();
                    if (i < later.published && mine != null && mine.equals(later.states[i])) {
                        next = later;
                        nextIndex = i;
                        resultsAtHandover = results.size();
                        return true;
                    }
                    return false;
                }
            }
            return false;
        }
    }
}
