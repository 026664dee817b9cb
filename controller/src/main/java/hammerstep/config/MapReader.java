package hammerstep.config;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * Typed, validating access to one YAML map. Every read notes its key as known; {@link #finish()}
 * reports any key that no read asked for, so a misspelt key is an error rather than a silent
 * default. A failed read records a {@link Problem} and returns a placeholder value, so reading goes
 * on and all problems of a file are reported together.
 */
public final class MapReader {

    private final Problems problems;
    private final ConfigNode node;
    private final Set<String> known = new LinkedHashSet<>();
    private final boolean absent;

    private MapReader(Problems problems, ConfigNode node, boolean absent) {
        this.problems = problems;
        this.node = node;
        this.absent = absent;
    }

    /** A reader over {@code node}; a node that is not a map is reported and reads as empty. */
    public static MapReader of(Problems problems, ConfigNode node) {
        if (node.kind() != ConfigNode.Kind.MAP) {
            problems.add(node, where(node) + "expected a map of keys, got " + node.describe());
            return absent(problems, node);
        }
        return new MapReader(problems, node, false);
    }

    /** A reader standing in for a map already reported missing or wrong: reads give defaults, silently. */
    private static MapReader absent(Problems problems, ConfigNode at) {
        return new MapReader(problems, new ConfigNode(ConfigNode.Kind.MAP, at.path(), at.line(), at.column(), "",
                Map.of(), null), true);
    }

    public ConfigNode node() {
        return node;
    }

    public Problems problems() {
        return problems;
    }

    public boolean has(String key) {
        known.add(key);
        ConfigNode n = node.entries().get(key);
        return n != null && n.kind() != ConfigNode.Kind.NULL;
    }

    /** The raw child, or null when absent. */
    public ConfigNode child(String key) {
        known.add(key);
        return node.entries().get(key);
    }

    private ConfigNode required(String key, String expected) {
        known.add(key);
        ConfigNode n = node.entries().get(key);
        if (n == null || n.kind() == ConfigNode.Kind.NULL) {
            if (!absent) {
                problems.add(n == null ? node : n, "missing key '" + path(key) + "': expected " + expected);
            }
            return null;
        }
        return n;
    }

    public double number(String key) {
        ConfigNode n = required(key, "a number");
        return n == null ? Double.NaN : toNumber(n);
    }

    public double number(String key, double fallback) {
        return has(key) ? toNumber(node.entries().get(key)) : fallback;
    }

    /** A number that must lie in [min, max]. */
    public double number(String key, double fallback, double min, double max) {
        if (!has(key)) {
            return fallback;
        }
        ConfigNode n = node.entries().get(key);
        double v = toNumber(n);
        checkRange(n, v, min, max);
        return v;
    }

    public double requiredNumber(String key, double min, double max) {
        ConfigNode n = required(key, "a number");
        if (n == null) {
            return Double.NaN;
        }
        double v = toNumber(n);
        checkRange(n, v, min, max);
        return v;
    }

    private void checkRange(ConfigNode n, double v, double min, double max) {
        if (!Double.isNaN(v) && (v < min || v > max)) {
            problems.add(n, "'" + n.path() + "' is " + n.text() + ": expected " + range(min, max));
        }
    }

    private static String range(double min, double max) {
        if (max == Double.MAX_VALUE || Double.isInfinite(max)) {
            return min == 0 ? "a number of at least 0" : "a number of at least " + fmt(min);
        }
        return "a number from " + fmt(min) + " to " + fmt(max);
    }

    private static String fmt(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }

    private double toNumber(ConfigNode n) {
        if (n.kind() == ConfigNode.Kind.NUMBER) {
            try {
                double v = Double.parseDouble(n.text());
                if (Double.isFinite(v)) {
                    return v;
                }
            } catch (NumberFormatException e) {
                // YAML's .inf and .nan: reported below
            }
        }
        problems.add(n, "'" + n.path() + "': expected a number, got " + n.describe());
        return Double.NaN;
    }

    public int integer(String key, int min, int max) {
        ConfigNode n = required(key, "a whole number");
        return n == null ? 0 : toInt(n, min, max);
    }

    public int integer(String key, int fallback, int min, int max) {
        return has(key) ? toInt(node.entries().get(key), min, max) : fallback;
    }

    private int toInt(ConfigNode n, int min, int max) {
        if (n.kind() == ConfigNode.Kind.NUMBER) {
            try {
                long v = Long.parseLong(n.text());
                if (v < min || v > max) {
                    problems.add(n, "'" + n.path() + "' is " + n.text() + ": expected a whole number from "
                            + min + " to " + max);
                    return min;
                }
                return (int) v;
            } catch (NumberFormatException e) {
                // falls through to the message below
            }
        }
        problems.add(n, "'" + n.path() + "': expected a whole number, got " + n.describe());
        return min;
    }

    public boolean bool(String key, boolean fallback) {
        if (!has(key)) {
            return fallback;
        }
        ConfigNode n = node.entries().get(key);
        if (n.kind() == ConfigNode.Kind.BOOLEAN) {
            return Boolean.parseBoolean(n.text());
        }
        problems.add(n, "'" + n.path() + "': expected true or false, got " + n.describe());
        return fallback;
    }

    public String string(String key) {
        ConfigNode n = required(key, "a text value");
        return n == null ? "" : toText(n);
    }

    public String string(String key, String fallback) {
        return has(key) ? toText(node.entries().get(key)) : fallback;
    }

    private String toText(ConfigNode n) {
        if (n.isScalar()) {
            return n.text();
        }
        problems.add(n, "'" + n.path() + "': expected a text value, got " + n.describe());
        return "";
    }

    /** One of {@code choices} (matched exactly, lower case as written in files). */
    public String choice(String key, String fallback, List<String> choices) {
        if (!has(key)) {
            return fallback;
        }
        ConfigNode n = node.entries().get(key);
        String v = toText(n);
        if (!v.isEmpty() && !choices.contains(v)) {
            problems.add(n, "'" + n.path() + "' is \"" + v + "\": expected one of " + String.join(", ", choices));
            return fallback;
        }
        return v.isEmpty() ? fallback : v;
    }

    public MapReader map(String key) {
        ConfigNode n = required(key, "a map of keys");
        if (n == null) {
            return absent(problems, new ConfigNode(ConfigNode.Kind.MAP, path(key), node.line(), node.column(), "",
                    Map.of(), null));
        }
        return of(problems, n);
    }

    /** The map under {@code key}, or null when absent. */
    public MapReader optionalMap(String key) {
        return has(key) ? of(problems, node.entries().get(key)) : null;
    }

    /** The items of the list under {@code key}; a missing key reads as an empty list when not required. */
    public List<ConfigNode> list(String key, boolean requiredKey) {
        ConfigNode n = requiredKey ? required(key, "a list") : child(key);
        if (n == null || n.kind() == ConfigNode.Kind.NULL) {
            return List.of();
        }
        if (n.kind() != ConfigNode.Kind.LIST) {
            problems.add(n, "'" + n.path() + "': expected a list, got " + n.describe());
            return List.of();
        }
        return n.items();
    }

    /** Reports every key that was never asked for, naming the keys that are allowed here. */
    public void finish() {
        List<String> unknown = new ArrayList<>();
        for (String key : node.entries().keySet()) {
            if (!known.contains(key)) {
                unknown.add(key);
            }
        }
        for (String key : unknown) {
            ConfigNode n = node.entries().get(key);
            problems.add(n.keyLine(), n.keyColumn(), "unknown key '" + path(key) + "'" + (known.isEmpty() ? ""
                    : " (expected one of: " + String.join(", ", known) + ")"));
        }
    }

    public void problem(String key, String message) {
        ConfigNode n = node.entries().get(key);
        problems.add(n == null ? node : n, message);
    }

    public String path(String key) {
        return node.path().isEmpty() ? key : node.path() + "." + key;
    }

    private static String where(ConfigNode n) {
        return n.path().isEmpty() ? "" : "'" + n.path() + "': ";
    }

    static String lower(String s) {
        return s.toLowerCase(Locale.ROOT);
    }
}
