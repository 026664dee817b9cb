package hammerstep.web;

import java.nio.charset.StandardCharsets;
import java.util.HashMap;
import java.util.Locale;
import java.util.Map;

/**
 * The fields of a posted form: {@code application/x-www-form-urlencoded} or
 * {@code multipart/form-data} (a file upload), read from a body already bounded in size. A field
 * named twice keeps its first value; at most 32 fields.
 */
final class FormBody {

    /** One field: its value's bytes and, for a file, the file's name as the browser sent it. */
    record Field(String fileName, byte[] value) {
        String text() {
            return new String(value, StandardCharsets.UTF_8);
        }
    }

    /** A body that is no form this view reads. */
    static final class BadForm extends Exception {
        BadForm(String message) {
            super(message);
        }
    }

    private static final int MAX_FIELDS = 32;

    private FormBody() {
    }

    static Map<String, Field> parse(String contentType, byte[] body) throws BadForm {
        String type = contentType == null ? "" : contentType.toLowerCase(Locale.ROOT);
        Map<String, Field> fields = new HashMap<>();
        if (type.startsWith("application/x-www-form-urlencoded")) {
            WebView.query(new String(body, StandardCharsets.UTF_8))
                    .forEach((k, v) -> fields.put(k, new Field(null, v.getBytes(StandardCharsets.UTF_8))));
            return fields;
        }
        if (!type.startsWith("multipart/form-data")) {
            throw new BadForm("expected a form (urlencoded or multipart), got " + (type.isEmpty() ? "no type" : type));
        }
        String boundary = parameter(contentType, "boundary");
        if (boundary == null || boundary.isEmpty() || boundary.length() > 200) {
            throw new BadForm("multipart form without a boundary");
        }
        byte[] delimiter = ("--" + boundary).getBytes(StandardCharsets.ISO_8859_1);
        int at = indexOf(body, delimiter, 0);
        if (at < 0) {
            throw new BadForm("multipart form without its boundary");
        }
        while (fields.size() < MAX_FIELDS) {
            at += delimiter.length;
            if (at + 2 <= body.length && body[at] == '-' && body[at + 1] == '-') {
                return fields; // the closing delimiter
            }
            int headersEnd = indexOf(body, "\r\n\r\n".getBytes(StandardCharsets.ISO_8859_1), at);
            if (headersEnd < 0) {
                throw new BadForm("multipart part without its headers' end");
            }
            String headers = new String(body, at, headersEnd - at, StandardCharsets.UTF_8);
            int next = indexOf(body, ("\r\n--" + boundary).getBytes(StandardCharsets.ISO_8859_1), headersEnd + 4);
            if (next < 0) {
                throw new BadForm("multipart part without its end");
            }
            String name = null;
            String fileName = null;
            for (String h : headers.split("\r\n")) {
                if (h.toLowerCase(Locale.ROOT).startsWith("content-disposition:")) {
                    name = parameter(h, "name");
                    fileName = parameter(h, "filename");
                }
            }
            byte[] value = java.util.Arrays.copyOfRange(body, headersEnd + 4, next);
            if (name != null) {
                fields.putIfAbsent(name, new Field(fileName, value));
            }
            at = next + 2;
        }
        return fields;
    }

    /** A header's {@code name=value} or {@code name="value"} parameter, or null. */
    static String parameter(String header, String name) {
        String[] parts = header.split(";");
        for (int i = 1; i < parts.length; i++) {
            String p = parts[i].strip();
            int eq = p.indexOf('=');
            if (eq > 0 && p.substring(0, eq).strip().equalsIgnoreCase(name)) {
                String v = p.substring(eq + 1).strip();
                if (v.length() >= 2 && v.startsWith("\"") && v.endsWith("\"")) {
                    v = v.substring(1, v.length() - 1);
                }
                return v;
            }
        }
        return null;
    }

    private static int indexOf(byte[] hay, byte[] needle, int from) {
        outer:
        for (int i = Math.max(0, from); i <= hay.length - needle.length; i++) {
            for (int k = 0; k < needle.length; k++) {
                if (hay[i + k] != needle[k]) {
                    continue outer;
                }
            }
            return i;
        }
        return -1;
    }
}
