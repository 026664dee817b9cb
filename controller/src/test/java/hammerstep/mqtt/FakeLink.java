package hammerstep.mqtt;

import java.io.IOException;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/** A broker connection in memory: records what is published; the test acknowledges by hand. */
final class FakeLink implements Link {

    record Sent(String topic, byte[] payload, boolean retained, long tag, byte[] correlation) { }

    boolean refuseConnect;
    /** False: messages published on a subscribed topic do not come back (a slow or odd broker). */
    boolean echo = true;
    /** A subscription the broker refuses (an ACL without read on the topic). */
    String refuseSubscription;
    int receiveMaximum = 10;
    /** How many more responses the client takes now (a full in-flight window at 0). */
    int roomForResponses = Integer.MAX_VALUE;
    Events events;
    Will will;
    final List<String> subscriptions = new ArrayList<>();
    final List<Sent> sent = new ArrayList<>();
    /** Retained messages the broker holds: a subscription to one of these topics gets it first, as a broker does. */
    final Map<String, byte[]> retained = new HashMap<>();
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
    public void subscribe(String filter) throws IOException {
        if (filter.equals(refuseSubscription)) {
            throw new IOException("broker refused the subscription to " + filter + " (reason 135)");
        }
        subscriptions.add(filter);
        byte[] r = retained.get(filter);
        if (r != null && events != null) {
            events.message(filter, r, null, null, null);
        }
    }

    @Override
    public boolean publish(String topic, byte[] payload, boolean retained, long tag) throws IOException {
        if (closed) {
            throw new IOException("closed");
        }
        sent.add(new Sent(topic, payload, retained, tag, null));
        if (echo && subscriptions.contains(topic) && events != null) {
            events.message(topic, payload.clone(), null, null, null); // a subscriber to its own topic gets it back
        }
        return true;
    }

    @Override
    public boolean respond(String topic, byte[] payload, byte[] correlation, long expiryS) {
        if (roomForResponses == 0) {
            return false;
        }
        roomForResponses--;
        sent.add(new Sent(topic, payload, false, 0, correlation));
        return true;
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
