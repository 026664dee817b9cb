package hammerstep.app;

import ch.qos.logback.classic.Level;
import hammerstep.config.ConfigException;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.joint.SplitReplay;
import hammerstep.results.JointFields;
import hammerstep.results.JsonLines;
import hammerstep.signal.Conditioning;
import hammerstep.station.SystemStationClock;
import hammerstep.trace.F32Trace;
import hammerstep.trace.StationReplay;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceException;
import hammerstep.trace.TraceFiles;
import hammerstep.trace.TraceReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;

/** {@code hammerstep replay}: the station's own measurement chain run over a recorded trace. */
@Command(name = "replay", mixinStandardHelpOptions = true,
        description = {"Runs the controller's signal chain on a recorded trace and judges every rundown.",
                "Prints one JSON line per rundown (or a table with --summary).",
                "Several traces, or directories of stored traces (.hst, found recursively), replay in one run, each with"
                        + " the --program of its own program id; --compare RESULTS sets each joint beside its stored"
                        + " result and sums up which verdicts would change."})
public final class ReplayCommand implements Callable<Integer> {

    static final int BLOCK = 4096;

    @Parameters(arity = "1..*", paramLabel = "TRACE", description = "trace: CSV (time_s,torque_nm), raw float32 N·m (.f32)"
            + " or a stored joint trace (.hst); or a directory of stored traces")
    List<Path> traces;

    @Option(names = "--program", required = true, paramLabel = "FILE",
            description = "joint program (YAML); repeat it for traces of several programs")
    List<Path> programFiles;

    @Option(names = "--compare", paramLabel = "RESULTS",
            description = "the station's results or a subscriber's log (JSON lines): print each joint's stored and new"
                    + " verdict and a summary of the changes")
    Path compare;

    @Option(names = "--rate", paramLabel = "HZ", converter = NumberOptions.Lenient.class,
            description = "sample rate; required for .f32, overrides CSV metadata")
    double rateHz;

    @Option(names = "--summary", description = "print a table instead of JSON lines")
    boolean summary;

    @Option(names = "--low-pass", paramLabel = "HZ", converter = NumberOptions.Lenient.class, description = "2nd-order Butterworth low-pass before detection (default: none)")
    double lowPassHz;

    @Option(names = "--over-range", paramLabel = "NM", converter = NumberOptions.Lenient.class, description = "the transducer's range: |torque| at or above it, or a pulse flattened at a rail, is a sensor fault; zero limit 2 %% of it (default: the trace's range_nm, else off and ±10 N·m)")
    double overRangeNm = Double.NaN;

    @Option(names = "--flat-line-ms", paramLabel = "MS", converter = NumberOptions.Lenient.class, description = "a signal exactly constant this long is a sensor fault (default: off)")
    double flatLineMs;

    @Option(names = "--mains", paramLabel = "HZ", description = "the mains frequency, 50 or 60: its hum and harmonics are learned in the idle and removed (default: none; hum of 6 N·m or more is then a sensor fault)")
    double mainsHz;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() throws ConfigException, TraceException, IOException {
        if (verbose) {
            Logging.configure(true, Level.WARN);
        }
        checkNumbers();
        if (ArchiveReplay.wanted(traces, programFiles, compare)) {
            return archive();
        }
        Path trace = traces.get(0);
        Path programFile = programFiles.get(0);
        JointProgram program = ProgramFile.load(programFile);
        if (TraceReader.isF32(trace) && !(rateHz > 0)) {
            throw new UserError(trace + ": a .f32 trace needs --rate HZ");
        }
        double rate = TraceFiles.rateOf(trace, rateHz);
        // a CSV's "# range_nm=" line (or --over-range) gives the transducer's range
        Conditioning conditioning = withOptions(JointMonitor.replayConditioning(program)
                .withRange(TraceFiles.rangeOf(trace)));
        if (lowPassHz >= rate / 2) {
            throw new UserError("--low-pass " + lowPassHz + " Hz must be below half the sample rate (" + rate / 2 + " Hz)");
        }
        List<JointResult> results = new ArrayList<>();
        BufferedWriter out = new BufferedWriter(new OutputStreamWriter(System.out, StandardCharsets.UTF_8), 1 << 16);
        JointEvents events = result -> {
            if (summary) {
                results.add(result);
            } else {
                print(result, out);
            }
        };
        ReplayPreload.stop();
        if (TraceReader.isF32(trace)) {
            // random access: a long trace is replayed on every core, with the single monitor's results
            List<JointResult> judged;
            try (F32Trace samples = F32Trace.open(trace)) {
                judged = replaySplit(samples, program, conditioning, rate);
            } catch (UncheckedIOException e) {
                throw new TraceException(e.getMessage());
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return 1;
            }
            judged.forEach(events::onRundown);
        } else if (StoredTrace.isStored(trace)) {
            // the station's chain state, conditioning and block length as the trace carries them
            StationReplay.replay(trace, program, this::withOptions, BLOCK, events, null, System.err::println);
        } else {
            JointMonitor monitor = new JointMonitor(program, conditioning, rate, BLOCK, events);
            TraceFiles.read(trace, rate, new float[BLOCK], monitor::onSamples);
            monitor.finish();
        }
        if (summary) {
            printSummary(results, System.out);
        }
        out.flush();
        return 0;
    }

