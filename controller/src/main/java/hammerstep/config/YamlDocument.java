package hammerstep.config;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads a YAML file into a tree of {@link ConfigNode}s with line and column, and a content hash
 * of the bytes as loaded (the revision that results carry). Syntax errors, duplicate keys and
 * unreadable files become {@link ConfigException}s in the {@code file:line:column: message} form.
 */
public final class YamlDocument {

    private static final YAMLFactory FACTORY = YAMLFactory.builder().build();
    private static final int MAX_DEPTH = 32;
    /** Longest key or scalar value: ids, names, paths and numbers are far shorter. */
    static final int MAX_SCALAR_CHARS = 4096;

    private final String file;
    private final ConfigNode root;
    private final String revision;

    private YamlDocument(String file, ConfigNode root, String revision) {
        this.file = file;
        this.root = root;
        this.revision = revision;
    }

    public static YamlDocument read(Path path) throws ConfigException {
        String name = path.toString();
        byte[] bytes;
        try {
            bytes = InputFiles.readAll(path, InputFiles.MAX_CONFIG_BYTES);
        } catch (IOException e) {
            String line = InputFiles.describe(path, e);
            throw new ConfigException(new Problem(name, 0, 0, line.substring(name.length() + 2)));
        }
        return parse(name, bytes);
    }

    public static YamlDocument parse(String file, byte[] bytes) throws ConfigException {
        try (JsonParser parser = FACTORY.createParser(bytes)) {
            JsonToken first = parser.nextToken();
            if (first == null) {
                throw new ConfigException(new Problem(file, 1, 1, "the file is empty"));
            }
            ConfigNode root = readValue(file, parser, "", 0);
            if (parser.nextToken() != null) {
                JsonLocation at = parser.currentTokenLocation();
                throw new ConfigException(new Problem(file, at.getLineNr(), at.getColumnNr(),
                        "only one YAML document is allowed per file"));
            }
            return new YamlDocument(file, root, contentHash(bytes));
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            int line = at == null ? 0 : Math.max(at.getLineNr(), 0);
            int column = at == null ? 0 : Math.max(at.getColumnNr(), 0);
            String message = e.getOriginalMessage();
            if (message != null && message.contains("(TAB)")) {
                // the parser marks the end of the line before the tab: name the tab's own line
                int[] tab = indentTab(bytes, Math.max(line, 1));
                if (tab != null) {
                    throw new ConfigException(new Problem(file, tab[0], tab[1],
                            "not valid YAML: a tab in the indentation (indent with spaces)"));
                }
            }
            throw new ConfigException(new Problem(file, line, column, "not valid YAML: " + withoutClassName(oneLine(e.getOriginalMessage()))));
        } catch (IOException e) {
            throw new ConfigException(new Problem(file, 0, 0, "cannot read: " + e.getMessage()));
        }
    }

