package hammerstep.sim.broker;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;

import java.io.IOException;
import java.time.Duration;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.function.BooleanSupplier;

/** What a subscriber got, as the quality system would keep it. */
final class Received {

    record Message(String topic, byte[] payload, boolean retained, byte[] correlation, JsonNode json) { }

    private static final ObjectMapper JSON = new ObjectMapper();
    final List<Message> all = new CopyOnWriteArrayList<>();

    void add(String topic, byte[] payload, boolean retained, byte[] correlation) {
        JsonNode json;
        try {
            json = JSON.readTree(payload);
        } catch (IOException e) {
            json = null;
        }
        all.add(new Message(topic, payload, retained, correlation, json));
    }

    List<Message> on(String topicEnd) {
        List<Message> out = new ArrayList<>();
        for (Message m : all) {
            if (m.topic().endsWith(topicEnd)) {
                out.add(m);
            }
        }
        return out;
    }

    /** Joint messages after dropping repeats of an id: seq by id, in arrival order. */
    Map<String, Long> uniqueJoints() {
        Map<String, Long> byId = new LinkedHashMap<>();
        for (Message m : on("/joint")) {
            byId.putIfAbsent(m.json().get("id").asText(), m.json().get("seq").asLong());
        }
        return byId;
    }

    static void await(String what, Duration timeout, BooleanSupplier condition) throws InterruptedException {
        long end = System.nanoTime() + timeout.toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() - end > 0) {
                throw new AssertionError("timed out waiting for " + what);
            }
            Thread.sleep(20);
        }
    }
}
