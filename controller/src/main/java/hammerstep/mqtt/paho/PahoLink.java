package hammerstep.mqtt.paho;

import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.Link;
import hammerstep.mqtt.PasswordFile;
import org.eclipse.paho.mqttv5.client.IMqttToken;
import org.eclipse.paho.mqttv5.client.MqttActionListener;
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
import java.util.Arrays;

/**
 * {@link Link} over the Paho MQTT v5 client. Each instance makes one client for one connection,
 * with memory persistence only, automatic reconnect off and its threads in an executor of its own
 * that {@link #close()} shuts down, so no client thread outlives the link. Clean start is off and
 * a session expiry is set, so the broker keeps the command subscription (and commands with time
 * left) across a short outage; Paho's own redelivery never happens because the next connection is a
 * new client: the outbox sends again what was not acknowledged.
 */
public final class PahoLink implements Link {

    /**
     * The Last Will's delay (MQTT 5.0 §3.1.3.2.2): the broker publishes it only when the station has
     * not connected again within this time, so a reconnect after a broker restart or a short
     * network loss sends no "offline" at all.
     */
    static final long WILL_DELAY_S = 5;

    private final BrokerSettings settings;
    private final Tls tls;
    private MqttAsyncClient client;
    private ClientThreads threads;
    private volatile Events events;

    public PahoLink(BrokerSettings settings) {
        this.settings = settings;
        this.tls = settings.tls() ? new Tls(settings.caFile(), settings.certFile(), settings.keyFile()) : null;
    }

    @Override
    public int connect(Will will, Events events) throws IOException {
        long timeoutMs = settings.connectTimeoutS() * 1000L;
        this.events = events;
        threads = new ClientThreads(settings.clientId());
        try {
            client = new MqttAsyncClient(settings.url(), settings.clientId(), new MemoryPersistence(), null, threads.executor());
            MqttConnectionOptions o = new MqttConnectionOptions();
            o.setCleanStart(false);
            o.setSessionExpiryInterval(settings.sessionExpiryS());
            o.setAutomaticReconnect(false);
            o.setKeepAliveInterval(settings.keepAliveS());
            o.setConnectionTimeout(settings.connectTimeoutS());
            o.setTopicAliasMaximum(0);
            MqttMessage w = new MqttMessage(will.payload());
            w.setQos(1);
            w.setRetained(true);
            o.setWill(will.topic(), w);
            MqttProperties willProps = new MqttProperties();
            willProps.setWillDelayInterval(Math.min(WILL_DELAY_S, settings.sessionExpiryS()));
            o.setWillMessageProperties(willProps);
            if (settings.username() != null) {
                o.setUserName(settings.username());
            }
            if (settings.passwordFile() != null) {
                // Paho keeps the array it is given (for the client's life): hand it a copy, wipe ours
                byte[] pw = PasswordFile.read(settings.passwordFile());
                o.setPassword(pw.clone());
                Arrays.fill(pw, (byte) 0);
            }
            if (tls != null) {
                o.setSocketFactory(tls.socketFactory());
                o.setHttpsHostnameVerificationEnabled(true);
            } else {
                o.setSocketFactory(NoDelay.plain());
            }
            client.setCallback(callback(events));
            IMqttToken token = client.connect(o);
            token.waitForCompletion(timeoutMs);
            MqttProperties props = token.getResponseProperties();
            Integer receiveMax = props == null ? null : props.getReceiveMaximum();
            return receiveMax == null || receiveMax <= 0 ? 65_535 : receiveMax;
        } catch (MqttException e) {
            close();
            throw new IOException(describe(e), e);
        } catch (IOException | RuntimeException e) {
            close();
            throw e instanceof IOException io ? io : new IOException(e.getMessage(), e);
        }
    }

    private static MqttCallback callback(Events events) {
        return new MqttCallback() {
            @Override
            public void disconnected(MqttDisconnectResponse response) {
                events.connectionLost(response.getReasonString() != null ? response.getReasonString()
                        : response.getException() != null ? describe(response.getException())
                        : "reason code " + response.getReturnCode());
            }

            @Override
            public void mqttErrorOccurred(MqttException exception) {
                events.connectionLost(describe(exception));
            }

            @Override
            public void messageArrived(String topic, MqttMessage message) {
                MqttProperties p = message.getProperties();
                events.message(topic, message.getPayload(), p == null ? null : p.getMessageExpiryInterval(),
                        p == null ? null : p.getResponseTopic(), p == null ? null : p.getCorrelationData());
            }

            @Override
            public void deliveryComplete(IMqttToken token) {
                // acknowledgements arrive through each publish's own listener
            }

            @Override
            public void connectComplete(boolean reconnect, String serverUri) {
                // subscriptions are made by the publisher's thread after connect() returns, never here
            }

            @Override
            public void authPacketArrived(int reasonCode, MqttProperties properties) {
                // no enhanced authentication
            }
        };
    }

