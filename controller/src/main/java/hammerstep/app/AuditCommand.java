package hammerstep.app;

import ch.qos.logback.classic.Level;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import hammerstep.analysis.Audit;
import hammerstep.analysis.AuditFile;
import hammerstep.analysis.AuditStudy;
import hammerstep.analysis.EstimateFit;
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
import java.time.LocalDate;
import java.time.ZoneOffset;
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
                "(two-sided prediction interval, t-distribution). Beside it, the same audits against the joints'",
                "residual estimate (residual_estimate in the results), and the residual_calibration a program",
                "can carry from that fit (factor, offset, band, audits, date)."})
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
        LocalDate today = LocalDate.now(ZoneOffset.UTC);
        if (json) {
            System.out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT)
                    .writeValueAsString(toJson(report, audits.size(), results, today)));
        } else {
            print(report, audits.size(), System.out, today);
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

    static Map<String, Object> toJson(AuditStudy.Report report, int audits, ResultsFile.Contents results,
                                      LocalDate today) {
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
            o.put("estimate_fit", estimateJson(g.estimate(), today));
            groups.add(o);
        }
        m.put("groups", groups);
        return m;
    }

    /** The fit against the residual estimate and the program key it gives; null when there is none. */
    static Map<String, Object> estimateJson(EstimateFit e, LocalDate today) {
        if (e == null) {
            return null;
        }
        Map<String, Object> o = new LinkedHashMap<>();
        o.put("n", e.n());
        o.put("kind", e.line() == null ? "factor" : "line");
        o.put("r", e.line() == null ? null : num(e.line().r(), 10_000));
        o.put("factor", num(e.factor(), 100_000));
        o.put("offset_nm", num(e.offsetNm(), 1000));
        o.put("se_nm", num(e.seNm(), 10_000));
        o.put("band_nm", num(e.bandNm(), 100));
        o.put("residual_calibration", calibrationKey(e, today));
        return o;
    }

    /** The line to put in the program file. */
    static String calibrationKey(EstimateFit e, LocalDate today) {
        return String.format(Locale.ROOT, "residual_calibration: { factor: %.5f, offset_nm: %.3f, band_nm: %.2f,"
                + " audits: %d, date: %s }", e.factor(), e.offsetNm(), Math.max(0.01, e.bandNm()), e.n(), today);
    }

    /** The dynamic fit and the fit against the residual estimate, side by side. */
    static void printSideBySide(AuditStudy.Group g, double confidence, LocalDate today, PrintStream out) {
        EstimateFit e = g.estimate();
        if (e == null) {
            out.println("  against the residual estimate: fewer than " + EstimateFit.MIN_AUDITS
                    + " audited joints carry one (residual_estimate in the results)");
            return;
        }
        LinearFit f = g.fit();
        String pct = Math.round(confidence * 1000) / 10.0 + " %";
        out.printf(Locale.ROOT, "  %-30s %-30s %s%n", "", "against dynamic torque", "against the residual estimate");
        out.printf(Locale.ROOT, "  %-30s %-30d %d%n", "audited joints", g.n(), e.n());
        out.printf(Locale.ROOT, "  %-30s %-30s %s%n", "r", f == null ? "-" : String.format(Locale.ROOT, "%.4f", f.r()),
                e.line() == null ? "- (factor through zero)" : String.format(Locale.ROOT, "%.4f", e.line().r()));
        out.printf(Locale.ROOT, "  %-30s %-30s %s%n", "audit = a + b * figure",
                f == null ? "-" : String.format(Locale.ROOT, "%.3f + %.5f * dynamic", f.a(), f.b()),
                String.format(Locale.ROOT, "%.3f + %.5f * estimate", e.offsetNm(), e.factor()));
        out.printf(Locale.ROOT, "  %-30s %-30s %.3f N·m%n", "s_e", f == null ? "-"
                : String.format(Locale.ROOT, "%.3f N·m", f.se()), e.seNm());
        out.printf(Locale.ROOT, "  %-30s %-30s ±%.2f N·m%n", "one joint's audit, " + pct, f == null ? "-"
                : String.format(Locale.ROOT, "±%.2f N·m (at the mean)", f.predictionHalfWidth(f.meanX(), confidence)),
                e.bandNm());
        out.println("  program key: " + calibrationKey(e, today));
    }

    static void print(AuditStudy.Report report, int audits, PrintStream out, LocalDate today) {
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
            printSideBySide(g, report.confidence(), today, out);
        }
    }

    private static Double num(double v, int scale) {
        return Double.isFinite(v) ? Math.round(v * scale) / (double) scale : null;
    }
}
