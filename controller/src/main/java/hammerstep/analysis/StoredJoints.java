package hammerstep.analysis;

import com.fasterxml.jackson.databind.JsonNode;

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
 * status, responses, commands); only joint messages ({@value ResultsFile#JOINT_SCHEMA}) are kept, the
 * others counted. A message delivered twice (at-least-once delivery, a subscriber's log spanning a
 * reconnect) is kept once, by its {@code id}; the same id with other content is an error. Empty
 * payloads and lines that cannot be a joint result are skipped; see {@link MessageLines}.
 *
 * <p>A stored trace is matched to its joint by the trace's file name, which the joint message
 * names in {@code trace} (the station's path; the name alone is compared, so an archive copied
 * anywhere still matches), or else by the part serial, position, pass and attempt that the trace
 * carries in its header, when exactly one joint has them.
 */
public final class StoredJoints {

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
        int[] other = {0};
        MessageLines.Tally tally = MessageLines.read(file, (line, node) -> {
            JsonNode schema = node.get("schema");
            if (schema == null || !ResultsFile.JOINT_SCHEMA.equals(schema.asText())) {
                other[0]++;
                return;
            }
            String id = text(node, "id");
            if (id.isEmpty()) {
                throw new InputException(file + ":" + line + ": joint message without 'id'");
            }
            joints.add(joint(line, id, node));
        });
        return new StoredJoints(file, joints, tally.duplicates(), other[0] + tally.commands() + tally.unreadable());
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
        return MessageLines.text(n, key);
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

    /** Messages dropped because their id came earlier in the file (with the same content). */
    public int duplicates() {
        return duplicates;
    }

    /** Messages of other kinds (part, event, status, responses), commands and lines that are no message, skipped. */
    public int otherMessages() {
        return otherMessages;
    }
}
