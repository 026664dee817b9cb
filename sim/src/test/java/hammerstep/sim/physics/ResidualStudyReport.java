package hammerstep.sim.physics;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.Function;

/**
 * The study's figures from its runs ({@link ResidualStudy}): calibration ratios, error against the truth per set,
 * tool family and joint without audits and with five audits per program, and the plots (docs/residual-estimate.md).
 */
final class ResidualStudyReport {

    /** Audits per program for the fitted figure. */
    static final int AUDITS = 5;

    /** A figure the station could set against the residual torque. */
    enum Figure {
        MAX_PEAK("max peak", true, ResidualStudy.Run::maxPeakNm),
        LAST_PEAK("last peak", true, ResidualStudy.Run::lastPeakNm),
        MEAN_LAST3("mean of last 3", true, ResidualStudy.Run::meanLast3Nm),
        MEAN_TORQUE3("impulse/width, last 3", true, ResidualStudy.Run::meanTorque3Nm),
        TURNING3("impulse/width, last 3 turning (oracle)", true, ResidualStudy.Run::turning3Nm),
        ESTIMATE("estimate", false, ResidualStudy.Run::estimateNm);

        final String label;
        final boolean scaled;
        final Function<ResidualStudy.Run, Double> value;

        Figure(String label, boolean scaled, Function<ResidualStudy.Run, Double> value) {
            this.label = label;
            this.scaled = scaled;
            this.value = value;
        }

        double raw(ResidualStudy.Run r) {
            double v = value.apply(r);
            return Double.isFinite(v) && v > 0 ? v : Double.NaN;
        }
    }

    /** Mean, 2σ and count of relative errors, with the runs that had no value. */
    record Stats(int n, double mean, double twoSigma, int none) {

        /** |mean| + 2σ: the half-width of the band that holds about 95 % of the runs. */
        double bound() {
            return Math.abs(mean) + twoSigma;
        }

        static Stats of(List<Double> errors, int none) {
            int n = errors.size();
            if (n == 0) {
                return new Stats(0, Double.NaN, Double.NaN, none);
            }
            double s = 0;
            for (double e : errors) {
                s += e;
            }
            double mean = s / n;
            double v = 0;
            for (double e : errors) {
                v += (e - mean) * (e - mean);
            }
            double sd = n > 1 ? Math.sqrt(v / (n - 1)) : 0;
            return new Stats(n, mean, 2 * sd, none);
        }

        String cell() {
            return n == 0 ? "–" : String.format(Locale.ROOT, "%+.1f ± %.1f", 100 * mean, 100 * twoSigma)
                    + (none > 0 ? " (" + none + " none)" : "");
        }
    }

    private final List<ResidualStudy.Run> runs;
    private final Map<Figure, Double> ratios = new EnumMap<>(Figure.class);

    ResidualStudyReport(List<ResidualStudy.Run> runs) {
        this.runs = runs;
        for (Figure f : Figure.values()) {
            double s = 0;
            int n = 0;
            for (ResidualStudy.Run r : runs) {
                double v = f.raw(r);
                if (r.program().set() == ResidualStudy.Set.CALIBRATION && !Double.isNaN(v)) {
                    s += r.truthNm() / v;
                    n++;
                }
            }
            ratios.put(f, !f.scaled ? 1.0 : n > 0 ? s / n : Double.NaN);
        }
    }

    /** The calibration-set ratio truth ÷ figure (1 for the estimate, which is in N·m already). */
    double ratio(Figure f) {
        return ratios.get(f);
    }

    /** The figure as a residual torque, N·m: scaled by its calibration ratio; NaN when the run has none. */
    double scaled(Figure f, ResidualStudy.Run r) {
        return ratio(f) * f.raw(r);
    }

    /** Errors without audits of the runs {@code runs}. */
    Stats withoutAudits(Figure f, List<ResidualStudy.Run> some) {
        List<Double> errors = new ArrayList<>();
        int none = 0;
        for (ResidualStudy.Run r : some) {
            double v = scaled(f, r);
            if (Double.isNaN(v)) {
                none++;
            } else {
                errors.add(v / r.truthNm() - 1);
            }
        }
        return Stats.of(errors, none);
    }

