package hammerstep.results;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;

import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Map;

/**
 * Writes the plain values that result fields are made of (maps, lists, strings, numbers,
 * booleans, null) as one line of JSON, with jackson-core alone: replay prints thousands of lines
 * and should not pay for object mapping at start.
 */
public final class JsonLines {

    private static final JsonFactory FACTORY = new JsonFactory();

    private JsonLines() {
    }

    public static String of(Map<String, ?> value) {
        StringWriter out = new StringWriter(256);
        try (JsonGenerator g = FACTORY.createGenerator(out)) {
            write(g, value);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return out.toString();
    }

    private static void write(JsonGenerator g, Object v) throws IOException {
        if (v == null) {
            g.writeNull();
        } else if (v instanceof Map<?, ?> m) {
            g.writeStartObject();
            for (Map.Entry<?, ?> e : m.entrySet()) {
                g.writeFieldName(String.valueOf(e.getKey()));
                write(g, e.getValue());
            }
            g.writeEndObject();
        } else if (v instanceof List<?> l) {
            g.writeStartArray();
            for (Object o : l) {
                write(g, o);
            }
            g.writeEndArray();
        } else if (v instanceof String s) {
            g.writeString(s);
        } else if (v instanceof Integer i) {
            g.writeNumber(i);
        } else if (v instanceof Long l) {
            g.writeNumber(l);
        } else if (v instanceof Double d) {
            g.writeNumber(d);
        } else if (v instanceof Float f) {
            g.writeNumber(f);
        } else if (v instanceof Boolean b) {
            g.writeBoolean(b);
        } else if (v instanceof Number n) {
            g.writeNumber(n.toString());
        } else {
            g.writeString(v.toString());
        }
    }
}
