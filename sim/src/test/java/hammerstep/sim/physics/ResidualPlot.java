package hammerstep.sim.physics;

import java.util.List;
import java.util.Locale;

/** Estimate against truth, one panel per figure, as SVG (docs/residual-estimate.md). */
final class ResidualPlot {

    private static final int PANEL = 300;
    private static final int MARGIN = 45;
    private static final String[] FAMILIES = {"cam", "twin hammer", "dog clutch", "oil pulse"};
    private static final String[] COLOURS = {"#1f77b4", "#d62728", "#2ca02c", "#9467bd"};

    private ResidualPlot() {
    }

    static String svg(ResidualStudyReport report, ResidualStudy.Set set) {
        List<ResidualStudy.Run> runs = report.runs(set);
        ResidualStudyReport.Figure[] figures = ResidualStudyReport.Figure.values();
        int cols = 3;
        int rows = (figures.length + cols - 1) / cols;
        int w = cols * (PANEL + MARGIN) + MARGIN;
        int h = rows * (PANEL + MARGIN) + MARGIN + 30;
        double top = 0;
        for (ResidualStudy.Run r : runs) {
            top = Math.max(top, r.truthNm());
        }
        top = Math.ceil(top * 1.3 / 100) * 100;
        StringBuilder b = new StringBuilder();
        b.append(String.format(Locale.ROOT, "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" height=\"%d\" "
                + "font-family=\"sans-serif\" font-size=\"11\">%n<rect width=\"100%%\" height=\"100%%\" fill=\"white\"/>%n", w, h));
        b.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"18\" font-size=\"14\">%s set: figure as residual torque "
                + "(scaled by its calibration ratio) against the truth's breakaway residual, N·m; dashed ±7 %%</text>%n",
                MARGIN, set == ResidualStudy.Set.CALIBRATION ? "Calibration" : "Held-out"));
        for (int i = 0; i < FAMILIES.length; i++) {
            b.append(String.format(Locale.ROOT, "<circle cx=\"%d\" cy=\"%d\" r=\"4\" fill=\"%s\"/><text x=\"%d\" y=\"%d\">%s</text>%n",
                    MARGIN + i * 110, h - 12, COLOURS[i], MARGIN + 8 + i * 110, h - 8, FAMILIES[i]));
        }
        for (int k = 0; k < figures.length; k++) {
            ResidualStudyReport.Figure f = figures[k];
            int x0 = MARGIN + (k % cols) * (PANEL + MARGIN);
            int y0 = 30 + (k / cols) * (PANEL + MARGIN);
            b.append(String.format(Locale.ROOT, "<g><rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"none\" stroke=\"#888\"/>%n",
                    x0, y0, PANEL, PANEL));
            b.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\">%s</text>%n", x0 + 4, y0 + 14, f.label));
            line(b, x0, y0, top, 1.0, "#444", "");
            line(b, x0, y0, top, 1.07, "#999", "4,3");
            line(b, x0, y0, top, 0.93, "#999", "4,3");
            for (int t = 0; t <= top; t += (int) Math.max(100, Math.round(top / 400) * 100)) {
                double px = x0 + PANEL * t / top;
                double py = y0 + PANEL - PANEL * t / top;
                b.append(String.format(Locale.ROOT, "<text x=\"%.0f\" y=\"%d\" text-anchor=\"middle\">%d</text>"
                        + "<text x=\"%d\" y=\"%.0f\" text-anchor=\"end\">%d</text>%n", px, y0 + PANEL + 13, t, x0 - 3, py + 4, t));
            }
            int shown = 0;
            for (ResidualStudy.Run r : runs) {
                double v = report.scaled(f, r);
                if (Double.isNaN(v)) {
                    continue;
                }
                shown++;
                double px = x0 + PANEL * Math.min(r.truthNm(), top) / top;
                double py = y0 + PANEL - PANEL * Math.min(v, top) / top;
                b.append(String.format(Locale.ROOT, "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"2\" fill=\"%s\" fill-opacity=\"0.6\"/>%n",
                        px, py, colour(r.program().family())));
            }
            if (shown == 0) {
                b.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\">no values</text>%n",
                        x0 + PANEL / 2, y0 + PANEL / 2));
            }
            b.append("</g>\n");
        }
        b.append("</svg>\n");
        return b.toString();
    }

    /** The line y = slope·x from the origin to the panel's edge. */
    private static void line(StringBuilder b, int x0, int y0, double top, double slope, String colour, String dash) {
        double xb = slope > 1 ? top / slope : top;
        double yb = slope * xb;
        b.append(String.format(Locale.ROOT, "<line x1=\"%d\" y1=\"%d\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"%s\"%s/>%n",
                x0, y0 + PANEL, x0 + PANEL * xb / top, y0 + PANEL - PANEL * yb / top, colour,
                dash.isEmpty() ? "" : " stroke-dasharray=\"" + dash + "\""));
    }

    private static String colour(String family) {
        for (int i = 0; i < FAMILIES.length; i++) {
            if (FAMILIES[i].equals(family)) {
                return COLOURS[i];
            }
        }
        return "#000";
    }
}
