package hammerstep.app;

import hammerstep.analysis.InputException;
import hammerstep.analysis.StoredJoints;
import hammerstep.analysis.WhatIf;
import hammerstep.config.ConfigException;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.joint.Reason;
import hammerstep.results.JointFields;
import hammerstep.results.JsonLines;
import hammerstep.signal.Conditioning;
import hammerstep.trace.StationReplay;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceException;
import hammerstep.trace.TraceFiles;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.stream.Stream;

/**
 * {@code replay} over many traces in one process: the traces named and the stored traces
 * ({@code .hst}) found under the directories named, each replayed from a fresh chain with the
 * program it was judged with (matched by the program id in its header; a trace of a program not
 * given is skipped and counted). Without {@code --compare}, every rundown is printed as a JSON line
 * that starts with the trace's path; with it, every trace's joint is set beside its stored result
 * and a summary says which verdicts would change (see {@link WhatIf}).
 *
 * <p>Traces are replayed in chunks on every core (each worker with its own buffers and a fresh
 * monitor per trace) and taken back in order, so the output and the tally are those of one thread.
 *
 * <p>A trace that cannot be read (cut short, damaged, not a trace) is refused with one line on
 * standard error naming it, never judged; the run goes on and ends with exit 2.
 */
final class ArchiveReplay {

    /** What the command line asked for. */
    record Settings(List<Path> traces, List<Path> programs, double rateHz, double lowPassHz, double overRangeNm,
                    double flatLineMs, double mainsHz, boolean summary, Path compare) {
    }

    private final Settings settings;
    private final Writer out;
    private final PrintWriter err;
    private final Progress progress;
    private final Map<String, JointProgram> programs = new LinkedHashMap<>();
    private final Map<String, Integer> otherPrograms = new TreeMap<>();
    private final WhatIf whatIf = new WhatIf();
    private StoredJoints stored;
    private int refused;
    private int withoutResult;
    private int replayed;

    ArchiveReplay(Settings settings, Writer out, PrintWriter err, Progress progress) {
        this.settings = settings;
        this.out = out;
        this.err = err;
        this.progress = progress;
    }

    /** True when the command line asks for more than the single-trace replay of old. */
    static boolean wanted(List<Path> traces, List<Path> programs, Path compare) {
        return traces.size() > 1 || programs.size() > 1 || compare != null || Files.isDirectory(traces.get(0));
    }

    /** Traces replayed with a warning (another revision of the program, an old trace format), and the first. */
    private final java.util.concurrent.atomic.AtomicLong warned = new java.util.concurrent.atomic.AtomicLong();
    private final java.util.concurrent.atomic.AtomicReference<String> firstWarning =
            new java.util.concurrent.atomic.AtomicReference<>();

