package hammerstep.web;

import hammerstep.analysis.WhatIf;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.trace.StationReplay;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceException;
import hammerstep.web.ResultLog.JointRow;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.UnaryOperator;
import java.util.stream.Stream;

/**
 * One what-if of the web view: the stored traces of a range judged again with the engineer's
 * changed program, each set beside its stored verdict, as {@code hammerstep replay --compare} does
 * (the same replay, {@link StationReplay#whatIf}, the same joint per trace, the rundown with the
 * most blows, and the same tally, {@link WhatIf}). The stored verdicts come from the joints the view
 * keeps (the station's own results), matched to a trace by its file name, else by the part serial,
 * position, pass and attempt of its header when one joint alone has them, else the verdict the
 * trace's header kept (without reasons). Nothing on the station changes: the traces are read, not
 * written, and the program is the engineer's copy only.
 *
 * <p>A trace is in the range when its file was written within the time range (the station writes
 * a joint's trace when it judges the joint) and its header's part serial is one of those asked
 * for. Traces of other programs (by the program id in their header) are left out and counted.
 */
final class WhatIfRun {

    /** Most stored traces one what-if replays (about a day of a busy station). */
    static final int MAX_TRACES = 20_000;
    /** Most changed joints listed (the counts include all). */
    static final int MAX_LISTED = 500;
    private static final int BLOCK = 4096;

    /** What the engineer asked for. */
    record Ask(JointProgram program, String programName, Instant from, Instant to, Set<String> serials, String who) {
    }

    /** One joint whose verdict (or reasons) would change. */
    record Changed(Path trace, String part, String position, String pass, String storedVerdict,
                   List<String> storedReasons, String newVerdict, List<String> newReasons, double newFinalNm,
                   int newBlows, String change, JointProgram storedProgram) {
    }

    private final Ask ask;
    private final Path tracesDir;
    private final List<JointRow> kept;
    private final WhatIf tally = new WhatIf();
    private final List<Changed> changed = new ArrayList<>();
    private final AtomicInteger done = new AtomicInteger();
    private volatile int total = -1;
    private int otherPrograms;
    private int refused;
    private String firstRefusal;
    private int withoutResult;
    private volatile boolean finished;
    private volatile String failure;
    private final Instant startedAt;

    WhatIfRun(Ask ask, Path tracesDir, List<JointRow> kept, Instant startedAt) {
        this.ask = ask;
        this.tracesDir = tracesDir;
        this.kept = kept;
        this.startedAt = startedAt;
    }

    /** Runs the what-if on the calling thread (the view's single what-if worker). */
    void run() {
        try {
            List<Path> traces = traces(tracesDir);
            total = traces.size();
            Map<String, JointRow> byName = new HashMap<>();
            Map<String, JointRow> byKey = new HashMap<>();
            Set<String> ambiguous = new HashSet<>();
            for (JointRow r : kept) {
                String path = r.joint().tracePath();
                if (path != null) {
                    byName.putIfAbsent(nameOf(path), r);
                }
                String key = key(r.joint().partSerial(), r.joint().position(), r.joint().pass(),
                        Integer.toString(r.joint().attempt()));
                if (byKey.putIfAbsent(key, r) != null) {
                    ambiguous.add(key);
                }
            }
            List<JointResult> rundowns = new ArrayList<>();
            JointEvents collect = rundowns::add;
            for (Path trace : traces) {
                if (Thread.currentThread().isInterrupted()) {
                    failure = "stopped";
                    return;
                }
                done.incrementAndGet();
                if (!inTimeRange(trace)) {
                    continue;
                }
                StoredTrace.Loaded loaded;
                try {
                    loaded = StoredTrace.load(trace);
                } catch (TraceException e) {
                    refuse(e.getMessage());
                    continue;
                }
                Map<String, String> meta = loaded.header().metadata();
                if (!ask.serials().isEmpty() && !ask.serials().contains(meta.getOrDefault("part_serial", ""))) {
                    continue;
                }
                String id = meta.get("program");
                if (id != null && !id.isEmpty() && !id.equals(ask.program().id())) {
                    otherPrograms++;
                    continue;
                }
                rundowns.clear();
                try {
                    StationReplay.whatIf(trace, loaded, ask.program(), UnaryOperator.identity(), BLOCK, collect,
                            w -> { });
                } catch (TraceException e) {
                    refuse(e.getMessage());
                    continue;
                }
                String name = trace.getFileName().toString();
                JointRow s = byName.get(name);
                if (s == null && meta.containsKey("part_serial")) {
                    String key = key(meta.get("part_serial"), meta.getOrDefault("position", ""),
                            meta.getOrDefault("pass", ""), meta.getOrDefault("attempt", ""));
                    s = ambiguous.contains(key) ? null : byKey.get(key);
                }
                compare(trace, meta, s, theJoint(rundowns));
            }
        } catch (IOException | RuntimeException e) {
            failure = e.getMessage() == null ? e.toString() : e.getMessage();
        } finally {
            finished = true;
        }
    }

