package hammerstep.analysis;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.config.InputFiles;

import java.io.IOException;
import java.nio.file.Path;

/**
 * A file of messages, one a line: a JSON object, or a topic, a space and the JSON object (as
 * {@code mosquitto_sub -v} prints them). Blank lines and empty payloads (a cleared retained message,
 * printed as a topic alone or followed by {@code (null)}) are skipped. A line that is neither is an
 * error naming file and line, as are a file that is missing, unreadable or not UTF-8 text.
 */
final class MessageLines {

    private static final ObjectMapper JSON = new ObjectMapper();

    /** Takes each message of a file, with its line number. */
    interface Reader {
        void message(int line, JsonNode message) throws InputException;
    }

    private MessageLines() {
    }

    static void read(Path file, Reader reader) throws InputException {
        try (InputFiles.Lines in = InputFiles.lines(file, InputFiles.MAX_MESSAGE_LINE_CHARS)) {
            String text;
            int line = 0;
            while ((text = in.next()) != null) {
                line++;
                String payload = payload(text);
                if (payload.isEmpty()) {
                    continue;
                }
                JsonNode node;
                try {
                    node = JSON.readTree(payload);
                } catch (JsonProcessingException e) {
                    throw new InputException(file + ":" + line + ": not a JSON object: "
                            + plain(e.getOriginalMessage().lines().findFirst().orElse("")));
                }
                if (node == null || !node.isObject()) {
                    throw new InputException(file + ":" + line + ": expected a JSON object, got "
                            + (node == null ? "nothing" : node.getNodeType()));
                }
                reader.message(line, node);
            }
        } catch (IOException e) {
            throw InputException.reading(file, e);
        }
    }

    /**
     * The JSON object of a line: the line itself, or what follows the topic; "" for a blank line or
     * an empty payload. Anything else is returned whole, for the caller to refuse as not JSON.
     */
    static String payload(String line) {
        String s = line.strip();
        if (s.isEmpty() || s.charAt(0) == '{') {
            return s;
        }
        int space = s.indexOf(' ');
        if (space < 0) {
            return s.indexOf('/') > 0 ? "" : s; // a topic alone: an empty payload
        }
        String rest = s.substring(space + 1).strip();
        if (rest.equals("(null)")) {
            return "";
        }
        return rest.startsWith("{") && s.substring(0, space).indexOf('/') > 0 ? rest : s;
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
