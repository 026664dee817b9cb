package hammerstep.mqtt;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultStoreException;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The last guard against giving a seq twice: at the first connect of a run, the station reads its
 * own retained status back from the broker (the one a run before left: online, offline, or the Last
 * Will) and compares its {@code last_seq} with what the outbox knows. Where the broker knew more
 * (the journal and its high-water file were both lost, or restored from an old backup), the seqs in
 * between are a loss and the results of this run are given seqs above them
 * ({@link Outbox#raiseSeqs}). Until the check is done, no result is sent, so none goes out under a
 * seq the plant has seen before. The check is done when the retained status arrives, when the
 * station's own status of this run comes back instead (there was none before: the broker sends a
 * retained message at the subscription, before anything published later), when the subscription is
 * refused, or after {@code waitNs}. Publisher thread only.
 */
public final class SeqCrossCheck {

    private static final Logger LOG = LoggerFactory.getLogger(SeqCrossCheck.class);
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final byte[] SEQ_FIELD = "\"seq\":".getBytes(StandardCharsets.US_ASCII);

    private final Outbox outbox;
    private final String statusTopic;
    private final String started;
    private final long waitNs;
    private boolean subscribed;
    private boolean done;
    private long deadlineNs;

    /**
     * @param started this run's {@code started} as the status writes it, to tell its own status from one before
     * @param waitNs  how long to wait for the retained status after subscribing, before sending anyway
     */
    public SeqCrossCheck(Outbox outbox, String statusTopic, String started, long waitNs) {
        this.outbox = outbox;
        this.statusTopic = statusTopic;
        this.started = started;
        this.waitNs = waitNs;
    }

    /** Subscribes {@code link} to the status topic, once per run; a refusal ends the check (logged). */
    void subscribe(Link link, long nowNs) {
        if (done || subscribed) {
            return;
        }
        try {
            link.subscribe(statusTopic);
            subscribed = true;
            deadlineNs = nowNs + waitNs;
        } catch (IOException e) {
            finish("cannot read back the retained status (" + e.getMessage() + "); seq is checked by the journal alone");
        }
    }

    /** A connection was lost before the check was done: the next connect subscribes again. */
    void connectionLost() {
        subscribed = false;
    }

    /** True once results may be sent. */
    boolean readyToSend(long nowNs) {
        if (!done && subscribed && nowNs - deadlineNs >= 0) {
            finish("no retained status came back within " + waitNs / 1_000_000 + " ms; seq is checked by the journal alone");
        }
        return done;
    }

    /** True when {@code topic} is the status topic (the message is taken here, and is no command). */
    boolean onMessage(String topic, byte[] payload) {
        if (!statusTopic.equals(topic)) {
            return false;
        }
        if (done) {
            return true;
        }
        JsonNode status;
        try {
            status = JSON.readTree(payload);
        } catch (IOException e) {
            finish("the retained status is not JSON; seq is checked by the journal alone");
            return true;
        }
        if (status == null || started.equals(status.path("started").asText())) {
            done = true; // this run's own status: the broker held none from before
            LOG.info("no status of an earlier run on the broker; seq continues from the journal");
            return true;
        }
        long[] last = new long[MessageKind.values().length];
        for (MessageKind k : MessageKind.values()) {
            // a Last Will carries the seqs given before its connection instead of last_seq
            JsonNode seqs = status.has("last_seq") ? status.path("last_seq") : status.path("last_seq_at_connect");
            last[k.ordinal()] = seqs.path(k.topic()).asLong(0);
        }
        try {
            List<Outbox.Loss> found = outbox.raiseSeqs(last, SeqCrossCheck::restamp);
            for (Outbox.Loss l : found) {
                LOG.error("RESULTS_LOST (the broker's retained status of {} knew more than the journal): {}",
                        status.path("started").asText("an earlier run"), OutboxResultSink.lossMessage(l));
            }
            done = true;
        } catch (ResultStoreException e) {
            // results stay held: a seq the plant has seen must not go out again
            LOG.error("cannot give this run's results seqs above the broker's last_seq: {}", e.getMessage());
        }
        return true;
    }

    private void finish(String why) {
        done = true;
        LOG.warn(why);
    }

    /** Every loss the outbox found since it opened, as the status's {@code lost} field; any thread. */
    public static List<Map<String, Object>> lostField(List<Outbox.Loss> losses) {
        List<Map<String, Object>> list = new ArrayList<>(losses.size());
        for (Outbox.Loss l : losses) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("kind", l.kind().topic());
            m.put("first_seq", l.firstSeq());
            m.put("last_seq", l.lastSeq());
            list.add(m);
        }
        return list;
    }

    /**
     * Writes {@code seq} into a stored message: the first {@code "seq":} field, which the head of
     * every result message puts before any field of free text (schema, id, seq, ...).
     */
    static byte[] restamp(byte[] payload, long seq) throws ResultStoreException {
        int at = indexOf(payload, SEQ_FIELD);
        if (at < 0) {
            throw new ResultStoreException("a stored result has no seq field");
        }
        int from = at + SEQ_FIELD.length;
        int to = from;
        while (to < payload.length && payload[to] >= '0' && payload[to] <= '9') {
            to++;
        }
        if (to == from) {
            throw new ResultStoreException("a stored result's seq is not a number");
        }
        byte[] digits = Long.toString(seq).getBytes(StandardCharsets.US_ASCII);
        byte[] out = new byte[payload.length - (to - from) + digits.length];
        System.arraycopy(payload, 0, out, 0, from);
        System.arraycopy(digits, 0, out, from, digits.length);
        System.arraycopy(payload, to, out, from + digits.length, payload.length - to);
        return out;
    }

    private static int indexOf(byte[] hay, byte[] needle) {
        outer:
        for (int i = 0; i + needle.length <= hay.length; i++) {
            for (int j = 0; j < needle.length; j++) {
                if (hay[i + j] != needle[j]) {
                    continue outer;
                }
            }
            return i;
        }
        return -1;
    }
}