    /**
     * The conditioning options given on the command line applied over {@code base} (a stored trace's
     * conditioning, or the program's replay conditioning): an option not given keeps base's value.
     */
    Conditioning withOptions(Conditioning base) {
        return withOptions(base, lowPassHz, overRangeNm, flatLineMs, mainsHz);
    }

    /** As {@link #withOptions(Conditioning)}, for the given option values (0 or NaN: not given). */
    static Conditioning withOptions(Conditioning base, double lowPassHz, double overRangeNm, double flatLineMs,
                                    double mainsHz) {
        Conditioning c = base;
        if (lowPassHz > 0) {
            c = c.withLowPass(lowPassHz);
        }
        if (!Double.isNaN(overRangeNm)) {
            c = c.withRange(overRangeNm).withOverRange(overRangeNm);
        }
        if (mainsHz > 0) {
            c = c.withMains(mainsHz);
        }
        if (flatLineMs > 0) {
            c = c.withFlatLine(flatLineMs);
        }
        return c;
    }

    /** Replays many traces in this one process; see {@link ArchiveReplay}. */
    private int archive() throws ConfigException, IOException {
        ReplayPreload.stop();
        BufferedWriter out = new BufferedWriter(new OutputStreamWriter(System.out, StandardCharsets.UTF_8), 1 << 16);
        PrintWriter err = spec == null ? new PrintWriter(System.err, true) : spec.commandLine().getErr();
        Progress progress = new Progress(System.err, new SystemStationClock(), System.console() != null);
        ArchiveReplay.Settings s = new ArchiveReplay.Settings(traces, programFiles, rateHz, lowPassHz, overRangeNm,
                flatLineMs, mainsHz, summary, compare);
        return new ArchiveReplay(s, out, err, progress).run();
    }

    /** Refuses a rate, range, cut-off or time that is no finite number in its range, before any file is read. */
    private void checkNumbers() {
        NumberOptions.rate("--rate", NumberOptions.given(spec, "--rate"), rateHz);
        NumberOptions.positive("--over-range", NumberOptions.given(spec, "--over-range"), overRangeNm, "N·m");
        NumberOptions.positive("--low-pass", NumberOptions.given(spec, "--low-pass"), lowPassHz, "Hz");
        NumberOptions.positive("--flat-line-ms", NumberOptions.given(spec, "--flat-line-ms"), flatLineMs, "ms");
        if (mainsHz != 0 && mainsHz != 50 && mainsHz != 60) {
            throw new UserError("--mains " + mainsHz + ": the mains frequency is 50 or 60 Hz");
        }
    }

    /** Replays a random-access trace on every core; the results are those of one monitor. */
    private List<JointResult> replaySplit(F32Trace samples, JointProgram program, Conditioning conditioning,
                                          double rate) throws InterruptedException {
        SplitReplay split = new SplitReplay(program, conditioning, rate, BLOCK);
        // a hum canceller's learned state never comes to equal another's: no worker could hand over
        int workers = conditioning.mainsHz() > 0 ? 1
                : split.workersFor(samples.samples(), Runtime.getRuntime().availableProcessors());
        SplitReplay.Outcome outcome = split.run(samples::read, samples.samples(), workers);
        if (verbose) {
            // looked up only here: a logger would otherwise start logging for every replay
            org.slf4j.LoggerFactory.getLogger(ReplayCommand.class).debug(
                    "{} samples on {} workers: {} handovers, {} samples run past segment ends",
                    samples.samples(), outcome.workers(), outcome.handovers(), outcome.samplesPastSegments());
        }
        return outcome.results();
    }

    private static void print(JointResult result, BufferedWriter out) {
        try {
            Map<String, Object> m = JointFields.of(result);
            m.put("start_s", JointFields.round(result.startNs() * 1e-9, 10_000));
            out.write(JsonLines.of(m));
            out.write('\n');
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static void printSummary(List<JointResult> results, PrintStream out) {
        out.printf(Locale.ROOT, "%3s %9s %6s %10s %9s %7s  %s%n", "#", "start_s", "blows", "final_nm", "dur_ms", "verdict", "reasons");
        int go = 0;
        for (int i = 0; i < results.size(); i++) {
            JointResult r = results.get(i);
            if (r.verdict() == hammerstep.joint.Verdict.GO) {
                go++;
            }
            out.printf(Locale.ROOT, "%3d %9.4f %6d %10.2f %9.1f %7s  %s%n", i + 1, r.startNs() * 1e-9, r.blows(),
                    r.finalTorqueNm(), r.durationMs(), r.verdict(), r.reasons().isEmpty() ? "-" : r.reasons());
        }
        out.printf(Locale.ROOT, "%d rundowns, %d GO, %d NO_GO%n", results.size(), go, results.size() - go);
    }
}
