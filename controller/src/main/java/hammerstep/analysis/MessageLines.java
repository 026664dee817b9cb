package hammerstep.analysis;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.config.InputFiles;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * A file of messages, one a line, as a station writes them or a subscriber logs them: a JSON object,
 * or a topic, a space and the JSON object (as {@code mosquitto_sub -v} prints them). The one reader
 * of such files; what it hands on and what it leaves out:
 * <ul>
 * <li>blank lines and empty payloads (a cleared retained message, printed as a topic alone or followed
 *     by {@code (null)}) are skipped;</li>
 * <li>whatever came on a command topic ({@code .../cmd/NAME}) is a request to the station, not its
 *     result: skipped and counted, whether it is JSON or not (a cut {@code {"serial":});</li>
 * <li>a message whose {@code id} came earlier in the file with the same content (at-least-once delivery,
 *     a log spanning a reconnect) is dropped and counted; the same {@code id} with other content is an
 *     error naming both lines: a station never sends two different messages under one id (logs of two
 *     stations or two journals mixed), and which one is the result cannot be told;</li>
 * <li>a line that is not a whole JSON object is skipped and counted when it cannot be a joint result
 *     (a payload cut short, a word of another tool's); when it may be one (it came on a {@code joint}
 *     topic, or names the joint schema or a joint's figures) it is an error naming file and line, since
 *     figures without it would not be honest.</li>
 * </ul>
 * A file that is missing, unreadable or not UTF-8 text is an error naming it.
 */
final class MessageLines {

    private static final ObjectMapper JSON = new ObjectMapper();

    /** Takes each message of a file, each id once, with its line number. */
    interface Reader {
        void message(int line, JsonNode message) throws InputException;
    }

    /**
     * What a read left out.
     *
     * @param duplicates          messages dropped because their id came earlier with the same content
     * @param commands            lines on a command topic, skipped
     * @param unreadable          lines that are no whole JSON object and cannot be a joint result, skipped
     * @param firstUnreadableLine the first of those, 0 when none
     */
    record Tally(int duplicates, int commands, int unreadable, int firstUnreadableLine) {
    }

    /** A line split into its topic (null when the line is the payload alone) and its payload ("" when empty). */
    record Line(String topic, String payload) {
    }

    private MessageLines() {
    }

    static Tally read(Path file, Reader reader) throws InputException {
        Map<String, Seen> ids = new HashMap<>();
        int duplicates = 0;
        int commands = 0;
        int unreadable = 0;
        int firstUnreadable = 0;
        try (InputFiles.Lines in = InputFiles.lines(file, InputFiles.MAX_MESSAGE_LINE_CHARS)) {
            String text;
            int line = 0;
            while ((text = in.next()) != null) {
                line++;
                Line l = split(text);
                if (l.payload().isEmpty()) {
                    continue;
                }
                if (l.topic() != null && isCommandTopic(l.topic())) {
                    commands++;
                    continue;
                }
                JsonNode node = parse(file, line, l);
                if (node == null) {
                    unreadable++;
                    firstUnreadable = firstUnreadable == 0 ? line : firstUnreadable;
                    continue;
                }
                JsonNode id = node.get("id");
                if (id != null && id.isTextual()) {
                    byte[] digest = digest(node);
                    Seen earlier = ids.putIfAbsent(id.asText(), new Seen(line, digest));
                    if (earlier != null) {
                        if (!Arrays.equals(earlier.digest(), digest)) {
                            throw new InputException(file + ":" + line + ": message id \"" + id.asText()
                                    + "\" came on line " + earlier.line() + " with other content; a station never"
                                    + " sends two different messages under one id (logs of two stations or two"
                                    + " journals mixed?): which one is the result cannot be told");
                        }
                        duplicates++;
                        continue;
                    }
                }
                reader.message(line, node);
            }
        } catch (IOException e) {
            throw InputException.reading(file, e);
        }
        return new Tally(duplicates, commands, unreadable, firstUnreadable);
    }

    /** Where an id came first, and a digest of its content (the message itself is not kept). */
    private record Seen(int line, byte[] digest) {
    }

    /**
     * SHA-256 of a message's content, field order aside: two messages with the same digest are the same
     * message (a 32-bit hash would let two different results under one id pass as a repeat once in
     * four billion pairs; a log of millions of lines makes that a matter of time).
     */
    static byte[] digest(JsonNode node) {
        MessageDigest sha;
        try {
            sha = MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("the JDK has no SHA-256", e);
        }
        feed(sha, node);
        return sha.digest();
    }

    private static void feed(MessageDigest sha, JsonNode node) {
        sha.update((byte) node.getNodeType().ordinal());
        if (node.isObject()) {
            List<String> names = new ArrayList<>();
            node.fieldNames().forEachRemaining(names::add);
            Collections.sort(names);
            sha.update(int4(names.size()));
            for (String name : names) {
                text(sha, name);
                feed(sha, node.get(name));
            }
        } else if (node.isArray()) {
            sha.update(int4(node.size()));
            for (JsonNode item : node) {
                feed(sha, item);
            }
        } else {
            // a number keeps its written form's kind: 1 and 1.0 are told apart, as JsonNode.equals does
            text(sha, node.isNumber() ? node.numberType() + ":" + node.asText() : node.asText());
        }
    }

    private static void text(MessageDigest sha, String s) {
        byte[] bytes = s.getBytes(StandardCharsets.UTF_8);
        sha.update(int4(bytes.length));
        sha.update(bytes);
    }

    private static byte[] int4(int n) {
        return new byte[] {(byte) (n >>> 24), (byte) (n >>> 16), (byte) (n >>> 8), (byte) n};
    }

    /** The line's JSON object; null when it is none and cannot be a joint result; an error when it may be one. */
    private static JsonNode parse(Path file, int line, Line l) throws InputException {
        String problem;
        try {
            JsonNode node = JSON.readTree(l.payload());
            if (node != null && node.isObject()) {
                return node;
            }
            problem = "expected a JSON object, got " + (node == null ? "nothing" : node.getNodeType());
        } catch (JsonProcessingException e) {
            problem = "not a JSON object: " + plain(e.getOriginalMessage().lines().findFirst().orElse(""));
        }
        if (mayBeJoint(l)) {
            throw new InputException(file + ":" + line + ": " + problem + " (a joint result that cannot be read:"
                    + " figures without it would not be honest)");
        }
        return null;
    }

    /** True when a line that is no whole message may still have been a joint result. */
    static boolean mayBeJoint(Line l) {
        String p = l.payload();
        return l.topic() != null && l.topic().endsWith("/joint") || p.contains("hammerstep.joint")
                || p.contains("final_torque_nm") || p.contains("peaks_nm");
    }

    /** True for a topic under a station's {@code cmd/}: a request to the station, not a message of it. */
    static boolean isCommandTopic(String topic) {
        return topic.contains("/cmd/") || topic.endsWith("/cmd");
    }

    /**
     * The topic and the payload of a line: the line itself when it starts with {@code {} (or is no
     * topic and payload), else what precedes and follows the first space when the first word is a topic
     * (has a {@code /}); the payload is "" for a blank line or an empty payload.
     */
    static Line split(String line) {
        String s = line.strip();
        if (s.isEmpty() || s.charAt(0) == '{') {
            return new Line(null, s);
        }
        int space = s.indexOf(' ');
        String first = space < 0 ? s : s.substring(0, space);
        if (first.indexOf('/') <= 0) {
            return new Line(null, s);
        }
        String rest = space < 0 ? "" : s.substring(space + 1).strip();
        return new Line(first, rest.equals("(null)") ? "" : rest);
    }

    /**
     * The JSON parser's message without the Java names it carries (a class or method in backquotes,
     * a qualified class name), which mean nothing to a line engineer.
     */
    static String plain(String message) {
        String s = message.replaceAll(",? ?(from )?`[^`]*`", "")
                .replaceAll("\\b([a-z][a-z0-9_]*\\.)+[A-Z][A-Za-z0-9_$]*(\\.[a-zA-Z_]+\\(\\))?", "")
                .replace("()", "").replaceAll(" {2,}", " ").strip();
        s = s.isEmpty() ? "invalid JSON" : s;
        return s.length() <= 120 ? s : s.substring(0, 120) + "...";
    }

    /** A message's text field, "" when it is missing or null. */
    static String text(JsonNode n, String key) {
        JsonNode v = n.get(key);
        return v == null || v.isNull() ? "" : v.asText();
    }
}
