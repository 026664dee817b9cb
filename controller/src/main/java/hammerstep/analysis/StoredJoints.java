package hammerstep.analysis;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;

import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.MalformedInputException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The joint results a station delivered, read from a file of its messages (the station's results
 * or a subscriber's log) so that the what-if can set each stored trace beside its stored verdict.
 *
 * <p>The file holds one message a line: a JSON object, or a topic, a space and the JSON object (as
 * {@code mosquitto_sub -v} prints them). Messages of every kind may be mixed (joint, part, event,
 * status, responses); only joint messages ({@value ResultsFile#JOINT_SCHEMA}) are kept, the others
 * counted. A message delivered twice (at-least-once delivery, a subscriber's log spanning a
 * reconnect) is kept once, by its {@code id}. Empty payloads (a cleared retained message, printed
 * as {@code (null)}) are skipped. A line that is neither is an error naming file and line.
 *
 * <p>A stored trace is matched to its joint by the trace's file name, which the joint message
 * names in {@code trace} (the station's path; the name alone is compared, so an archive copied
 * anywhere still matches), or else by the part serial, position, pass and attempt that the trace
 * carries in its header, when exactly one joint has them.
 */
public final class StoredJoints {

    private static final ObjectMapper JSON = new ObjectMapper();

    /** One stored joint result: what the what-if needs of it. */
    public record Joint(int line, String id, String partSerial, String position, String pass, int attempt,
                        String program, String verdict, List<String> reasons, double finalTorqueNm, int blows,
                        String traceName) {
    }

    private final Path file;
    private final List<Joint> joints;
    private final Map<String, Joint> byTraceName = new HashMap<>();
    private final Map<String, Joint> byKey = new HashMap<>();
    private final Set<String> ambiguousKeys = new HashSet<>();
    private final int duplicates;
    private final int otherMessages;

    private StoredJoints(Path file, List<Joint> joints, int duplicates, int otherMessages) {
        this.file = file;
        this.joints = joints;
        this.duplicates = duplicates;
        this.otherMessages = otherMessages;
        for (Joint j : joints) {
            if (!j.traceName().isEmpty()) {
                byTraceName.putIfAbsent(j.traceName(), j);
            }
            String key = key(j.partSerial(), j.position(), j.pass(), Integer.toString(j.attempt()));
            if (byKey.putIfAbsent(key, j) != null) {
                ambiguousKeys.add(key);
            }
        }
    }

    public static StoredJoints read(Path file) throws InputException {
        List<Joint> joints = new ArrayList<>();
        Set<String> ids = new HashSet<>();
        int duplicates = 0;
        int other = 0;
        try (BufferedReader in = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            String text;
            int line = 0;
            while ((text = in.readLine()) != null) {
                line++;
                String payload = payload(text);
                if (payload.isEmpty()) {
                    continue;
                }
                JsonNode node;
                try {
                    node = JSON.readTree(payload);
                } catch (JsonProcessingException e) {
                    throw new InputException(file + ":" + line + ": not a JSON message: "
                            + e.getOriginalMessage().lines().findFirst().orElse(""));
                }
                if (node == null || !node.isObject()) {
                    throw new InputException(file + ":" + line + ": expected a JSON object");
                }
                JsonNode schema = node.get("schema");
                if (schema == null || !ResultsFile.JOINT_SCHEMA.equals(schema.asText())) {
                    other++;
                    continue;
                }
                String id = text(node, "id");
                if (id.isEmpty()) {
                    throw new InputException(file + ":" + line + ": joint message without 'id'");
                }
                if (!ids.add(id)) {
                    duplicates++;
                    continue;
                }
                joints.add(joint(line, id, node));
            }
        } catch (NoSuchFileException e) {
            throw new InputException(file + ": no such file");
        } catch (MalformedInputException e) {
            throw new InputException(file + ": not a text file (invalid UTF-8)");
        } catch (IOException e) {
            throw new InputException(file + ": cannot read: " + e.getMessage());
        }
        return new StoredJoints(file, joints, duplicates, other);
    }

    /** The JSON object of a line: the line itself, or what follows the topic; "" for an empty payload. */
    static String payload(String line) {
        String s = line.strip();
        if (s.isEmpty() || s.charAt(0) == '{') {
            return s;
        }
        int space = s.indexOf(' ');
        if (space < 0) {
            return ""; // a topic with an empty payload
        }
        String rest = s.substring(space + 1).strip();
        return rest.equals("(null)") ? "" : rest;
    }

    private static Joint joint(int line, String id, JsonNode n) {
        List<String> reasons = new ArrayList<>();
        JsonNode r = n.get("reasons");
        if (r != null && r.isArray()) {
            r.forEach(x -> reasons.add(x.asText()));
        }
        String trace = text(n, "trace");
        return new Joint(line, id, text(n, "part_serial"), text(n, "position"), text(n, "pass"),
                n.path("attempt").asInt(0), text(n, "program"), text(n, "verdict"), List.copyOf(reasons),
                n.path("final_torque_nm").asDouble(Double.NaN), n.path("blows").asInt(-1), nameOf(trace));
    }

    /** The file name of a path as the station wrote it (either separator), "" for none. */
    public static String nameOf(String path) {
        int cut = Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\'));
        return path.substring(cut + 1);
    }

    private static String text(JsonNode n, String key) {
        JsonNode v = n.get(key);
        return v == null || v.isNull() ? "" : v.asText();
    }

    private static String key(String partSerial, String position, String pass, String attempt) {
        return partSerial + '\u0000' + position + '\u0000' + pass + '\u0000' + attempt;
    }

    /**
     * The stored joint of a trace: by its file name, else by the part serial, position, pass and
     * attempt of its header's metadata when one joint alone has them; null when none matches.
     */
    public Joint of(String traceFileName, Map<String, String> metadata) {
        Joint j = byTraceName.get(traceFileName);
        if (j != null || metadata == null || !metadata.containsKey("part_serial")) {
            return j;
        }
        String key = key(metadata.get("part_serial"), metadata.getOrDefault("position", ""),
                metadata.getOrDefault("pass", ""), metadata.getOrDefault("attempt", ""));
        return ambiguousKeys.contains(key) ? null : byKey.get(key);
    }

    public Path file() {
        return file;
    }

    /** The joint results, each once, in file order. */
    public List<Joint> joints() {
        return joints;
    }

    /** Joint messages dropped because their id came earlier in the file. */
    public int duplicates() {
        return duplicates;
    }

    /** Messages of other kinds (part, event, status, responses), skipped. */
    public int otherMessages() {
        return otherMessages;
    }
}
