package hammerstep.web;

import java.util.Locale;

/** Escaping and number formats for the pages. */
final class Html {

    private Html() {
    }

    /** Text safe in an HTML element or a quoted attribute. */
    static String esc(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length() + 16);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                case '\'' -> b.append("&#39;");
                default -> b.append(c);
            }
        }
        return b.toString();
    }

    /** A figure with {@code decimals} places; "-" when undefined, "∞" when infinite. */
    static String num(double v, int decimals) {
        if (Double.isNaN(v)) {
            return "-";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "∞" : "-∞";
        }
        return String.format(Locale.ROOT, "%." + decimals + "f", v);
    }
}