    int run() throws ConfigException, IOException {
        for (Path p : settings.programs()) {
            JointProgram program = ProgramFile.load(p);
            if (programs.putIfAbsent(program.id(), program) != null) {
                throw new UserError("--program " + p + ": a second program with the id " + program.id());
            }
        }
        List<Path> traces = expand(settings.traces());
        if (settings.compare() != null) {
            try {
                stored = StoredJoints.read(settings.compare());
            } catch (InputException e) {
                throw new UserError(e.getMessage());
            }
        }
        if (stored != null && !settings.summary()) {
            out.write(String.format(Locale.ROOT, "%-44s %-14s %-8s %-8s %-16s %-28s %-28s %9s %5s  %s%n", "trace",
                    "part", "position", "pass", "program", "stored", "new", "final_nm", "blows", "change"));
        }
        int changed = 0;
        int workers = Math.max(1, Math.min(Runtime.getRuntime().availableProcessors(), MAX_WORKERS));
        ExecutorService pool = Executors.newFixedThreadPool(workers, r -> {
            Thread t = new Thread(r, "replay-archive");
            t.setDaemon(true);
            return t;
        });
        try {
            // chunks of traces on every core, taken back in order: output and tally as one thread would make them
            ArrayDeque<Future<Done[]>> window = new ArrayDeque<>();
            int next = 0;
            int done = 0;
            while (next < traces.size() || !window.isEmpty()) {
                while (next < traces.size() && window.size() < AHEAD_PER_WORKER * workers) {
                    int from = next;
                    int to = Math.min(traces.size(), from + CHUNK);
                    window.add(pool.submit(() -> replayChunk(traces, from, to)));
                    next = to;
                }
                for (Done d : take(window.poll())) {
                    if (take(d)) {
                        changed++;
                    }
                    progress.update(++done, traces.size(), changed, stored != null);
                }
            }
        } finally {
            pool.shutdownNow();
            progress.end();
        }
        if (stored != null) {
            out.write(summary(traces.size()));
        } else if (settings.summary()) {
            out.write(String.format(Locale.ROOT, "%d traces replayed%s%n", replayed, notReplayed()));
        }
        out.flush();
        if (warned.get() > 0) {
            // against a changed program every trace warns of the revision: one line, not one per trace
            err.println(warned.get() + (warned.get() == 1 ? " trace" : " traces") + " replayed with a warning; the first: "
                    + firstWarning.get());
            err.flush();
        }
        return refused > 0 ? 2 : 0;
    }

    private static final int MAX_WORKERS = 8;
    private static final int CHUNK = 32;
    private static final int AHEAD_PER_WORKER = 4;

    /**
     * What one trace gave, made on a worker: the lines to print, or the joint to compare, or why it
     * was not replayed. {@code skippedProgram} is set for a trace of a program not given,
     * {@code refusal} for a trace that could not be read.
     */
    private record Done(String text, String skippedProgram, String refusal, String program, String position,
                        String storedVerdict, List<String> storedReasons, boolean withResult, String newVerdict,
                        List<String> newReasons, String row) {
    }

    private static Done[] take(Future<Done[]> f) throws IOException {
        try {
            return f.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted");
        } catch (ExecutionException e) {
            Throwable cause = e.getCause();
            if (cause instanceof RuntimeException r) {
                throw r;
            }
            if (cause instanceof Error r) {
                throw r;
            }
            throw new IOException(cause.getMessage(), cause);
        }
    }

    /** Prints and tallies one trace's outcome, on the calling thread, in trace order; true when its verdict changes. */
    private boolean take(Done d) throws IOException {
        if (d.refusal() != null) {
            refused++;
            err.println(d.refusal());
            err.flush();
            return false;
        }
        if (d.skippedProgram() != null) {
            otherPrograms.merge(d.skippedProgram(), 1, Integer::sum);
            return false;
        }
        replayed++;
        if (stored == null) {
            out.write(d.text());
            return false;
        }
        if (!d.withResult()) {
            withoutResult++;
        }
        String change = whatIf.add(d.program(), d.position(), d.storedVerdict(), d.storedReasons(), d.newVerdict(),
                d.newReasons());
        if (!settings.summary()) {
            out.write(d.row());
        }
        return !change.equals("same");
    }

    /** Replays traces {@code [from, to)} on a worker, with buffers of its own. */
    private Done[] replayChunk(List<Path> traces, int from, int to) throws IOException {
        Lane lane = new Lane();
        Done[] done = new Done[to - from];
        for (int i = from; i < to; i++) {
            try {
                done[i - from] = lane.replay(traces.get(i));
            } catch (TraceException e) {
                done[i - from] = new Done(null, null, e.getMessage(), null, null, null, null, false, null, null, null);
            }
        }
        return done;
    }

    /** One worker's buffers: a block, and the rundowns of the trace under way. */
    private final class Lane {
        private final List<JointResult> rundowns = new ArrayList<>();
        private final JointEvents collect = rundowns::add;
        private final float[] block = new float[ReplayCommand.BLOCK];
        private final StringBuilder text = new StringBuilder(1024);
        /** Warnings of the traces replayed (another program revision, an old format): one line each. */
        private final List<String> warnings = new ArrayList<>();