    /**
     * Errors with five audits per program: a factor and offset fitted (least squares, truth on figure) on the first
     * five runs of each program that have a value, judged on the program's other runs.
     */
    Stats withAudits(Figure f, List<ResidualStudy.Run> some) {
        Map<ResidualStudy.Program, List<ResidualStudy.Run>> byProgram = new LinkedHashMap<>();
        for (ResidualStudy.Run r : some) {
            byProgram.computeIfAbsent(r.program(), k -> new ArrayList<>()).add(r);
        }
        List<Double> errors = new ArrayList<>();
        int none = 0;
        for (List<ResidualStudy.Run> program : byProgram.values()) {
            List<ResidualStudy.Run> valued = new ArrayList<>();
            for (ResidualStudy.Run r : program) {
                if (Double.isNaN(f.raw(r))) {
                    none++;
                } else {
                    valued.add(r);
                }
            }
            if (valued.size() <= AUDITS) {
                none += valued.size();
                continue;
            }
            double[] fit = fit(f, valued.subList(0, AUDITS));
            for (ResidualStudy.Run r : valued.subList(AUDITS, valued.size())) {
                errors.add((fit[0] * f.raw(r) + fit[1]) / r.truthNm() - 1);
            }
        }
        return Stats.of(errors, none);
    }

    /** Least squares truth = a·figure + b; a factor alone (through zero) when the figures do not spread. */
    static double[] fit(Figure f, List<ResidualStudy.Run> audits) {
        double sx = 0;
        double sy = 0;
        double sxx = 0;
        double sxy = 0;
        int n = audits.size();
        for (ResidualStudy.Run r : audits) {
            double x = f.raw(r);
            double y = r.truthNm();
            sx += x;
            sy += y;
            sxx += x * x;
            sxy += x * y;
        }
        double den = n * sxx - sx * sx;
        if (den <= 1e-9 * n * sxx) {
            return new double[] {sxy / sxx, 0};
        }
        double a = (n * sxy - sx * sy) / den;
        return new double[] {a, (sy - a * sx) / n};
    }

    List<ResidualStudy.Run> runs(ResidualStudy.Set set) {
        List<ResidualStudy.Run> out = new ArrayList<>();
        for (ResidualStudy.Run r : runs) {
            if (r.program().set() == set) {
                out.add(r);
            }
        }
        return out;
    }

    /** Runs of a set grouped by a key. */
    Map<String, List<ResidualStudy.Run>> groups(ResidualStudy.Set set, Function<ResidualStudy.Run, String> key) {
        Map<String, List<ResidualStudy.Run>> out = new LinkedHashMap<>();
        for (ResidualStudy.Run r : runs(set)) {
            out.computeIfAbsent(key.apply(r), k -> new ArrayList<>()).add(r);
        }
        return out;
    }

    /** The tables of docs/residual-estimate.md, markdown. */
    String tables() {
        StringBuilder b = new StringBuilder();
        b.append("Calibration ratios (truth ÷ figure, mean over the calibration set):");
        for (Figure f : Figure.values()) {
            if (f.scaled) {
                b.append(String.format(Locale.ROOT, " %s %.3f;", f.label, ratio(f)));
            }
        }
        b.append("\n");
        for (ResidualStudy.Set set : ResidualStudy.Set.values()) {
            for (boolean audits : new boolean[] {false, true}) {
                b.append("\n").append(set == ResidualStudy.Set.CALIBRATION ? "Calibration set" : "Held-out set")
                        .append(audits ? ", with five audits per program" : ", without audits")
                        .append(": error in %, mean ± 2σ (runs without a value)\n\n");
                header(b, "family / joint");
                row(b, "**all**", runs(set), audits);
                if (set == ResidualStudy.Set.HELD_OUT) {
                    for (Map.Entry<String, List<ResidualStudy.Run>> e : groups(set, r -> r.program().law()).entrySet()) {
                        row(b, "law " + e.getKey(), e.getValue(), audits);
                    }
                }
                for (Map.Entry<String, List<ResidualStudy.Run>> e
                        : groups(set, r -> r.program().family() + " / " + r.program().joint()).entrySet()) {
                    row(b, e.getKey(), e.getValue(), audits);
                }
            }
        }
        return b.toString();
    }