    @Override
    public void subscribe(String filter) throws IOException {
        try {
            IMqttToken t = client.subscribe(new MqttSubscription[] {new MqttSubscription(filter, 1)});
            t.waitForCompletion(settings.connectTimeoutS() * 1000L);
            int[] codes = t.getReasonCodes();
            if (codes != null && codes.length > 0 && codes[0] >= 0x80) {
                throw new IOException("broker refused the subscription to " + filter + " (reason " + codes[0] + ")");
            }
        } catch (MqttException e) {
            throw new IOException(describe(e), e);
        }
    }

    @Override
    public boolean publish(String topic, byte[] payload, boolean retained, long tag) throws IOException {
        MqttMessage m = new MqttMessage(payload);
        m.setQos(1);
        m.setRetained(retained);
        return send(topic, m, tag);
    }

    /** Hands one message to the client; the listener reports the broker's PUBACK. */
    private boolean send(String topic, MqttMessage m, long tag) throws IOException {
        try {
            client.publish(topic, m, null, new MqttActionListener() {
                @Override
                public void onSuccess(IMqttToken token) {
                    int[] codes = token.getReasonCodes();
                    boolean ok = codes == null || codes.length == 0 || codes[0] < 0x80;
                    acked(tag, ok, ok ? "" : "reason code " + codes[0]);
                }

                @Override
                public void onFailure(IMqttToken token, Throwable error) {
                    acked(tag, false, error == null ? "failed" : error.getMessage());
                }
            });
            return true;
        } catch (MqttException e) {
            if (e.getReasonCode() == org.eclipse.paho.mqttv5.client.MqttClientException.REASON_CODE_MAX_INFLIGHT) {
                return false;
            }
            throw new IOException(describe(e), e);
        }
    }

    private void acked(long tag, boolean ok, String detail) {
        Events e = events;
        if (e != null) {
            e.acknowledged(tag, ok, detail);
        }
    }

    @Override
    public boolean respond(String topic, byte[] payload, byte[] correlation, long expiryS) throws IOException {
        MqttMessage m = new MqttMessage(payload);
        m.setQos(1);
        MqttProperties p = new MqttProperties();
        if (correlation != null) {
            p.setCorrelationData(correlation);
        }
        p.setMessageExpiryInterval(expiryS);
        m.setProperties(p);
        return send(topic, m, 0);
    }

    @Override
    public void publishAndWait(String topic, byte[] payload, boolean retained, long timeoutMs) throws IOException {
        try {
            MqttMessage m = new MqttMessage(payload);
            m.setQos(1);
            m.setRetained(retained);
            client.publish(topic, m).waitForCompletion(timeoutMs);
        } catch (MqttException | RuntimeException e) {
            throw new IOException(e.getMessage(), e);
        }
    }

    @Override
    public void disconnect() {
        if (client != null) {
            try {
                client.disconnect(2000).waitForCompletion(3000);
            } catch (MqttException | RuntimeException ignored) {
                // closing anyway
            }
        }
        close();
    }

    @Override
    public void close() {
        MqttAsyncClient c = client;
        client = null;
        if (c != null) {
            try {
                if (c.isConnected()) {
                    c.disconnectForcibly(0, 1000, false);
                }
            } catch (MqttException | RuntimeException ignored) {
                // closing anyway
            }
            try {
                c.close(true);
            } catch (MqttException | RuntimeException ignored) {
                // closing anyway
            }
        }
        ClientThreads t = threads;
        threads = null;
        if (t != null) {
            t.shutdown();
        }
    }

    static String describe(Throwable e) {
        if (e instanceof MqttException me) {
            Throwable cause = me.getCause();
            String text = me.getMessage() + " (" + me.getReasonCode() + ")";
            return cause == null ? text : text + ": " + readable(cause);
        }
        return readable(e);
    }

    /** An exception's message, or for one without (an end of stream, a reset) what it means. */
    static String readable(Throwable e) {
        if (e.getMessage() != null && !e.getMessage().isBlank()) {
            return e.getMessage();
        }
        if (e instanceof java.io.EOFException) {
            return "the broker closed the connection";
        }
        return e.getClass().getSimpleName().replaceAll("(?<=[a-z])(?=[A-Z])", " ").toLowerCase(java.util.Locale.ROOT);
    }
}