        private Conditioning withOptions(Conditioning base) {
            return ReplayCommand.withOptions(base, settings.lowPassHz(), settings.overRangeNm(), settings.flatLineMs(),
                    settings.mainsHz());
        }

        Done replay(Path trace) throws TraceException {
            Map<String, String> metadata = Map.of();
            double rate;
            boolean isStored = StoredTrace.isStored(trace);
            StoredTrace.Loaded loaded = null;
            if (isStored) {
                // read and checked once: the header names the program, the samples follow
                loaded = StoredTrace.load(trace);
                metadata = loaded.header().metadata();
                rate = loaded.header().rateHz();
            } else {
                rate = TraceFiles.rateOf(trace, settings.rateHz());
            }
            String id = metadata.get("program");
            JointProgram program = programFor(trace, id);
            if (program == null) {
                return new Done(null, id, null, null, null, null, null, false, null, null, null);
            }
            if (settings.lowPassHz() >= rate / 2) {
                throw new UserError(trace + ": --low-pass " + settings.lowPassHz() + " Hz must be below half its"
                        + " sample rate (" + rate / 2 + " Hz)");
            }
            rundowns.clear();
            if (isStored) {
                // as the station judged it: its conditioning and its input stage's state at the rundown's start
                warnings.clear();
                if (stored != null) {
                    StationReplay.whatIf(trace, loaded, program, this::withOptions, ReplayCommand.BLOCK, collect,
                            warnings::add);
                } else {
                    StationReplay.replay(trace, loaded, program, this::withOptions, ReplayCommand.BLOCK, collect,
                            warnings::add);
                }
                if (!warnings.isEmpty()) {
                    warned.incrementAndGet();
                    firstWarning.compareAndSet(null, warnings.get(0));
                }
            } else {
                Conditioning conditioning = withOptions(JointMonitor.replayConditioning(program)
                        .withRange(TraceFiles.rangeOf(trace)));
                JointMonitor monitor = new JointMonitor(program, conditioning, rate, ReplayCommand.BLOCK, collect);
                TraceFiles.read(trace, rate, block, monitor::onSamples);
                monitor.finish();
            }
            if (stored == null) {
                text.setLength(0);
                if (!settings.summary()) {
                    for (JointResult r : rundowns) {
                        Map<String, Object> m = new LinkedHashMap<>();
                        m.put("trace", trace.toString());
                        m.putAll(JointFields.of(r));
                        m.put("start_s", JointFields.round(r.startNs() * 1e-9, 10_000));
                        text.append(JsonLines.of(m)).append('\n');
                    }
                }
                return new Done(text.toString(), null, null, null, null, null, null, false, null, null, null);
            }
            return compare(trace, metadata, program, theJoint(rundowns));
        }
    }

    /** The program a trace is replayed with, or null when its program was not given. */
    private JointProgram programFor(Path trace, String id) {
        if (id == null || id.isEmpty()) {
            if (programs.size() == 1) {
                return programs.values().iterator().next();
            }
            throw new UserError(trace + ": the trace names no program; give it a single --program");
        }
        return programs.get(id);
    }

