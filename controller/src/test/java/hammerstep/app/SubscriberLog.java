package hammerstep.app;

import com.fasterxml.jackson.databind.ObjectMapper;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * A quality system's raw log made from a clean file of station messages: every message twice (first as
 * {@code mosquitto_sub -v} prints it, topic in front; again, redelivered after a reconnect, as a plain
 * JSON line), and between them what such a log also holds: commands (whole, empty and cut short), a
 * reply, a cleared retained status, blank lines and a cut line of another tool.
 */
final class SubscriberLog {

    static final String PREFIX = "hammerstep/v1/plant-north/axle-2/hub-fit-1/";
    /** Lines of {@link #write} that are no station message: commands, a reply, a cut line. */
    static final int COMMANDS = 3;

    private SubscriberLog() {
    }

    static Path write(Path clean, Path out) throws IOException {
        ObjectMapper json = new ObjectMapper();
        List<String> messages = Files.readAllLines(clean).stream().filter(l -> !l.isBlank()).toList();
        List<String> log = new ArrayList<>();
        log.add(PREFIX + "status (null)");
        log.add(PREFIX + "cmd/part {\"serial\":\"AX-099\",\"model\":\"hub-5\"}");
        for (String m : messages) {
            String kind = json.readTree(m).get("schema").asText().split("\\.")[1];
            log.add(PREFIX + kind + " " + m);
        }
        log.add("");
        log.add(PREFIX + "cmd/part {\"serial\":");
        log.add(PREFIX + "cmd/end-part");
        log.add("qs/replies/hub-fit-1 {\"schema\":\"hammerstep.response.v1\",\"id\":\"r-1\",\"seq\":1,\"ok\":true,"
                + "\"code\":\"OK\",\"message\":\"starts when it is in the fixture\"}");
        log.add("{\"serial\":");
        log.addAll(messages);
        Files.write(out, log);
        return out;
    }
}
