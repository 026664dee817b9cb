package hammerstep.sim.broker;

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
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;

/** Validates messages against the JSON Schemas in {@code docs/schema/}, chosen by their {@code schema} field. */
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

    public static void assertValid(byte[] message) {
        List<String> problems = problems(message);
        if (!problems.isEmpty()) {
            throw new AssertionError("message does not match its schema: " + problems + "\n"
                    + new String(message, StandardCharsets.UTF_8));
        }
    }
}
