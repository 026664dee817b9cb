package hammerstep.app;

import ch.qos.logback.classic.Level;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import hammerstep.analysis.Audit;
import hammerstep.analysis.AuditFile;
import hammerstep.analysis.AuditStudy;
import hammerstep.analysis.InputException;
import hammerstep.analysis.LinearFit;
import hammerstep.analysis.ResultsFile;
import hammerstep.analysis.StudentT;
import hammerstep.plot.AuditChart;
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

/** {@code hammerstep audit}: residual-torque audits against the joints' dynamic figures. */
@Command(name = "audit", mixinStandardHelpOptions = true,
        description = {"Compares residual-torque audits with the joints' dynamic final torque.",
                "Pairs the audits (CSV: joint_id or part_serial+position, method, residual_nm) with the joints'",
                "dynamic final torque from results (JSONL), and reports per program and method the",
                "correlation, the mean offset, the line residual = a + b * dynamic with its standard errors and,",
                "with --spec, the dynamic window that keeps one joint's residual torque in its specification",
                "(two-sided prediction interval, t-distribution)."})
public final class AuditCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "AUDITS", description = "audit readings, CSV (see docs/engineer-guide.md)")
    Path auditsFile;

    @Parameters(index = "1", paramLabel = "RESULTS", description = "joint results, JSON lines")
    Path resultsFile;

    @Option(names = "--spec", paramLabel = "MIN:MAX", description = "residual-torque specification, N·m")
    String spec;

    @Option(names = "--confidence", paramLabel = "P", description = "two-sided confidence of the prediction interval (default: ${DEFAULT-VALUE})")
    double confidence = 0.95;

    @Option(names = "--json", description = "print one JSON document instead of text")
    boolean json;

    @Option(names = "--plot", paramLabel = "FILE", description = "draw residual against dynamic torque with the fit and its prediction band (.png or .svg)")
    Path plot;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    @Override
    public Integer call() throws IOException {
        Logging.configure(verbose, Level.WARN);
        double specMin = Double.NaN;
        double specMax = Double.NaN;
        if (spec != null) {
            String[] parts = spec.split(":", -1);
            try {
                if (parts.length != 2) {
                    throw new NumberFormatException();
                }
                specMin = Double.parseDouble(parts[0].strip());
                specMax = Double.parseDouble(parts[1].strip());
            } catch (NumberFormatException e) {
                throw new UserError("--spec '" + spec + "': expected MIN:MAX in N·m, e.g. 170:230");
            }
            if (!(specMin >= 0 && specMax > specMin && Double.isFinite(specMax))) {
                throw new UserError("--spec '" + spec + "': MIN must be at least 0 and below MAX");
            }
        }
        if (!(confidence > 0.5 && confidence < 1)) {
            throw new UserError("--confidence " + confidence + ": give a probability between 0.5 and 1, e.g. 0.95");
        }
        if (plot != null && Picture.formatOf(plot) == null) {
            throw new UserError("--plot " + plot + ": the picture's name must end in .png or .svg");
        }
        List<Audit> audits;
        ResultsFile.Contents results;
        try {
            audits = AuditFile.read(auditsFile);
            results = ResultsFile.read(resultsFile);
        } catch (InputException e) {
            throw new UserError(e.getMessage());
        }
        if (audits.isEmpty()) {
            throw new UserError(auditsFile + ": no audit readings");
        }
        AuditStudy.Report report = AuditStudy.of(audits, results.joints(), specMin, specMax, confidence);
        if (report.groups().isEmpty()) {
            throw new UserError("none of the " + audits.size() + " audits matches a joint result in " + resultsFile
                    + " (by joint_id, or by part_serial and position)");
        }
        if (json) {
            System.out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT)
                    .writeValueAsString(toJson(report, audits.size(), results)));
        } else {
            print(report, audits.size(), System.out);
            if (!results.leftOut().isEmpty()) {
                System.out.println(resultsFile + ": " + results.joints().size() + " joint results used, "
                        + results.leftOut());
            }
        }
        if (plot != null) {
            AuditChart.write(report, plot);
            if (!json) {
                System.out.println("plot written to " + plot);
            }
        }
        return 0;
    }

    static Map<String, Object> toJson(AuditStudy.Report report, int audits, ResultsFile.Contents results) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("audits", audits);
        m.put("joint_results", results.joints().size());
        m.put("duplicates_dropped", results.duplicates());
        m.put("other_lines_skipped", results.skipped());
        m.put("unreadable_lines_skipped", results.unreadable());
        m.put("unpaired", report.unpaired().size());
        m.put("unpaired_lines", report.unpaired().stream().map(Audit::line).toList());
        m.put("confidence", report.confidence());
        if (report.hasSpec()) {
            m.put("spec_nm", Map.of("min", report.specMinNm(), "max", report.specMaxNm()));
        }
        List<Map<String, Object>> groups = new ArrayList<>();
        for (AuditStudy.Group g : report.groups()) {
            Map<String, Object> o = new LinkedHashMap<>();
            o.put("program", g.program());
            o.put("method", g.method().key());
            o.put("n", g.n());
            o.put("mean_dynamic_nm", num(g.meanDynamicNm(), 1000));
            o.put("mean_residual_nm", num(g.meanResidualNm(), 1000));
            o.put("mean_offset_nm", num(g.meanOffsetNm(), 1000));
            o.put("sd_offset_nm", num(g.sdOffsetNm(), 10_000));
            LinearFit f = g.fit();
            o.put("r", f == null ? null : num(f.r(), 10_000));
            o.put("a_nm", f == null ? null : num(f.a(), 1000));
            o.put("b", f == null ? null : num(f.b(), 100_000));
            o.put("se_nm", f == null ? null : num(f.se(), 10_000));
            o.put("se_a_nm", f == null ? null : num(f.seA(), 10_000));
            o.put("se_b", f == null ? null : num(f.seB(), 100_000));
            o.put("t", f == null ? null : num(StudentT.quantile(0.5 + report.confidence() / 2, f.n() - 2), 10_000));
            o.put("slope_significant", g.slopeSignificant());
            if (g.window() != null) {
                Map<String, Object> w = new LinkedHashMap<>();
                w.put("min_nm", num(g.window().minNm(), 100));
                w.put("max_nm", num(g.window().maxNm(), 100));
                w.put("extrapolated", g.window().extrapolated());
                o.put("dynamic_window", w);
            } else {
                o.put("dynamic_window", null);
            }
            o.put("current_window_nm", Map.of("min", g.currentLimits().torqueMinNm(), "max", g.currentLimits().torqueMaxNm()));
            o.put("audited_dynamic_nm", Map.of("min", g.minDynamicNm(), "max", g.maxDynamicNm()));
            o.put("note", g.note());
            groups.add(o);
        }
        m.put("groups", groups);
        return m;
    }

    static void print(AuditStudy.Report report, int audits, PrintStream out) {
        out.printf(Locale.ROOT, "%d audits, %d paired with joint results%s%n", audits, audits - report.unpaired().size(),
                report.unpaired().isEmpty() ? "" : "; not paired: lines " + report.unpaired().stream()
                        .limit(20).map(a -> Integer.toString(a.line())).toList());
        for (AuditStudy.Group g : report.groups()) {
            out.printf(Locale.ROOT, "%nprogram %s, %s, n = %d%n", g.program(), g.method().key(), g.n());
            out.printf(Locale.ROOT, "  dynamic mean %.2f N·m, residual mean %.2f N·m, offset residual - dynamic %+.2f N·m (s %s)%n",
                    g.meanDynamicNm(), g.meanResidualNm(), g.meanOffsetNm(),
                    Double.isNaN(g.sdOffsetNm()) ? "-" : String.format(Locale.ROOT, "%.2f", g.sdOffsetNm()));
            LinearFit f = g.fit();
            if (f != null) {
                out.printf(Locale.ROOT, "  r = %.4f; residual = %.3f + %.5f * dynamic  (SE a %.3f N·m, SE b %.5f, s_e %.3f N·m)%n",
                        f.r(), f.a(), f.b(), f.seA(), f.seB(), f.se());
            }
            if (g.window() != null) {
                out.printf(Locale.ROOT, "  dynamic window %.1f .. %.1f N·m keeps one joint's residual torque in %.1f .. %.1f N·m"
                                + " at %.0f %% (prediction interval, t with %d dof); current window %.1f .. %.1f N·m%n",
                        g.window().minNm(), g.window().maxNm(), report.specMinNm(), report.specMaxNm(),
                        report.confidence() * 100, f.n() - 2, g.currentLimits().torqueMinNm(), g.currentLimits().torqueMaxNm());
            }
            if (!g.note().isEmpty()) {
                out.println("  " + g.note());
            }
        }
    }

    private static Double num(double v, int scale) {
        return Double.isFinite(v) ? Math.round(v * scale) / (double) scale : null;
    }
}