    private static void header(StringBuilder b, String first) {
        b.append("| ").append(first).append(" | runs |");
        for (Figure f : Figure.values()) {
            b.append(' ').append(f.label).append(" |");
        }
        b.append("\n|---|---|");
        for (int i = 0; i < Figure.values().length; i++) {
            b.append("---|");
        }
        b.append("\n");
    }

    private void row(StringBuilder b, String label, List<ResidualStudy.Run> some, boolean audits) {
        b.append("| ").append(label).append(" | ").append(some.size()).append(" |");
        for (Figure f : Figure.values()) {
            b.append(' ').append((audits ? withAudits(f, some) : withoutAudits(f, some)).cell()).append(" |");
        }
        b.append("\n");
    }

    /** The runs as CSV, one line each, for a second look without simulating again. */
    String csv() {
        StringBuilder b = new StringBuilder("set,family,tool,joint,law,seed,truth_nm,results,truth_blows,turning_blows,"
                + "max_peak_nm,last_peak_nm,mean_last3_nm,mean_torque3_nm,turning3_nm,estimate_nm,no_value\n");
        for (ResidualStudy.Run r : runs) {
            ResidualStudy.Program p = r.program();
            b.append(String.format(Locale.ROOT, "%s,%s,%s,%s,%s,%d,%.2f,%d,%d,%d,%.2f,%.2f,%.2f,%.2f,%.2f,%.2f,%s%n",
                    p.set(), p.family(), p.tool(), p.joint(), p.law(), r.seed(), r.truthNm(), r.results(), r.truthBlows(),
                    r.turningBlows(), r.maxPeakNm(), r.lastPeakNm(), r.meanLast3Nm(), r.meanTorque3Nm(), r.turning3Nm(),
                    r.estimateNm(), r.noValue() == null ? "" : r.noValue().replace(',', ';')));
        }
        return b.toString();
    }

    /** Runs the study ({@code seeds} per program) and writes the plots to {@code docs}. */
    public static void main(String[] args) throws Exception {
        int seeds = args.length > 0 ? Integer.parseInt(args[0]) : 10;
        Path docs = Path.of(args.length > 1 ? args[1] : "docs");
        List<ResidualStudy.Program> programs = new ArrayList<>(ResidualStudy.calibration());
        programs.addAll(ResidualStudy.heldOut());
        List<ResidualStudy.Run> runs = new ArrayList<>();
        long t0 = System.nanoTime();
        for (ResidualStudy.Program p : programs) {
            for (long seed = 1; seed <= seeds; seed++) {
                runs.add(ResidualStudy.rundown(p, seed));
            }
            System.err.printf(Locale.ROOT, "%s: %d runs, %.0f s%n", p.name(), runs.size(), (System.nanoTime() - t0) * 1e-9);
        }
        ResidualStudyReport report = new ResidualStudyReport(runs);
        Path csv = Files.isDirectory(Path.of("sim", "target")) ? Path.of("sim", "target", "residual-study.csv")
                : Path.of("residual-study.csv");
        Files.writeString(csv, report.csv());
        System.out.printf(Locale.ROOT, "%d programs × %d seeds, %.0f s%n%n", programs.size(), seeds,
                (System.nanoTime() - t0) * 1e-9);
        System.out.println(report.tables());
        writePlots(report, docs);
    }

    static void writePlots(ResidualStudyReport report, Path docs) throws IOException {
        for (ResidualStudy.Set set : ResidualStudy.Set.values()) {
            String name = set == ResidualStudy.Set.CALIBRATION ? "residual-estimate-calibration.svg"
                    : "residual-estimate-held-out.svg";
            Files.writeString(docs.resolve(name), ResidualPlot.svg(report, set));
        }
    }
}
