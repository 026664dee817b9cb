package hammerstep.mqtt;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.json.JsonMapper;

import java.io.IOException;
import java.util.Iterator;
import java.util.Set;
import java.util.regex.Pattern;

/**
 * Checks a command before anything acts on it: size, JSON shape, known fields, value formats, and
 * a message expiry for commands that change the station (so one queued while the station was
 * offline cannot act later than its sender meant). Pure and thread-safe.
 */
public final class CommandParser {

    /** The outcome: exactly one of {@code command} and {@code errorCode} is set. */
    public record Result(Command command, String errorCode, String message) {

        static Result ok(Command c) {
            return new Result(c, null, null);
        }

        static Result error(String code, String message) {
            return new Result(null, code, message);
        }

        public boolean ok() {
            return command != null;
        }
    }

    private static final ObjectMapper JSON = JsonMapper.builder()
            .enable(JsonParser.Feature.STRICT_DUPLICATE_DETECTION).build();
    private static final Set<String> KNOWN = Set.of("part", "end-part", "reload", "status");
    private static final Pattern TEXT_ID = Pattern.compile("[\\x21-\\x7E]{1,64}");

    static {
        JSON.getFactory().setStreamReadConstraints(StreamReadConstraints.builder().maxNestingDepth(8).build());
    }

    private final int maxBytes;
    private final long maxExpiryS;

    /**
     * @param maxBytes   largest payload taken; larger is {@code TOO_LARGE}
     * @param maxExpiryS largest message expiry taken for a command that changes the station
     */
    public CommandParser(int maxBytes, long maxExpiryS) {
        this.maxBytes = maxBytes;
        this.maxExpiryS = maxExpiryS;
    }

    /**
     * @param name    the command's topic level
     * @param expiryS the message expiry the broker passed on (remaining seconds), or null when none
     */
    public Result parse(String name, byte[] payload, Long expiryS) {
        if (payload.length > maxBytes) {
            return Result.error("TOO_LARGE", "command of " + payload.length + " bytes; at most " + maxBytes);
        }
        if (!KNOWN.contains(name)) {
            return Result.error("UNKNOWN_COMMAND", "unknown command \"" + clip(name)
                    + "\": expected part, end-part, reload or status");
        }
        boolean changes = !name.equals("status");
        JsonNode body;
        try {
            body = payload.length == 0 ? JSON.createObjectNode() : JSON.readTree(payload);
        } catch (com.fasterxml.jackson.core.JacksonException e) {
            return Result.error("MALFORMED", "not valid JSON: " + clip(e.getOriginalMessage()));
        } catch (IOException e) {
            return Result.error("MALFORMED", "not valid JSON");
        }
        if (body == null || !body.isObject()) {
            return Result.error("MALFORMED", "expected a JSON object");
        }
        if (changes) {
            if (expiryS == null) {
                return Result.error("EXPIRY_REQUIRED", "set an MQTT message expiry (1 to " + maxExpiryS
                        + " s) on " + name + ", so it cannot act late");
            }
            if (expiryS < 1 || expiryS > maxExpiryS) {
                return Result.error("INVALID", "message expiry " + expiryS + " s: expected 1 to " + maxExpiryS);
            }
        }
        return switch (name) {
            case "part" -> part(body);
            case "end-part" -> endPart(body);
            case "reload" -> only(body, Set.of()) == null ? Result.ok(new Command.Reload()) : unknownField(body, Set.of());
            default -> only(body, Set.of()) == null ? Result.ok(new Command.Status()) : unknownField(body, Set.of());
        };
    }

    private static Result part(JsonNode body) {
        Set<String> allowed = Set.of("serial", "model");
        if (only(body, allowed) != null) {
            return unknownField(body, allowed);
        }
        String serial = text(body, "serial");
        String model = text(body, "model");
        if (serial == null || model == null) {
            return Result.error("INVALID", "part needs \"serial\" and \"model\": 1 to 64 printable characters, no spaces");
        }
        return Result.ok(new Command.StartPart(serial, model));
    }

    private static Result endPart(JsonNode body) {
        Set<String> allowed = Set.of("reason");
        if (only(body, allowed) != null) {
            return unknownField(body, allowed);
        }
        JsonNode reason = body.get("reason");
        if (reason != null && (!reason.isTextual() || reason.asText().length() > 200)) {
            return Result.error("INVALID", "\"reason\": expected a text of at most 200 characters");
        }
        return Result.ok(new Command.EndPart(reason == null ? "ended by the plant" : reason.asText()));
    }

    private static String text(JsonNode body, String field) {
        JsonNode n = body.get(field);
        return n != null && n.isTextual() && TEXT_ID.matcher(n.asText()).matches() ? n.asText() : null;
    }

    /** The first field not in {@code allowed}, or null. */
    private static String only(JsonNode body, Set<String> allowed) {
        for (Iterator<String> it = body.fieldNames(); it.hasNext(); ) {
            String f = it.next();
            if (!allowed.contains(f)) {
                return f;
            }
        }
        return null;
    }

    private static Result unknownField(JsonNode body, Set<String> allowed) {
        return Result.error("INVALID", "unknown field \"" + clip(only(body, allowed)) + "\""
                + (allowed.isEmpty() ? ": this command takes none" : ": expected " + String.join(", ", allowed)));
    }

    private static String clip(String s) {
        if (s == null) {
            return "";
        }
        String one = s.replaceAll("[\\p{Cntrl}]", "?");
        return one.length() > 80 ? one.substring(0, 80) + "..." : one;
    }
}
