package hammerstep.mqtt.paho;

import org.eclipse.paho.mqttv5.client.IMqttToken;
import org.eclipse.paho.mqttv5.client.MqttAsyncClient;
import org.eclipse.paho.mqttv5.client.MqttCallback;
import org.eclipse.paho.mqttv5.client.MqttConnectionOptions;
import org.eclipse.paho.mqttv5.client.MqttDisconnectResponse;
import org.eclipse.paho.mqttv5.client.persist.MemoryPersistence;
import org.eclipse.paho.mqttv5.common.MqttException;
import org.eclipse.paho.mqttv5.common.MqttMessage;
import org.eclipse.paho.mqttv5.common.MqttSubscription;
import org.eclipse.paho.mqttv5.common.packet.MqttProperties;

import java.io.IOException;
import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.ScheduledExecutorService;

/**
 * The quality system's side, as the demo and the tests play it: subscribes with a persistent
 * session (clean start off), reconnects by itself and subscribes again from its own thread after a
 * reconnect, and can send commands with a response topic and correlation data. Only JDK types in
 * its interface. {@link #close()} leaves no client thread behind.
 */
public final class QualityClient implements AutoCloseable {

    /** A received message; called on the client's thread. */
    @FunctionalInterface
    public interface Handler {
        void onMessage(String topic, byte[] payload, boolean retained, byte[] correlation);
    }


    private final MqttAsyncClient client;
    private final ClientThreads threads;
    private final List<String> filters = new CopyOnWriteArrayList<>();

    private QualityClient(MqttAsyncClient client, ClientThreads threads) {
        this.client = client;
        this.threads = threads;
    }

    /** Connects (blocking up to 10 s); messages of every later subscription go to {@code handler}. */
    public static QualityClient connect(String url, String clientId, Handler handler) throws IOException {
        ClientThreads threads = new ClientThreads("quality-" + clientId);
        ScheduledExecutorService ex = threads.executor();
        try {
            MqttAsyncClient c = new MqttAsyncClient(url, clientId, new MemoryPersistence(), null, ex);
            QualityClient q = new QualityClient(c, threads);
            c.setCallback(new MqttCallback() {
                @Override
                public void disconnected(MqttDisconnectResponse r) {
                    // automatic reconnect is on
                }

                @Override
                public void mqttErrorOccurred(MqttException e) {
                    // reported through disconnected
                }

                @Override
                public void messageArrived(String topic, MqttMessage m) {
                    MqttProperties p = m.getProperties();
                    handler.onMessage(topic, m.getPayload(), m.isRetained(), p == null ? null : p.getCorrelationData());
                }

                @Override
                public void deliveryComplete(IMqttToken token) {
                    // nothing to do
                }

                @Override
                public void connectComplete(boolean reconnect, String serverUri) {
                    if (reconnect) {
                        ex.execute(q::resubscribe);
                    }
                }

                @Override
                public void authPacketArrived(int reasonCode, MqttProperties properties) {
                    // none
                }
            });
            MqttConnectionOptions o = new MqttConnectionOptions();
            o.setCleanStart(false);
            o.setSessionExpiryInterval(3600L);
            o.setAutomaticReconnect(true);
            o.setAutomaticReconnectDelay(1, 2);
            o.setKeepAliveInterval(10);
            o.setConnectionTimeout(10);
            o.setTopicAliasMaximum(0);
            c.connect(o).waitForCompletion(10_000);
            return q;
        } catch (MqttException e) {
            threads.shutdown();
            throw new IOException("cannot connect to " + url + ": " + PahoLink.describe(e), e);
        }
    }

    /** Subscribes at QoS 1, blocking until the broker answers. */
    public void subscribe(String filter) throws IOException {
        filters.add(filter);
        try {
            client.subscribe(new MqttSubscription[] {new MqttSubscription(filter, 1)}).waitForCompletion(10_000);
        } catch (MqttException e) {
            throw new IOException(PahoLink.describe(e), e);
        }
    }

    private void resubscribe() {
        for (String f : filters) {
            try {
                client.subscribe(new MqttSubscription[] {new MqttSubscription(f, 1)}).waitForCompletion(10_000);
            } catch (MqttException e) {
                // the broker kept the session, or the next reconnect tries again
            }
        }
    }

    /**
     * Publishes at QoS 1 and waits for the broker's acknowledgement.
     *
     * @param expiryS       message expiry, or null for none
     * @param responseTopic response topic, or null
     * @param correlation   correlation data, or null
     */
    public void publish(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation)
            throws IOException {
        MqttMessage m = new MqttMessage(payload);
        m.setQos(1);
        MqttProperties p = new MqttProperties();
        if (expiryS != null) {
            p.setMessageExpiryInterval(expiryS);
        }
        if (responseTopic != null) {
            p.setResponseTopic(responseTopic);
        }
        if (correlation != null) {
            p.setCorrelationData(correlation);
        }
        m.setProperties(p);
        try {
            client.publish(topic, m).waitForCompletion(10_000);
        } catch (MqttException e) {
            throw new IOException(PahoLink.describe(e), e);
        }
    }

    public boolean connected() {
        return client.isConnected();
    }

    @Override
    public void close() {
        try {
            if (client.isConnected()) {
                client.disconnect(1000).waitForCompletion(2000);
            }
        } catch (MqttException | RuntimeException ignored) {
            // closing anyway
        }
        try {
            client.close(true);
        } catch (MqttException | RuntimeException ignored) {
            // closing anyway
        }
        threads.shutdown();
    }
}
