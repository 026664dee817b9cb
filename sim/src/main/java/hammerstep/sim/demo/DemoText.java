package hammerstep.sim.demo;

import java.io.OutputStream;
import java.io.PrintStream;
import java.nio.charset.Charset;
import java.util.Locale;

/** Small text rules the demo's output shares: plurals, cutting a line to a width, an ASCII form. */
final class DemoText {

    private DemoText() {
    }

    /** "1 blow", "3 blows". */
    static String count(long n, String singular) {
        return n + " " + (n == 1 ? singular : singular + "s");
    }

    /** The line cut to {@code width} characters, ending in "..." when cut. */
    static String cut(String line, int width) {
        if (line.length() <= width) {
            return line;
        }
        return width <= 3 ? line.substring(0, Math.max(0, width)) : line.substring(0, width - 3) + "...";
    }

    /** True when text in this character set can show the demo's units (N·m) and arrows (→). */
    static boolean canShowUnits(Charset charset) {
        return charset.newEncoder().canEncode("N·m → ±×°");
    }

    /** The text with the demo's non-ASCII characters spelt in ASCII: {@code N·m} as {@code N.m}, {@code →} as {@code ->}. */
    static String ascii(String text) {
        StringBuilder b = null;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            String r = switch (c) {
                case '·' -> ".";
                case '→' -> "->";
                case '±' -> "+/-";
                case '×' -> "x";
                case '°' -> " deg";
                case 'µ' -> "u";
                case '…' -> "...";
                case '−' -> "-";
                default -> null;
            };
            if (r == null && c > 0x7e && c != '\u001b') {
                r = "?";
            }
            if (r != null && b == null) {
                b = new StringBuilder(text.length() + 8).append(text, 0, i);
            }
            if (b != null) {
                if (r != null) {
                    b.append(r);
                } else {
                    b.append(c);
                }
            }
        }
        return b == null ? text : b.toString();
    }

    /**
     * The character set the console or the locale gives standard output (Java 17 writes
     * {@code System.out} in {@code sun.stdout.encoding} when set, else in the default charset).
     */
    static Charset stdoutCharset() {
        String name = System.getProperty("sun.stdout.encoding");
        try {
            return name != null ? Charset.forName(name) : Charset.defaultCharset();
        } catch (RuntimeException e) {
            return Charset.defaultCharset();
        }
    }

    /**
     * {@code out} itself when its character set shows N·m, else a stream that spells the demo's
     * text in ASCII first (N.m), so that {@code LANG=C} does not print {@code N?m}.
     */
    static PrintStream forCharset(PrintStream out, Charset charset) {
        return canShowUnits(charset) ? out : new AsciiStream(out, charset);
    }

    /** A print stream whose text goes through {@link #ascii(String)}. */
    private static final class AsciiStream extends PrintStream {

        AsciiStream(OutputStream out, Charset charset) {
            super(out, true, charset);
        }

        @Override
        public void print(String s) {
            super.print(s == null ? null : ascii(s));
        }

        @Override
        public void print(Object o) {
            print(String.valueOf(o));
        }

        @Override
        public void println(String s) {
            synchronized (this) {
                print(s);
                println();
            }
        }

        @Override
        public void println(Object o) {
            println(String.valueOf(o));
        }

        @Override
        public PrintStream format(Locale l, String format, Object... args) {
            print(String.format(l, format, args));
            return this;
        }

        @Override
        public PrintStream format(String format, Object... args) {
            print(String.format(format, args));
            return this;
        }
    }
}
