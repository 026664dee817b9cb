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
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;

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


    private final String url;
    private final String clientId;
    private final Handler handler;
    private final hammerstep.mqtt.BrokerSettings credentials;
    private final List<String> filters = new CopyOnWriteArrayList<>();
    private final ScheduledExecutorService watchdog;
    private volatile MqttAsyncClient client;
    private volatile ClientThreads threads;
    private volatile boolean closed;

    private QualityClient(String url, String clientId, Handler handler, hammerstep.mqtt.BrokerSettings credentials) {
        this.url = url;
        this.clientId = clientId;
        this.handler = handler;
        this.credentials = credentials;
        this.watchdog = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "mqtt-quality-watchdog-" + clientId);
            t.setDaemon(true);
            return t;
        });
    }

    /**
     * Connects (blocking up to 10 s); messages of every later subscription go to {@code handler}.
     * A lost connection is noticed within about two seconds and made again with a new client (not
     * Paho's automatic reconnect, whose connect race can leave it stuck); the broker keeps the
     * session, so nothing published meanwhile is lost.
     */
    public static QualityClient connect(String url, String clientId, Handler handler) throws IOException {
        return connect(new QualityClient(url, clientId, handler, null));
    }

    /**
     * As {@link #connect(String, String, Handler)}, with the url, client id, user name, password file
     * and TLS files of {@code settings} (a plant's quality system account, or a test's).
     */
    public static QualityClient connect(hammerstep.mqtt.BrokerSettings settings, Handler handler) throws IOException {
        return connect(new QualityClient(settings.url(), settings.clientId(), handler, settings));
    }

    private static QualityClient connect(QualityClient q) throws IOException {
        try {
            q.open();
        } catch (IOException e) {
            q.watchdog.shutdownNow();
            throw e;
        }
        q.watchdog.scheduleWithFixedDelay(q::check, 1, 1, TimeUnit.SECONDS);
        return q;
    }

    private void open() throws IOException {
        ClientThreads t = new ClientThreads("quality-" + clientId);
        try {
            MqttAsyncClient c = new MqttAsyncClient(url, clientId, new MemoryPersistence(), null, t.executor());
            c.setCallback(new MqttCallback() {
                @Override
                public void disconnected(MqttDisconnectResponse r) {
                    // the watchdog connects again
                }

                @Override
                public void mqttErrorOccurred(MqttException e) {
                    // the watchdog connects again
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
                    // subscriptions are made by the connecting thread, never here
                }

                @Override
                public void authPacketArrived(int reasonCode, MqttProperties properties) {
                    // none
                }
            });
            MqttConnectionOptions o = new MqttConnectionOptions();
            o.setCleanStart(false);
            o.setSessionExpiryInterval(3600L);
            o.setAutomaticReconnect(false);
            o.setKeepAliveInterval(10);
            o.setConnectionTimeout(10);
            o.setTopicAliasMaximum(0);
            o.setSocketFactory(NoDelay.plain());
            if (credentials != null) {
                if (credentials.username() != null) {
                    o.setUserName(credentials.username());
                }
                if (credentials.passwordFile() != null) {
                    byte[] pw = hammerstep.mqtt.PasswordFile.read(credentials.passwordFile());
                    o.setPassword(pw.clone());
                    java.util.Arrays.fill(pw, (byte) 0);
                }
                if (credentials.tls()) {
                    o.setSocketFactory(new Tls(credentials.caFile(), credentials.certFile(), credentials.keyFile())
                            .socketFactory());
                    o.setHttpsHostnameVerificationEnabled(true);
                }
            }
            threads = t;
            client = c;
            c.connect(o).waitForCompletion(10_000);
            for (String f : filters) {
                c.subscribe(new MqttSubscription[] {new MqttSubscription(f, 1)}).waitForCompletion(10_000);
            }
        } catch (MqttException e) {
            release();
            throw new IOException("cannot connect to " + url + ": " + PahoLink.describe(e), e);
        } catch (IOException | RuntimeException e) {
            release();
            throw e;
        }
    }

    private void check() {
        MqttAsyncClient c = client;
        if (closed || (c != null && c.isConnected())) {
            return;
        }
        release();
        try {
            open();
        } catch (IOException | RuntimeException e) {
            // tried again in a second
        }
    }

    private void release() {
        MqttAsyncClient c = client;
        client = null;
        if (c != null) {
            try {
                c.disconnectForcibly(0, 500, false);
            } catch (MqttException | RuntimeException ignored) {
                // releasing anyway
            }
            try {
                c.close(true);
            } catch (MqttException | RuntimeException ignored) {
                // releasing anyway
            }
        }
        ClientThreads t = threads;
        threads = null;
        if (t != null) {
            t.shutdown();
        }
    }

    /** Subscribes at QoS 1, blocking until the broker answers. */
    public void subscribe(String filter) throws IOException {
        filters.add(filter);
        try {
            current().subscribe(new MqttSubscription[] {new MqttSubscription(filter, 1)}).waitForCompletion(10_000);
        } catch (MqttException e) {
            throw new IOException(PahoLink.describe(e), e);
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
            current().publish(topic, m).waitForCompletion(10_000);
        } catch (MqttException e) {
            throw new IOException(PahoLink.describe(e), e);
        }
    }

    private MqttAsyncClient current() throws IOException {
        MqttAsyncClient c = client;
        if (c == null) {
            throw new IOException("not connected to " + url + " (connecting again)");
        }
        return c;
    }

    public boolean connected() {
        MqttAsyncClient c = client;
        return c != null && c.isConnected();
    }

    @Override
    public void close() {
        closed = true;
        watchdog.shutdownNow();
        MqttAsyncClient c = client;
        try {
            if (c != null && c.isConnected()) {
                c.disconnect(1000).waitForCompletion(2000);
            }
        } catch (MqttException | RuntimeException ignored) {
            // closing anyway
        }
        release();
    }
}
