package hammerstep.web;

import java.util.Locale;

/**
 * A small SVG writer for the view's charts: a plot area with linear axes, lines, dots, bands and
 * labels, written as text (no script, no outside reference). Colours are set by CSS classes of the
 * page ({@code .curve}, {@code .peak}, {@code .limit}, {@code .target}, {@code .shutoff}, ...).
 */
final class Svg {

    static final int LEFT = 56;
    static final int RIGHT = 12;
    static final int TOP = 12;
    static final int BOTTOM = 36;

    private final StringBuilder b = new StringBuilder(8192);
    private final int width;
    private final int height;
    private final double x0;
    private final double x1;
    private final double y0;
    private final double y1;

    /** A chart of {@code width × height} pixels showing x in [x0, x1] and y in [y0, y1]. */
    Svg(int width, int height, double x0, double x1, double y0, double y1, String label) {
        this.width = width;
        this.height = height;
        this.x0 = x0;
        this.x1 = x1 > x0 ? x1 : x0 + 1;
        this.y0 = y0;
        this.y1 = y1 > y0 ? y1 : y0 + 1;
        b.append("<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"chart\" viewBox=\"0 0 ").append(width).append(' ')
                .append(height).append("\" role=\"img\" aria-label=\"").append(Html.esc(label)).append("\">");
        b.append("<rect class=\"plot\" x=\"").append(LEFT).append("\" y=\"").append(TOP).append("\" width=\"")
                .append(width - LEFT - RIGHT).append("\" height=\"").append(height - TOP - BOTTOM).append("\"/>");
    }

    double px(double x) {
        return LEFT + (x - x0) / (x1 - x0) * (width - LEFT - RIGHT);
    }

    double py(double y) {
        return height - BOTTOM - (y - y0) / (y1 - y0) * (height - TOP - BOTTOM);
    }

    /** Tick labels on both axes, about five each, and the axis titles. */
    Svg axes(String xTitle, String yTitle) {
        for (double v : ticks(x0, x1)) {
            b.append("<text class=\"tick\" x=\"").append(f(px(v))).append("\" y=\"").append(height - BOTTOM + 14)
                    .append("\" text-anchor=\"middle\">").append(tick(v)).append("</text>");
        }
        for (double v : ticks(y0, y1)) {
            b.append("<line class=\"grid\" x1=\"").append(LEFT).append("\" x2=\"").append(width - RIGHT)
                    .append("\" y1=\"").append(f(py(v))).append("\" y2=\"").append(f(py(v))).append("\"/>");
            b.append("<text class=\"tick\" x=\"").append(LEFT - 4).append("\" y=\"").append(f(py(v) + 4))
                    .append("\" text-anchor=\"end\">").append(tick(v)).append("</text>");
        }
        b.append("<text class=\"axis\" x=\"").append((width + LEFT) / 2).append("\" y=\"").append(height - 4)
                .append("\" text-anchor=\"middle\">").append(Html.esc(xTitle)).append("</text>");
        b.append("<text class=\"axis\" x=\"12\" y=\"").append(TOP + (height - TOP - BOTTOM) / 2)
                .append("\" text-anchor=\"middle\" transform=\"rotate(-90 12 ").append(TOP + (height - TOP - BOTTOM) / 2)
                .append(")\">").append(Html.esc(yTitle)).append("</text>");
        return this;
    }

    /** A horizontal line at {@code y} across the plot, labelled at its right end. */
    Svg hline(double y, String cls, String label) {
        if (y < y0 || y > y1) {
            return this;
        }
        b.append("<line class=\"").append(cls).append("\" x1=\"").append(LEFT).append("\" x2=\"").append(width - RIGHT)
                .append("\" y1=\"").append(f(py(y))).append("\" y2=\"").append(f(py(y))).append("\"/>");
        b.append("<text class=\"label ").append(cls).append("\" x=\"").append(width - RIGHT - 4).append("\" y=\"")
                .append(f(py(y) - 3)).append("\" text-anchor=\"end\">").append(Html.esc(label)).append("</text>");
        return this;
    }

    /** A vertical line at {@code x}. */
    Svg vline(double x, String cls, String label) {
        if (x < x0 || x > x1) {
            return this;
        }
        b.append("<line class=\"").append(cls).append("\" x1=\"").append(f(px(x))).append("\" x2=\"").append(f(px(x)))
                .append("\" y1=\"").append(TOP).append("\" y2=\"").append(height - BOTTOM).append("\"/>");
        b.append("<text class=\"label ").append(cls).append("\" x=\"").append(f(px(x) + 3)).append("\" y=\"")
                .append(TOP + 12).append("\">").append(Html.esc(label)).append("</text>");
        return this;
    }

    /** A shaded band between {@code ya} and {@code yb}. */
    Svg band(double ya, double yb, String cls) {
        double a = Math.max(y0, Math.min(ya, yb));
        double c = Math.min(y1, Math.max(ya, yb));
        if (c <= a) {
            return this;
        }
        b.append("<rect class=\"").append(cls).append("\" x=\"").append(LEFT).append("\" y=\"").append(f(py(c)))
                .append("\" width=\"").append(width - LEFT - RIGHT).append("\" height=\"").append(f(py(a) - py(c)))
                .append("\"/>");
        return this;
    }

    /** A polyline through the points. */
    Svg line(double[] xs, double[] ys, int n, String cls) {
        b.append("<polyline class=\"").append(cls).append("\" points=\"");
        for (int i = 0; i < n; i++) {
            b.append(f(px(xs[i]))).append(',').append(f(py(ys[i]))).append(' ');
        }
        b.append("\"/>");
        return this;
    }

    /** A dot at each point, with a title (tooltip). */
    Svg dot(double x, double y, String cls, String title) {
        b.append("<circle class=\"").append(cls).append("\" cx=\"").append(f(px(x))).append("\" cy=\"")
                .append(f(py(y))).append("\" r=\"3.5\"><title>").append(Html.esc(title)).append("</title></circle>");
        return this;
    }

    /** A bar from y0 to {@code y} over [xa, xb). */
    Svg bar(double xa, double xb, double y, String cls, String title) {
        b.append("<rect class=\"").append(cls).append("\" x=\"").append(f(px(xa) + 0.5)).append("\" y=\"")
                .append(f(py(y))).append("\" width=\"").append(f(Math.max(1, px(xb) - px(xa) - 1)))
                .append("\" height=\"").append(f(py(y0) - py(y))).append("\"><title>").append(Html.esc(title))
                .append("</title></rect>");
        return this;
    }

    String end() {
        return b.append("</svg>").toString();
    }

    static double[] ticks(double lo, double hi) {
        double span = hi - lo;
        double raw = span / 5;
        double mag = Math.pow(10, Math.floor(Math.log10(raw)));
        double step = raw / mag < 1.5 ? mag : raw / mag < 3.5 ? 2 * mag : raw / mag < 7.5 ? 5 * mag : 10 * mag;
        double first = Math.ceil(lo / step) * step;
        int n = (int) Math.floor((hi - first) / step + 1e-9) + 1;
        double[] t = new double[Math.max(0, Math.min(n, 20))];
        for (int i = 0; i < t.length; i++) {
            t[i] = first + i * step;
        }
        return t;
    }

    private static String tick(double v) {
        double r = Math.abs(v) < 1e-9 ? 0 : v;
        return r == Math.rint(r) ? Long.toString((long) r) : String.format(Locale.ROOT, "%.2f", r);
    }

    static String f(double v) {
        return String.format(Locale.ROOT, "%.1f", v);
    }
}
