package hammerstep.results;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.networknt.schema.Error;
import com.networknt.schema.InputFormat;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;

/**
 * Validates messages against the JSON Schemas in {@code docs/schema/}, chosen by their {@code schema} field.
 *
 * <p>Two views: {@link #problems} is the subscriber's (the published schema, open to fields added within
 * v1); {@link #assertValid} is the station's own, stricter one: its messages must also carry no field
 * the schema does not declare ({@link #undeclared}), so that whatever the station sends is documented.
 */
public final class MessageSchemas {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final SchemaRegistry REGISTRY = SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_2020_12);
    private static final Map<String, Schema> CACHE = new ConcurrentHashMap<>();

    private MessageSchemas() {
    }

    public static Path schemaDir() {
        Path p = Path.of("").toAbsolutePath();
        while (p != null && !Files.isDirectory(p.resolve("docs/schema"))) {
            p = p.getParent();
        }
        if (p == null) {
            throw new IllegalStateException("docs/schema not found above " + Path.of("").toAbsolutePath());
        }
        return p.resolve("docs/schema");
    }

    /** The problems of one message; empty when it is valid. */
    public static List<String> problems(byte[] message) {
        String text = new String(message, StandardCharsets.UTF_8);
        String name;
        try {
            JsonNode node = JSON.readTree(text);
            name = node.path("schema").asText("");
        } catch (IOException e) {
            return List.of("not JSON: " + e.getMessage());
        }
        if (!name.matches("hammerstep\\.[a-z]+\\.v1")) {
            return List.of("unknown schema field \"" + name + "\"");
        }
        Schema schema = CACHE.computeIfAbsent(name, n -> {
            Path file = schemaDir().resolve(n.substring("hammerstep.".length()) + ".json");
            try {
                return REGISTRY.getSchema(Files.readString(file), InputFormat.JSON);
            } catch (IOException e) {
                throw new IllegalStateException("cannot read " + file, e);
            }
        });
        List<Error> errors = schema.validate(text, InputFormat.JSON);
        return errors.stream().map(Error::toString).toList();
    }

    /**
     * The paths of fields in a message (nested objects and array items included) that its schema does
     * not declare; empty when every field is declared or the message has no known schema.
     */
    public static List<String> undeclared(byte[] message) {
        JsonNode node;
        try {
            node = JSON.readTree(message);
        } catch (IOException e) {
            return List.of();
        }
        String name = node.path("schema").asText("");
        if (!name.matches("hammerstep\\.[a-z]+\\.v1")) {
            return List.of();
        }
        Path file = schemaDir().resolve(name.substring("hammerstep.".length()) + ".json");
        JsonNode schema;
        try {
            schema = JSON.readTree(file.toFile());
        } catch (IOException e) {
            throw new IllegalStateException("cannot read " + file, e);
        }
        List<String> out = new ArrayList<>();
        undeclared(schema, node, "", out);
        return out;
    }

    private static void undeclared(JsonNode schema, JsonNode value, String path, List<String> out) {
        if (value.isObject() && schema.has("properties")) {
            JsonNode properties = schema.get("properties");
            for (Iterator<String> names = value.fieldNames(); names.hasNext(); ) {
                String field = names.next();
                if (properties.has(field)) {
                    undeclared(properties.get(field), value.get(field), path + "/" + field, out);
                } else {
                    out.add(path + "/" + field);
                }
            }
        } else if (value.isArray() && schema.has("items")) {
            for (int i = 0; i < value.size(); i++) {
                undeclared(schema.get("items"), value.get(i), path + "/" + i, out);
            }
        }
    }

    /** Valid for a subscriber, and every field declared in the schema (what the station itself must send). */
    public static void assertValid(byte[] message) {
        List<String> problems = new ArrayList<>(problems(message));
        undeclared(message).forEach(f -> problems.add(f + ": not declared in the schema"));
        if (!problems.isEmpty()) {
            throw new AssertionError("message does not match its schema: " + problems + "\n"
                    + new String(message, StandardCharsets.UTF_8));
        }
    }
}
