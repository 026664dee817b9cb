package hammerstep.mqtt;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;

/** A broker connection in memory: records what is published; the test acknowledges by hand. */
final class FakeLink implements Link {

    record Sent(String topic, byte[] payload, boolean retained, long tag, byte[] correlation) { }

    boolean refuseConnect;
    int receiveMaximum = 10;
    Events events;
    Will will;
    final List<String> subscriptions = new ArrayList<>();
    final List<Sent> sent = new ArrayList<>();
    boolean closed;
    boolean disconnected;

    @Override
    public int connect(Will will, Events events) throws IOException {
        if (refuseConnect) {
            throw new IOException("connection refused");
        }
        this.will = will;
        this.events = events;
        return receiveMaximum;
    }

    @Override
    public void subscribe(String filter) {
        subscriptions.add(filter);
    }

    @Override
    public boolean publish(String topic, byte[] payload, boolean retained, long tag) throws IOException {
        if (closed) {
            throw new IOException("closed");
        }
        sent.add(new Sent(topic, payload, retained, tag, null));
        return true;
    }

    @Override
    public void respond(String topic, byte[] payload, byte[] correlation, long expiryS) {
        sent.add(new Sent(topic, payload, false, 0, correlation));
    }

    @Override
    public void publishAndWait(String topic, byte[] payload, boolean retained, long timeoutMs) {
        sent.add(new Sent(topic, payload, retained, 0, null));
    }

    @Override
    public void disconnect() {
        disconnected = true;
        closed = true;
    }

    @Override
    public void close() {
        closed = true;
    }

    List<Sent> results() {
        return sent.stream().filter(s -> s.tag() > 0).toList();
    }

    List<Sent> on(String topicEnd) {
        return sent.stream().filter(s -> s.topic().endsWith(topicEnd)).toList();
    }

    void ackAll() {
        for (Sent s : results()) {
            events.acknowledged(s.tag(), true, "");
        }
    }
}
