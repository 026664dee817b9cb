package hammerstep.app;

import picocli.CommandLine;

/**
 * Number options as the engineer typed them: read leniently (text that is no number becomes NaN,
 * so the command, not the parser, reports it in one line) and checked with messages that name the
 * option, the text given and what is expected.
 */
final class NumberOptions {

    /** The slowest and fastest sample rates a trace can sensibly have. */
    static final double MIN_RATE_HZ = 100;
    static final double MAX_RATE_HZ = 10e6;

    private NumberOptions() {
    }

    /** Reads any text: a number as Java reads it, anything else as NaN (refused by the checks below). */
    static final class Lenient implements CommandLine.ITypeConverter<Double> {
        @Override
        public Double convert(String value) {
            try {
                return Double.parseDouble(value.strip());
            } catch (NumberFormatException e) {
                return Double.NaN;
            }
        }
    }

    /** The text given for {@code option}, or null when the command line does not name it. */
    static String given(CommandLine.Model.CommandSpec spec, String option) {
        CommandLine.ParseResult parsed = spec == null ? null : spec.commandLine().getParseResult();
        CommandLine.Model.OptionSpec o = parsed == null ? null : parsed.matchedOption(option);
        return o == null ? null : o.stringValues().get(o.stringValues().size() - 1);
    }

    /** A sample rate: a finite number of Hz from 100 Hz to 10 MHz. */
    static void rate(String option, String text, double hz) {
        if (text != null && !(Double.isFinite(hz) && hz >= MIN_RATE_HZ && hz <= MAX_RATE_HZ)) {
            throw new UserError(option + " " + text + ": expected a sample rate in Hz from 100 to 10000000 (10 MHz)");
        }
    }

    /** A setting that must be a finite number above zero when given. */
    static void positive(String option, String text, double value, String unit) {
        if (text != null && !(Double.isFinite(value) && value > 0)) {
            throw new UserError(option + " " + text + ": expected a number of " + unit + " above 0");
        }
    }
}
