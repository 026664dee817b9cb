package hammerstep.app;

import ch.qos.logback.classic.Level;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import hammerstep.analysis.Capability;
import hammerstep.analysis.CapabilityStudy;
import hammerstep.analysis.InputException;
import hammerstep.analysis.JointRecord;
import hammerstep.analysis.ResultsFile;
import hammerstep.plot.CapabilityCharts;
import hammerstep.plot.Picture;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;

/** {@code hammerstep stats}: capability of final torque and blow count from joint results. */
@Command(name = "stats", mixinStandardHelpOptions = true,
        description = {"Capability figures per program and per position from joint results (JSONL, one joint message a line).",
                "Cm = (USL - LSL) / 6s, Cmk = min(USL - mean, mean - LSL) / 3s with the sample standard deviation,"
                        + " for the final torque and the blow count; limits from each result's own 'limits'.",
                "Flags a figure below 1.67 and a study of fewer than 25 joints (machine capability as usually asked,"
                        + " VDI/VDE 2645-2 style)."})
public final class StatsCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "RESULTS", description = "joint results, JSON lines or a subscriber's log (mosquitto_sub -v); other message kinds and"
                    + " commands are skipped, a message repeated under its id is used once")
    Path results;

    @Option(names = "--json", description = "print one JSON document instead of a table")
    boolean json;

    @Option(names = "--plot", paramLabel = "FILE", description = "draw histograms and run charts to FILE (.png or .svg)")
    Path plot;

    @Option(names = "--program", paramLabel = "ID", description = "only this program")
    String program;

    @Option(names = "--no-positions", description = "figures per program only, not per position")
    boolean noPositions;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    @Override
    public Integer call() throws IOException {
        Logging.configure(verbose, Level.WARN);
        ResultsFile.Contents contents;
        try {
            contents = ResultsFile.read(results);
        } catch (InputException e) {
            throw new UserError(e.getMessage());
        }
        List<JointRecord> joints = contents.joints();
        if (program != null) {
            joints = joints.stream().filter(j -> j.program().equals(program)).toList();
        }
        if (joints.isEmpty()) {
            throw new UserError(results + ": no joint results" + (program == null ? "" : " of program " + program)
                    + (contents.leftOut().isEmpty() ? "" : " (" + contents.leftOut() + ")"));
        }
        if (plot != null && Picture.formatOf(plot) == null) {
            throw new UserError("--plot " + plot + ": the picture's name must end in .png or .svg");
        }
        CapabilityStudy.Report report = CapabilityStudy.of(joints, !noPositions);
        if (json) {
            ObjectMapper mapper = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
            System.out.println(mapper.writeValueAsString(toJson(report, contents)));
        } else {
            printTable(report, contents, System.out);
        }
        if (plot != null) {
            CapabilityCharts.write(report, plot);
            if (!json) {
                System.out.println("plot written to " + plot);
            }
        }
        return 0;
    }

    static Map<String, Object> toJson(CapabilityStudy.Report report, ResultsFile.Contents read) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("joints", report.joints());
        m.put("sensor_fault_excluded", report.sensorFaults());
        m.put("other_lines_skipped", read.skipped());
        m.put("duplicates_dropped", read.duplicates());
        m.put("unreadable_lines_skipped", read.unreadable());
        m.put("required_index", Capability.REQUIRED);
        m.put("mixed_limits", report.programsWithMixedLimits());
        List<Map<String, Object>> groups = new ArrayList<>();
        for (CapabilityStudy.Entry e : report.entries()) {
            Map<String, Object> g = new LinkedHashMap<>();
            g.put("program", e.program());
            if (e.perPosition()) {
                g.put("position", e.position());
            }
            g.put("n", e.torque().n());
            g.put("mean_nm", num(e.torque().mean(), 1000));
            g.put("sd_nm", num(e.torque().sd(), 10_000));
            g.put("cm", num(e.torque().cm(), 1000));
            g.put("cmk", num(e.torque().cmk(), 1000));
            g.put("blows_mean", num(e.blows().mean(), 1000));
            g.put("blows_sd", num(e.blows().sd(), 10_000));
            g.put("blows_cm", num(e.blows().cm(), 1000));
            g.put("blows_cmk", num(e.blows().cmk(), 1000));
            Map<String, Object> torque = new LinkedHashMap<>();
            torque.put("min", e.limits().torqueMinNm());
            torque.put("max", e.limits().torqueMaxNm());
            Map<String, Object> blows = new LinkedHashMap<>();
            blows.put("min", e.limits().blowsMin());
            blows.put("max", e.limits().blowsMax());
            Map<String, Object> limits = new LinkedHashMap<>();
            limits.put("torque_nm", torque);
            limits.put("blows", blows);
            g.put("limits", limits);
            g.put("mixed_limits", e.mixedLimits());
            g.put("flags", e.flags().stream().map(Enum::name).toList());
            groups.add(g);
        }
        m.put("groups", groups);
        return m;
    }

    /** Rounded for reading; null when the figure is undefined (n &lt; 2) or infinite (no spread). */
    private static Double num(double v, int scale) {
        return Double.isFinite(v) ? Math.round(v * scale) / (double) scale : null;
    }

    static void printTable(CapabilityStudy.Report report, ResultsFile.Contents read, PrintStream out) {
        out.printf(Locale.ROOT, "%-16s %-8s %4s %9s %8s %7s %7s  %6s %6s %7s %7s  %s%n", "program", "position", "n",
                "mean_nm", "sd_nm", "Cm", "Cmk", "blows", "sd", "Cm", "Cmk", "flags");
        for (CapabilityStudy.Entry e : report.entries()) {
            Capability t = e.torque();
            Capability b = e.blows();
            out.printf(Locale.ROOT, "%-16s %-8s %4d %9.2f %8s %7s %7s  %6.2f %6s %7s %7s  %s%n", e.program(),
                    e.perPosition() ? e.position() : "all", t.n(), t.mean(), fmt(t.sd(), "%.3f"), fmt(t.cm(), "%.2f"),
                    fmt(t.cmk(), "%.2f"), b.mean(), fmt(b.sd(), "%.2f"), fmt(b.cm(), "%.2f"), fmt(b.cmk(), "%.2f"),
                    e.flags().isEmpty() ? "-" : String.join(",", e.flags().stream().map(Enum::name).toList()));
            if (!e.perPosition() && e.mixedLimits()) {
                out.println("    judged against " + e.limits());
            }
        }
        for (String p : report.programsWithMixedLimits()) {
            out.println("warning: program " + p + " was judged against more than one window; figures are given per window");
        }
        out.printf(Locale.ROOT, "%d joints%s%s; figures below %.2f or fewer than %d joints are flagged"
                        + " (machine capability as usually asked, VDI/VDE 2645-2 style)%n", report.joints(),
                report.sensorFaults() > 0 ? ", " + report.sensorFaults() + " with a sensor fault left out" : "",
                read.leftOut().isEmpty() ? "" : ", " + read.leftOut(),
                Capability.REQUIRED, Capability.MIN_STUDY);
    }

    private static String fmt(double v, String pattern) {
        if (Double.isNaN(v)) {
            return "-";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "inf" : "-inf";
        }
        return String.format(Locale.ROOT, pattern, v);
    }
}
