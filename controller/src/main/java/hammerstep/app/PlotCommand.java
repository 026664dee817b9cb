package hammerstep.app;

import ch.qos.logback.classic.Level;
import hammerstep.config.ConfigException;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.plot.Picture;
import hammerstep.plot.TraceChart;
import hammerstep.signal.Conditioner;
import hammerstep.signal.Conditioning;
import hammerstep.trace.TraceException;
import hammerstep.trace.StationReplay;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceFiles;
import hammerstep.trace.TraceReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;

/** {@code hammerstep plot}: a picture of a trace as the controller's own chain judged it. */
@Command(name = "plot", mixinStandardHelpOptions = true,
        description = {"Draws a trace's torque over time with each blow's peak marked.",
                "Blows are found by the controller's own signal chain, as in replay; the program's window, target and",
                "shut-off line are drawn too. PNG or SVG by the name of --out."})
public final class PlotCommand implements Callable<Integer> {

    /** Longest trace drawn: 100 million samples (400 MB of float). */
    static final long MAX_SAMPLES = 100_000_000L;

    @Parameters(index = "0", paramLabel = "TRACE", description = "trace: CSV, raw float32 (.f32, needs --rate) or stored (.hst)")
    Path trace;

    @Option(names = "--program", required = true, paramLabel = "FILE", description = "joint program (YAML)")
    Path programFile;

    @Option(names = "--out", required = true, paramLabel = "FILE", description = "picture to write: .png or .svg")
    Path out;

    @Option(names = "--rate", paramLabel = "HZ", description = "sample rate; required for .f32, overrides CSV metadata")
    double rateHz;

    @Option(names = "--rundown", paramLabel = "N", description = "draw only rundown N (1-based) with a margin around it")
    int rundown;

    @Option(names = "--from-ms", paramLabel = "MS", description = "draw from this time after the trace's start")
    double fromMs = Double.NaN;

    @Option(names = "--to-ms", paramLabel = "MS", description = "draw up to this time after the trace's start")
    double toMs = Double.NaN;

    @Option(names = "--low-pass", paramLabel = "HZ", description = "2nd-order Butterworth low-pass before detection (as replay)")
    double lowPassHz;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    @Override
    public Integer call() throws ConfigException, TraceException, IOException {
        Logging.configure(verbose, Level.WARN);
        if (Picture.formatOf(out) == null) {
            throw new UserError("--out " + out + ": the picture's name must end in .png or .svg");
        }
        JointProgram program = ProgramFile.load(programFile);
        if (TraceReader.isF32(trace) && !(rateHz > 0)) {
            throw new UserError(trace + ": a .f32 trace needs --rate HZ");
        }
        double rate = TraceFiles.rateOf(trace, rateHz);
        if (lowPassHz >= rate / 2) {
            throw new UserError("--low-pass " + lowPassHz + " Hz must be below half the sample rate (" + rate / 2 + " Hz)");
        }
        Conditioning conditioning = JointMonitor.replayConditioning(program).withLowPass(lowPassHz);
        List<JointResult> results = new ArrayList<>();
        JointEvents events = results::add;
        JointMonitor monitor = new JointMonitor(program, conditioning, rate, ReplayCommand.BLOCK, events);
        Recording rec = new Recording();
        float[] block = new float[ReplayCommand.BLOCK];
        if (StoredTrace.isStored(trace)) {
            // judged as the station judged it; every sample, lead included, drawn
            StationReplay.replay(trace, program, c -> lowPassHz > 0 ? c.withLowPass(lowPassHz) : c,
                    ReplayCommand.BLOCK, events, rec::add, System.err::println);
        } else {
            TraceFiles.read(trace, rate, block, (s, o, l, t) -> {
                rec.add(s, o, l, t);
                monitor.onSamples(s, o, l, t);
            });
            monitor.finish();
        }
        if (rec.length == 0) {
            throw new UserError(trace + ": no samples to draw");
        }
        refuseUndrawable(rec, rate);
        long first = rec.firstNs;
        long last = first + Math.round((rec.length - 1) * 1e9 / rate);
        long from = first;
        long to = last;
        String title = trace.getFileName() + ", program " + program.id() + ": " + TraceChart.summary(results);
        if (rundown > 0) {
            if (rundown > results.size()) {
                throw new UserError("--rundown " + rundown + ": the trace has " + results.size() + " rundowns");
            }
            JointResult r = results.get(rundown - 1);
            long margin = Math.max(Math.round(0.1 * (r.endNs() - r.startNs())), 5_000_000L);
            from = Math.max(first, r.startNs() - margin);
            to = Math.min(last, r.endNs() + margin);
            title = trace.getFileName() + " rundown " + rundown + ", program " + program.id() + ": "
                    + TraceChart.summary(List.of(r));
        }
        if (!Double.isNaN(fromMs)) {
            from = first + Math.round(fromMs * 1e6);
        }
        if (!Double.isNaN(toMs)) {
            to = first + Math.round(toMs * 1e6);
        }
        if (!(to > from)) {
            throw new UserError("nothing to draw between " + (from - first) * 1e-6 + " ms and " + (to - first) * 1e-6 + " ms");
        }
        try {
            TraceChart.write(new TraceChart.Data(title, rec.samples, rec.length, rate, first, program, results, from, to), out);
        } catch (IOException e) {
            throw new UserError(e.getMessage());
        }
        System.out.println(out + ": " + TraceChart.summary(results));
        return 0;
    }

    /**
     * A sample that is not a finite number, or beyond any transducer's range, cannot be drawn on a
     * torque axis (replay judges the rundown holding it SENSOR_FAULT): refused, naming the first one.
     */
    private void refuseUndrawable(Recording rec, double rate) {
        for (int i = 0; i < rec.length; i++) {
            float v = rec.samples[i];
            if (!Float.isFinite(v) || Math.abs(v) >= Conditioner.ABSURD_NM) {
                throw new UserError(String.format(Locale.ROOT, "%s: sample %d (at %.4f s) is %s N·m: cannot draw it"
                        + " (not a finite torque within any transducer's range)", trace, i, i / rate, v));
            }
        }
    }

    /** The whole trace in memory for drawing (plotting is offline, not the station's path). */
    private static final class Recording {
        float[] samples = new float[1 << 16];
        int length;
        long firstNs;

        void add(float[] s, int o, int l, long t) {
            if (length == 0) {
                firstNs = t;
            }
            if ((long) length + l > MAX_SAMPLES) {
                throw new UserError("trace longer than " + MAX_SAMPLES + " samples: cut it or draw a part with replay first");
            }
            if (length + l > samples.length) {
                samples = Arrays.copyOf(samples, Math.max(length + l, samples.length * 2));
            }
            System.arraycopy(s, o, samples, length, l);
            length += l;
        }
    }
}
