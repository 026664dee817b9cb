package hammerstep.mqtt;

import java.io.IOException;

/**
 * One connection to an MQTT 5 broker, as the {@link ResultPublisher} needs it. The Paho adapter is
 * {@link hammerstep.mqtt.paho.PahoLink}; tests use a fake. A link is used for one connection: after
 * a loss the publisher closes it and connects again, so no client library state (its own queue of
 * unacknowledged messages, topic aliases) outlives a connection; the outbox re-sends instead.
 */
public interface Link {

    /** What the connection reports; called on the client library's threads. */
    interface Events {
        void connectionLost(String cause);

        /** The broker acknowledged (or refused) the publish tagged {@code tag}. */
        void acknowledged(long tag, boolean ok, String detail);

        /**
         * A message on a subscribed topic.
         *
         * @param expiryS       remaining message expiry, or null when the sender set none
         * @param responseTopic where the sender wants the answer, or null
         * @param correlation   the sender's correlation data, or null
         */
        void message(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation);
    }

    /** The Last Will: published retained by the broker when the connection ends uncleanly. */
    record Will(String topic, byte[] payload) { }

    /**
     * Connects, blocking up to the connect timeout.
     *
     * @return how many QoS 1 publishes the broker takes unacknowledged (its receive maximum)
     */
    int connect(Will will, Events events) throws IOException;

    /** Subscribes at QoS 1, blocking until the broker answers. */
    void subscribe(String filter) throws IOException;

    /**
     * Publishes at QoS 1 without waiting; the acknowledgement arrives through {@link Events#acknowledged}.
     *
     * @return false when the client has as many publishes in flight as the broker takes: nothing was
     *         sent, try again after an acknowledgement
     */
    boolean publish(String topic, byte[] payload, boolean retained, long tag) throws IOException;

    /**
     * Publishes a response at QoS 1 with the request's correlation data, without waiting.
     *
     * @return false when the client has as many publishes in flight as the broker takes: nothing was
     *         sent, try again after an acknowledgement
     */
    boolean respond(String topic, byte[] payload, byte[] correlation, long expiryS) throws IOException;

    /** Publishes retained at QoS 1 and waits up to {@code timeoutMs} for the acknowledgement. */
    void publishAndWait(String topic, byte[] payload, boolean retained, long timeoutMs) throws IOException;

    /** A clean disconnect (the broker does not send the Will), then releases everything. */
    void disconnect();

    /** Drops the connection at once and releases everything; safe to call more than once. */
    void close();
}