    private static ConfigNode readValue(String file, JsonParser p, String path, int depth)
            throws IOException, ConfigException {
        JsonLocation at = p.currentTokenLocation();
        int line = at.getLineNr();
        int column = at.getColumnNr();
        if (depth > MAX_DEPTH) {
            throw new ConfigException(new Problem(file, line, column, "nesting deeper than " + MAX_DEPTH + " levels"));
        }
        JsonToken t = p.currentToken();
        if (t.isScalarValue() && p.getTextLength() > MAX_SCALAR_CHARS) {
            throw new ConfigException(new Problem(file, line, column, "a value of " + p.getTextLength()
                    + " characters at '" + path + "'; at most " + MAX_SCALAR_CHARS + " are allowed"));
        }
        switch (t) {
            case START_OBJECT: {
                Map<String, ConfigNode> entries = new LinkedHashMap<>();
                while (p.nextToken() == JsonToken.FIELD_NAME) {
                    JsonLocation keyAt = p.currentTokenLocation();
                    String key = p.currentName();
                    if (key.length() > MAX_SCALAR_CHARS) {
                        throw new ConfigException(new Problem(file, keyAt.getLineNr(), keyAt.getColumnNr(),
                                "a key of " + key.length() + " characters; at most " + MAX_SCALAR_CHARS + " are allowed"));
                    }
                    if (entries.containsKey(key)) {
                        throw new ConfigException(new Problem(file, keyAt.getLineNr(), keyAt.getColumnNr(),
                                "duplicate key '" + join(path, key) + "'"));
                    }
                    p.nextToken();
                    entries.put(key, readValue(file, p, join(path, key), depth + 1)
                            .atKey(keyAt.getLineNr(), keyAt.getColumnNr()));
                }
                return new ConfigNode(ConfigNode.Kind.MAP, path, line, column, "", entries, null);
            }
            case START_ARRAY: {
                List<ConfigNode> items = new ArrayList<>();
                int index = 0;
                while (p.nextToken() != JsonToken.END_ARRAY) {
                    items.add(readValue(file, p, path + "[" + index++ + "]", depth + 1));
                }
                return new ConfigNode(ConfigNode.Kind.LIST, path, line, column, "", null, items);
            }
            case VALUE_NUMBER_INT:
            case VALUE_NUMBER_FLOAT:
                return new ConfigNode(ConfigNode.Kind.NUMBER, path, line, column, p.getText(), null, null);
            case VALUE_TRUE:
            case VALUE_FALSE:
                return new ConfigNode(ConfigNode.Kind.BOOLEAN, path, line, column, p.getText(), null, null);
            case VALUE_NULL:
                return new ConfigNode(ConfigNode.Kind.NULL, path, line, column, "", null, null);
            default:
                return new ConfigNode(ConfigNode.Kind.STRING, path, line, column, p.getText(), null, null);
        }
    }

    /** The parser's message without its indented echo of the file, on one line. */
    /** Drops a leading Java exception class name ("java.io.CharConversionException: ...") that means nothing to a line engineer. */
    static String withoutClassName(String message) {
        return message.replaceFirst("^([a-z][a-z0-9_]*\\.)+[A-Z][A-Za-z0-9_]*(Exception|Error): ", "");
    }

    static String oneLine(String message) {
        StringBuilder sb = new StringBuilder();
        for (String line : message.split("\\R")) {
            if (line.isBlank() || Character.isWhitespace(line.charAt(0))) {
                continue;
            }
            if (sb.length() > 0) {
                sb.append("; ");
            }
            sb.append(line.strip());
        }
        return sb.length() == 0 ? message.strip() : sb.toString();
    }

    /**
     * Line and column (1-based) of the first tab in the indentation of a line at or after
     * {@code fromLine}, or null when there is none.
     */
    static int[] indentTab(byte[] bytes, int fromLine) {
        int line = 1;
        int column = 1;
        boolean indent = true;
        for (byte c : bytes) {
            if (c == '\n') {
                line++;
                column = 1;
                indent = true;
                continue;
            }
            if (indent && line >= fromLine) {
                if (c == '\t') {
                    return new int[] {line, column};
                }
                if (c != ' ' && c != '\r') {
                    indent = false;
                }
            }
            column++;
        }
        return null;
    }

    private static String join(String path, String key) {
        return path.isEmpty() ? key : path + "." + key;
    }

    private static String contentHash(byte[] bytes) {
        try {
            byte[] digest = MessageDigest.getInstance("SHA-256").digest(bytes);
            return HexFormat.of().formatHex(digest, 0, 6);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required by every Java platform", e);
        }
    }

    public String file() {
        return file;
    }

    public ConfigNode root() {
        return root;
    }

    /** First 12 hex digits of the SHA-256 of the file's bytes: changes whenever the file does. */
    public String revision() {
        return revision;
    }

    /** Convenience for tests and inline documents. */
    public static YamlDocument parse(String file, String text) throws ConfigException {
        return parse(file, text.getBytes(StandardCharsets.UTF_8));
    }
}
