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
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceException;
import hammerstep.trace.TraceFiles;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;

/**
 * {@code replay} over many traces in one process: the traces named and the stored traces
 * ({@code .hst}) found under the directories named, each replayed from a fresh chain with the
 * program it was judged with (matched by the program id in its header; a trace of a program not
 * given is skipped and counted). Without {@code --compare}, every rundown is printed as a JSON line
 * that starts with the trace's path; with it, every trace's joint is set beside its stored result
 * and a summary says which verdicts would change (see {@link WhatIf}).
 *
 * <p>A trace that cannot be read (cut short, damaged, not a trace) is refused with one line on
 * standard error naming it, never judged; the run goes on and ends with exit 2.
 */
final class ArchiveReplay {

    /** What the command line asked for. */
    record Settings(List<Path> traces, List<Path> programs, double rateHz, double lowPassHz, double overRangeNm,
                    double flatLineMs, boolean summary, Path compare) {
    }

    private final Settings settings;
    private final Writer out;
    private final PrintWriter err;
    private final Progress progress;
    private final Map<String, JointProgram> programs = new LinkedHashMap<>();
    private final Map<String, Integer> otherPrograms = new TreeMap<>();
    private final List<JointResult> rundowns = new ArrayList<>();
    private final JointEvents collect = rundowns::add;
    private final float[] block = new float[ReplayCommand.BLOCK];
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
        for (int i = 0; i < traces.size(); i++) {
            Path trace = traces.get(i);
            try {
                if (replay(trace)) {
                    changed++;
                }
            } catch (TraceException e) {
                refused++;
                err.println(e.getMessage());
                err.flush();
            }
            progress.update(i + 1, traces.size(), changed, stored != null);
        }
        progress.end();
        if (stored != null) {
            out.write(summary(traces.size()));
        } else if (settings.summary()) {
            out.write(String.format(Locale.ROOT, "%d traces replayed%s%n", replayed, notReplayed()));
        }
        out.flush();
        return refused > 0 ? 2 : 0;
    }

    /** Replays one trace; true when its joint's verdict would change. */
    private boolean replay(Path trace) throws TraceException, IOException {
        Map<String, String> metadata = Map.of();
        double rate;
        if (StoredTrace.isStored(trace)) {
            StoredTrace.Header h = StoredTrace.readHeader(trace);
            metadata = h.metadata();
            rate = h.rateHz();
        } else {
            rate = TraceFiles.rateOf(trace, settings.rateHz());
        }
        JointProgram program = programFor(trace, metadata.get("program"));
        if (program == null) {
            return false;
        }
        if (settings.lowPassHz() >= rate / 2) {
            throw new UserError(trace + ": --low-pass " + settings.lowPassHz() + " Hz must be below half its sample rate ("
                    + rate / 2 + " Hz)");
        }
        Conditioning conditioning = JointMonitor.replayConditioning(program).withLowPass(settings.lowPassHz())
                .withOverRange(settings.overRangeNm()).withFlatLine(settings.flatLineMs());
        rundowns.clear();
        JointMonitor monitor = new JointMonitor(program, conditioning, rate, ReplayCommand.BLOCK, collect);
        TraceFiles.read(trace, rate, block, monitor::onSamples);
        monitor.finish();
        replayed++;
        if (stored == null) {
            if (!settings.summary()) {
                for (JointResult r : rundowns) {
                    Map<String, Object> m = new LinkedHashMap<>();
                    m.put("trace", trace.toString());
                    m.putAll(JointFields.of(r));
                    m.put("start_s", JointFields.round(r.startNs() * 1e-9, 10_000));
                    out.write(JsonLines.of(m));
                    out.write('\n');
                }
            }
            return false;
        }
        return compare(trace, metadata, program);
    }

    /** The program a trace is replayed with, or null (counted) when its program was not given. */
    private JointProgram programFor(Path trace, String id) {
        if (id == null || id.isEmpty()) {
            if (programs.size() == 1) {
                return programs.values().iterator().next();
            }
            throw new UserError(trace + ": the trace names no program; give it a single --program");
        }
        JointProgram p = programs.get(id);
        if (p == null) {
            otherPrograms.merge(id, 1, Integer::sum);
        }
        return p;
    }

    private boolean compare(Path trace, Map<String, String> metadata, JointProgram program) throws IOException {
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
            withoutResult++;
            storedVerdict = metadata.getOrDefault("verdict", "?");
            storedReasons = null;
            part = metadata.getOrDefault("part_serial", "");
            position = metadata.getOrDefault("position", "");
            pass = metadata.getOrDefault("pass", "");
        }
        JointResult joint = theJoint();
        String newVerdict = joint == null ? WhatIf.NO_RUNDOWN : joint.verdict().name();
        List<String> newReasons = new ArrayList<>();
        if (joint != null) {
            for (Reason r : joint.reasons()) {
                newReasons.add(r.name());
            }
        }
        String change = whatIf.add(program.id(), position, storedVerdict, storedReasons, newVerdict, newReasons);
        if (!settings.summary()) {
            String was = s == null ? storedVerdict + " (trace header)" : verdict(storedVerdict, storedReasons);
            out.write(String.format(Locale.ROOT, "%-44s %-14s %-8s %-8s %-16s %-28s %-28s %9s %5s  %s%n", name, part,
                    position, pass, program.id(), was, verdict(newVerdict, newReasons),
                    joint == null ? "-" : String.format(Locale.ROOT, "%.2f", joint.finalTorqueNm()),
                    joint == null ? "-" : Integer.toString(joint.blows()),
                    change.equals("same") ? (storedReasons != null && !sameSet(storedReasons, newReasons)
                            ? "reasons" : "-") : change));
        }
        return !change.equals("same");
    }

    /** A stored trace holds one joint: the rundown with the most blows (the first of equals). */
    private JointResult theJoint() {
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
