package hammerstep.results;

import java.util.regex.Pattern;

/**
 * Who produced a message: the plant site, the line and the station on it. Each part is one
 * MQTT topic level, so it may hold letters, digits, {@code .}, {@code _} and {@code -} only.
 */
public record StationId(String site, String line, String station) {

    private static final Pattern LEVEL = Pattern.compile("[A-Za-z0-9._-]{1,64}");

    public StationId {
        check("site", site);
        check("line", line);
        check("station", station);
    }

    private static void check(String what, String value) {
        if (value == null || !LEVEL.matcher(value).matches()) {
            throw new IllegalArgumentException(what + " \"" + value
                    + "\": expected 1 to 64 letters, digits, '.', '_' or '-'");
        }
    }

    /** True when {@code value} is usable as one part of a station's identity. */
    public static boolean validLevel(String value) {
        return value != null && LEVEL.matcher(value).matches();
    }

    @Override
    public String toString() {
        return site + "/" + line + "/" + station;
    }
}
