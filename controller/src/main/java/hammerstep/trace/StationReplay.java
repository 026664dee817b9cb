package hammerstep.trace;

import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.signal.Conditioning;
import hammerstep.signal.ConditionerText;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.function.Consumer;
import java.util.function.UnaryOperator;

/**
 * Judges a stored trace the way the station judged it. A trace kept with its chain state (see
 * {@link TraceKeeper}) is replayed from the block its rundown started in: a monitor with the
 * station's conditioning, its conditioner put back into the state it had at that block's start, fed
 * in the station's block length from there. With the program the joint was judged against this
 * gives the station's blows, peaks (to the stored resolution), verdict and reasons. The samples
 * before that block (the lead) are for the eye only.
 *
 * <p>A trace without chain state (format 1, or kept where the ring no longer held the rundown's
 * start) is judged as any recorded trace is: a fresh chain from its first sample, with the replay
 * conditioning of the program. The caller is told why on one line.
 */
public final class StationReplay {

    private StationReplay() {
    }

    /**
     * What a stored trace carries for the chain.
     *
     * @param input        the input stage's conditioning and its state at the start of the rundown's block
     * @param blockSamples the station's block length
     * @param judgeFrom    index of the first sample of the block the rundown started in
     */
    public record Chain(ConditionerText.Snapshot input, int blockSamples, int judgeFrom) {
    }

    /** The chain state {@code trace} carries, or null when it carries none. */
    public static Chain chainOf(Path path, StoredTrace.Header h, Conditioning fallback) throws TraceException {
        ConditionerText.Snapshot input;
        try {
            input = ConditionerText.read(h.metadata(), fallback, h.rateHz());
        } catch (IllegalArgumentException e) {
            throw new TraceException(path + ": chain state: " + e.getMessage());
        }
        if (input == null) {
            return null;
        }
        int block = intOf(path, h, "block_samples", 1, 1 << 20);
        int from = intOf(path, h, "judge_from", 0, h.samples());
        return new Chain(input, block, from);
    }

    private static int intOf(Path path, StoredTrace.Header h, String key, int min, int max) throws TraceException {
        String v = h.metadata().get(key);
        try {
            int n = Integer.parseInt(Objects.requireNonNull(v).trim());
            if (n >= min && n <= max) {
                return n;
            }
        } catch (NumberFormatException | NullPointerException e) {
            // told below
        }
        throw new TraceException(path + ": chain state: " + key + "=" + v + " is not a whole number from "
                + min + " to " + max);
    }

    /**
     * The lines a replay of {@code h} with {@code program} should print before its results: a program
     * or revision other than the one the joint was judged with, a trace read unchecked, a station's
     * trace (one naming its program) without chain state. Empty when the replay reproduces the
     * station, and for a trace written by a tool rather than kept by a station.
     */
    public static List<String> warnings(Path path, StoredTrace.Header h, JointProgram program, Chain chain) {
        return warnings(path, h, program, chain, true);
    }

    private static List<String> warnings(Path path, StoredTrace.Header h, JointProgram program, Chain chain,
                                         boolean otherRevision) {
        List<String> lines = new ArrayList<>(2);
        String id = h.programId();
        String revision = h.programRevision();
        if (!otherRevision) {
            // a what-if: the program differs from the station's on purpose
        } else if (id != null && !id.equals(program.id())) {
            lines.add(path + ": judged at the station with program " + id + (revision == null ? "" : " revision "
                    + revision) + ", replayed with " + program.id() + " revision " + program.revision());
        } else if (revision != null && !revision.isEmpty() && !revision.equals(program.revision())) {
            lines.add(path + ": judged at the station with " + program.id() + " revision " + revision
                    + ", replayed with revision " + program.revision() + ": results may differ from the station's");
        }
        if (!h.checked()) {
            lines.add(path + ": stored trace format " + h.version() + ", no checksum and no chain state: read"
                    + " unchecked and judged from a fresh chain (may differ from the station)");
        } else if (chain == null && id != null) {
            lines.add(path + ": no chain state stored with this trace: judged from a fresh chain"
                    + " (may differ from the station)");
        }
        return lines;
    }

    /**
     * Replays one stored trace: checks it (a damaged one is refused before any sample is judged),
     * passes each warning line to {@code warn}, then judges it, results to {@code events}.
     *
     * @param options     turns the conditioning the judging starts from (the stored one, else the
     *                    program's replay conditioning) into the one to use: the command line's
     *                    explicit options (a what-if when it changes the stored one)
     * @param block       block length for traces without chain state
     * @param everySample receives every sample of the trace, lead included, in blocks (null: none)
     * @return the trace as loaded
     */
    public static StoredTrace.Loaded replay(Path path, JointProgram program, UnaryOperator<Conditioning> options,
                                            int block, JointEvents events, SampleSink everySample,
                                            Consumer<String> warn) throws TraceException {
        return replay(path, StoredTrace.load(path), program, options, block, events, everySample, warn, true);
    }

    /** As {@link #replay(Path, JointProgram, UnaryOperator, int, JointEvents, SampleSink, Consumer)}, of a trace already loaded (and so checked) from {@code path}. */
    public static StoredTrace.Loaded replay(Path path, StoredTrace.Loaded trace, JointProgram program,
                                            UnaryOperator<Conditioning> options, int block, JointEvents events,
                                            Consumer<String> warn) throws TraceException {
        return replay(path, trace, program, options, block, events, null, warn, true);
    }

    /**
     * As {@link #replay}, for a what-if: {@code program} is the engineer's changed copy, so a program
     * revision other than the station's is the point and not warned of; the other warnings stay.
     */
    public static StoredTrace.Loaded whatIf(Path path, StoredTrace.Loaded trace, JointProgram program,
                                            UnaryOperator<Conditioning> options, int block, JointEvents events,
                                            Consumer<String> warn) throws TraceException {
        return replay(path, trace, program, options, block, events, null, warn, false);
    }

    private static StoredTrace.Loaded replay(Path path, StoredTrace.Loaded t, JointProgram program,
                                             UnaryOperator<Conditioning> options, int block, JointEvents events,
                                             SampleSink everySample, Consumer<String> warn, boolean warnOtherRevision)
            throws TraceException {
        StoredTrace.Header h = t.header();
        Conditioning fallback = JointMonitor.replayConditioning(program);
        Chain chain = chainOf(path, h, fallback);
        warnings(path, h, program, chain, warnOtherRevision).forEach(warn);
        if (everySample != null) {
            feed(t, 0, block, everySample);
        }
        Conditioning conditioning = options.apply(chain == null ? fallback : chain.input().settings());
        if (conditioning.lowPassHz() >= h.rateHz() / 2) {
            throw new TraceException(path + ": low-pass " + conditioning.lowPassHz()
                    + " Hz must be below half the trace's sample rate (" + h.rateHz() / 2 + " Hz)");
        }
        int step = chain == null ? block : chain.blockSamples();
        JointMonitor monitor = new JointMonitor(program, conditioning, h.rateHz(), Math.max(1, step), events);
        if (chain != null) {
            monitor.conditioner().restore(chain.input().state());
        }
        feed(t, chain == null ? 0 : chain.judgeFrom(), step, monitor::onSamples);
        monitor.finish();
        return t;
    }

    private static void feed(StoredTrace.Loaded t, int from, int step, SampleSink sink) {
        float[] x = t.samples();
        for (int at = from; at < x.length; at += step) {
            sink.onSamples(x, at, Math.min(step, x.length - at), t.timeOf(at));
        }
    }
}
