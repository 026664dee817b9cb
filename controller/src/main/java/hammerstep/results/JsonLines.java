package hammerstep.results;

import java.util.List;
import java.util.Map;

/**
 * Writes the plain values that result fields are made of (maps, lists, strings, numbers,
 * booleans, null) as one line of JSON.
 *
 * <p>Written by hand rather than through a JSON library's generator: the values are few and
 * plain, and the generator's class loading and interpretation roughly doubled what the first 500
 * lines of a fresh JVM cost {@code replay} (docs/design.md, "Replay speed"). The text is
 * exactly what jackson-core's generator writes with its default settings (numbers as
 * {@code Double.toString}, NaN and infinities as strings, control characters escaped, other
 * characters as they are); {@code JsonLinesTest} holds it to that.
 */
public final class JsonLines {

    private static final char[] HEX = "0123456789ABCDEF".toCharArray();

    private JsonLines() {
    }

    public static String of(Map<String, ?> value) {
        StringBuilder out = new StringBuilder(256);
        write(out, value);
        return out.toString();
    }

    private static void write(StringBuilder out, Object v) {
        if (v == null) {
            out.append("null");
        } else if (v instanceof Map<?, ?> m) {
            out.append('{');
            boolean first = true;
            for (Map.Entry<?, ?> e : m.entrySet()) {
                if (!first) {
                    out.append(',');
                }
                first = false;
                string(out, String.valueOf(e.getKey()));
                out.append(':');
                write(out, e.getValue());
            }
            out.append('}');
        } else if (v instanceof List<?> l) {
            out.append('[');
            for (int i = 0, n = l.size(); i < n; i++) {
                if (i > 0) {
                    out.append(',');
                }
                write(out, l.get(i));
            }
            out.append(']');
        } else if (v instanceof String s) {
            string(out, s);
        } else if (v instanceof Double d) {
            number(out, Double.isFinite(d), Double.toString(d));
        } else if (v instanceof Float f) {
            number(out, Float.isFinite(f), Float.toString(f));
        } else if (v instanceof Number || v instanceof Boolean) {
            out.append(v);
        } else {
            string(out, v.toString());
        }
    }

    /** A number as it reads; one without a JSON form (NaN, infinities) as a string. */
    private static void number(StringBuilder out, boolean finite, String text) {
        if (finite) {
            out.append(text);
        } else {
            string(out, text);
        }
    }

    private static void string(StringBuilder out, String s) {
        out.append('"');
        int done = 0;
        for (int i = 0, n = s.length(); i < n; i++) {
            char c = s.charAt(i);
            if (c >= 0x20 && c != '"' && c != '\\') {
                continue;
            }
            out.append(s, done, i).append('\\');
            switch (c) {
                case '"', '\\' -> out.append(c);
                case '\b' -> out.append('b');
                case '\t' -> out.append('t');
                case '\n' -> out.append('n');
                case '\f' -> out.append('f');
                case '\r' -> out.append('r');
                default -> out.append("u00").append(HEX[c >> 4]).append(HEX[c & 0xF]);
            }
            done = i + 1;
        }
        out.append(s, done, s.length()).append('"');
    }
}