    private Done compare(Path trace, Map<String, String> metadata, JointProgram program, JointResult joint) {
        String name = trace.getFileName().toString();
        StoredJoints.Joint s = stored.of(name, metadata);
        String storedVerdict;
        List<String> storedReasons;
        String part;
        String position;
        String pass;
        if (s != null) {
            storedVerdict = s.verdict();
            storedReasons = s.reasons();
            part = s.partSerial();
            position = s.position();
            pass = s.pass();
        } else {
            // no result for it in the file: the verdict the trace's header kept, without reasons
            storedVerdict = metadata.getOrDefault("verdict", "?");
            storedReasons = null;
            part = metadata.getOrDefault("part_serial", "");
            position = metadata.getOrDefault("position", "");
            pass = metadata.getOrDefault("pass", "");
        }
        String newVerdict = joint == null ? WhatIf.NO_RUNDOWN : joint.verdict().name();
        List<String> newReasons = new ArrayList<>();
        if (joint != null) {
            for (Reason r : joint.reasons()) {
                newReasons.add(r.name());
            }
        }
        String row = null;
        if (!settings.summary()) {
            String change = WhatIf.change(storedVerdict, newVerdict);
            String was = s == null ? storedVerdict + " (trace header)" : verdict(storedVerdict, storedReasons);
            row = String.format(Locale.ROOT, "%-44s %-14s %-8s %-8s %-16s %-28s %-28s %9s %5s  %s%n", name, part,
                    position, pass, program.id(), was, verdict(newVerdict, newReasons),
                    joint == null ? "-" : String.format(Locale.ROOT, "%.2f", joint.finalTorqueNm()),
                    joint == null ? "-" : Integer.toString(joint.blows()),
                    change.equals("same") ? (storedReasons != null && !sameSet(storedReasons, newReasons)
                            ? "reasons" : "-") : change);
        }
        return new Done(null, null, null, program.id(), position, storedVerdict, storedReasons, s != null, newVerdict,
                newReasons, row);
    }

    /** A stored trace holds one joint: the rundown with the most blows (the first of equals). */
    private static JointResult theJoint(List<JointResult> rundowns) {
        JointResult best = null;
        for (JointResult r : rundowns) {
            if (best == null || r.blows() > best.blows()) {
                best = r;
            }
        }
        return best;
    }

    private static boolean sameSet(List<String> a, List<String> b) {
        return a.size() == b.size() && a.containsAll(b);
    }

    private static String verdict(String verdict, List<String> reasons) {
        return reasons == null || reasons.isEmpty() ? verdict : verdict + " " + String.join(",", reasons);
    }

    private String summary(int traces) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "%n%d traces, %d replayed%s%n", traces, replayed, notReplayed()));
        sb.append(String.format(Locale.ROOT, "%s: %d joint results (%d duplicates by id dropped, %d other messages"
                        + " skipped); %d replayed traces without a result there (compared with the verdict in their header)%n",
                stored.file(), stored.joints().size(), stored.duplicates(), stored.otherMessages(), withoutResult));
        sb.append(whatIf.summary());
        return sb.toString();
    }

    private String notReplayed() {
        StringBuilder sb = new StringBuilder();
        if (!otherPrograms.isEmpty()) {
            sb.append("; skipped, program not given:");
            otherPrograms.forEach((id, n) -> sb.append(' ').append(id).append(" (").append(n).append(')'));
        }
        if (refused > 0) {
            sb.append("; ").append(refused).append(" refused (unreadable, see above)");
        }
        return sb.toString();
    }

    /** The traces named, and the stored traces under the directories named, each directory's in name order. */
    static List<Path> expand(List<Path> paths) throws IOException {
        List<Path> traces = new ArrayList<>();
        for (Path p : paths) {
            if (Files.isDirectory(p)) {
                try (Stream<Path> s = Files.walk(p)) {
                    s.filter(f -> StoredTrace.isStored(f) && Files.isRegularFile(f)).sorted().forEach(traces::add);
                } catch (UncheckedIOException e) {
                    throw new UserError(p + ": cannot list: " + e.getCause().getMessage());
                }
            } else if (Files.exists(p)) {
                traces.add(p);
            } else {
                throw new UserError(p + ": no such file or directory");
            }
        }
        if (traces.isEmpty()) {
            throw new UserError(String.join(", ", paths.stream().map(Path::toString).toList())
                    + ": no stored traces (.hst) found");
        }
        return traces;
    }
}
