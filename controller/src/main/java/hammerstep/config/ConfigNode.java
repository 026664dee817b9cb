package hammerstep.config;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A node of a parsed YAML document that remembers where it stood in its file. Scalars keep their
 * text and whether YAML typed them as a number, boolean or string, so readers can report
 * {@code expected a number, got "abc"} at the right line and column.
 */
public final class ConfigNode {

    public enum Kind { MAP, LIST, STRING, NUMBER, BOOLEAN, NULL }

    private final Kind kind;
    private final String path;
    private final int line;
    private final int column;
    private final String text;
    private final Map<String, ConfigNode> entries;
    private final List<ConfigNode> items;
    private int keyLine;
    private int keyColumn;

    ConfigNode(Kind kind, String path, int line, int column, String text,
               Map<String, ConfigNode> entries, List<ConfigNode> items) {
        this.kind = kind;
        this.path = path;
        this.line = line;
        this.column = column;
        this.text = text;
        this.entries = entries == null ? Map.of() : Collections.unmodifiableMap(new LinkedHashMap<>(entries));
        this.items = items == null ? List.of() : List.copyOf(items);
        this.keyLine = line;
        this.keyColumn = column;
    }

    ConfigNode atKey(int line, int column) {
        this.keyLine = line;
        this.keyColumn = column;
        return this;
    }

    /** Where the key that holds this node was written (the node's own place for list items and the root). */
    public int keyLine() {
        return keyLine;
    }

    public int keyColumn() {
        return keyColumn;
    }

    public Kind kind() {
        return kind;
    }

    /** Dotted path from the document root, e.g. {@code torque.min} or {@code passes[1].program}. */
    public String path() {
        return path;
    }

    public int line() {
        return line;
    }

    public int column() {
        return column;
    }

    /** The scalar's text as written; empty for maps and lists. */
    public String text() {
        return text;
    }

    public Map<String, ConfigNode> entries() {
        return entries;
    }

    public List<ConfigNode> items() {
        return items;
    }

    public boolean isScalar() {
        return kind == Kind.STRING || kind == Kind.NUMBER || kind == Kind.BOOLEAN;
    }

    /** How the node reads in a message: {@code a map}, {@code a list} or the scalar quoted. */
    public String describe() {
        return switch (kind) {
            case MAP -> "a map";
            case LIST -> "a list";
            case NULL -> "nothing";
            default -> "\"" + text + "\"";
        };
    }
}