    private void refuse(String message) {
        refused++;
        if (firstRefusal == null) {
            firstRefusal = message;
        }
    }

    private boolean inTimeRange(Path trace) throws IOException {
        if (ask.from() == null && ask.to() == null) {
            return true;
        }
        Instant written = Files.getLastModifiedTime(trace).toInstant();
        return (ask.from() == null || !written.isBefore(ask.from())) && (ask.to() == null || written.isBefore(ask.to()));
    }

    private void compare(Path trace, Map<String, String> meta, JointRow s, JointResult joint) {
        String storedVerdict;
        List<String> storedReasons;
        String part;
        String position;
        String pass;
        JointProgram storedProgram = null;
        if (s != null) {
            JointResult r = s.joint().result();
            storedVerdict = r.verdict().name();
            storedReasons = names(r.reasons());
            part = s.joint().partSerial();
            position = s.joint().position();
            pass = s.joint().pass();
            storedProgram = r.program();
        } else {
            withoutResult++;
            storedVerdict = meta.getOrDefault("verdict", "?");
            storedReasons = null;
            part = meta.getOrDefault("part_serial", "");
            position = meta.getOrDefault("position", "");
            pass = meta.getOrDefault("pass", "");
        }
        String newVerdict = joint == null ? WhatIf.NO_RUNDOWN : joint.verdict().name();
        List<String> newReasons = joint == null ? List.of() : names(joint.reasons());
        String change = tally.add(ask.program().id(), position, storedVerdict, storedReasons, newVerdict, newReasons);
        boolean otherReasons = change.equals("same") && storedReasons != null
                && !(storedReasons.size() == newReasons.size() && storedReasons.containsAll(newReasons));
        if ((!change.equals("same") || otherReasons) && changed.size() < MAX_LISTED) {
            changed.add(new Changed(trace, part, position, pass, storedVerdict, storedReasons, newVerdict, newReasons,
                    joint == null ? Double.NaN : joint.finalTorqueNm(), joint == null ? 0 : joint.blows(),
                    otherReasons ? "reasons" : change, storedProgram));
        }
    }

    private static List<String> names(List<Reason> reasons) {
        List<String> out = new ArrayList<>(reasons.size());
        for (Reason r : reasons) {
            out.add(r.name());
        }
        return out;
    }

    /** A stored trace holds one joint: the rundown with the most blows (the first of equals), as replay --compare takes it. */
    static JointResult theJoint(List<JointResult> rundowns) {
        JointResult best = null;
        for (JointResult r : rundowns) {
            if (best == null || r.blows() > best.blows()) {
                best = r;
            }
        }
        return best;
    }

    /** The stored traces under {@code dir}, in name order (as replay takes a directory), at most {@link #MAX_TRACES}. */
    static List<Path> traces(Path dir) throws IOException {
        if (dir == null || !Files.isDirectory(dir)) {
            return List.of();
        }
        try (Stream<Path> s = Files.walk(dir)) {
            return s.filter(f -> StoredTrace.isStored(f) && Files.isRegularFile(f)).sorted().limit(MAX_TRACES).toList();
        }
    }

    static String nameOf(String path) {
        int cut = Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\'));
        return path.substring(cut + 1);
    }

    private static String key(String partSerial, String position, String pass, String attempt) {
        return partSerial + '\u0000' + position + '\u0000' + pass + '\u0000' + attempt;
    }

    Ask ask() {
        return ask;
    }

    Instant startedAt() {
        return startedAt;
    }

    boolean finished() {
        return finished;
    }

    /** Why the run stopped short, or null. */
    String failure() {
        return failure;
    }

    int done() {
        return done.get();
    }

    /** Traces found, -1 while they are being listed. */
    int total() {
        return total;
    }

    // read only once finished (the worker's writes happen before the volatile 'finished')

    WhatIf tally() {
        return tally;
    }

    List<Changed> changed() {
        return changed;
    }

    int otherPrograms() {
        return otherPrograms;
    }

    int refused() {
        return refused;
    }

    String firstRefusal() {
        return firstRefusal;
    }

    int withoutResult() {
        return withoutResult;
    }
}
