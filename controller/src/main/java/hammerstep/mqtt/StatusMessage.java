package hammerstep.mqtt;

import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.ResultMessages;
import hammerstep.results.ResultSink;
import hammerstep.results.StationId;
import hammerstep.station.StationClock;

import java.io.IOException;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.UUID;

/**
 * The station's retained status message: online on connect, again every status interval and when
 * the store's room changes, offline as the Last Will and at a clean stop. Carries the storage
 * state, the backlog, the last {@code seq} of each kind and what the station is doing. Delivery
 * thread only.
 */
final class StatusMessage {

    private static final long MS = 1_000_000L;

    private final Outbox outbox;
    private final StationId station;
    private final StationCommands commands;
    private final BrokerSettings settings;
    private final StationClock clock;
    private final String version;
    private final Instant started;

    /** This run's {@code started} as the status writes it. */
    String startedText() {
        return ResultMessages.time(started);
    }
    private long statusSeq;
    private long nextStatusNs;
    private ResultSink.Storage lastStorage;
    private RemoteCommands remote;

    StatusMessage(Outbox outbox, StationId station, StationCommands commands, BrokerSettings settings, StationClock clock,
                  String version) {
        this.outbox = outbox;
        this.station = station;
        this.commands = commands;
        this.settings = settings;
        this.clock = clock;
        this.version = version;
        this.started = clock.now();
    }

    /** True when the status is due: its interval passed, or the store's room changed. */
    boolean due(long nowNs) {
        return nowNs - nextStatusNs >= 0 || outbox.storage() != lastStorage;
    }

    /** Publishes the online status retained on {@code link}; throws when the link failed. */
    void publish(Link link, String topic, long nowNs) throws IOException {
        lastStorage = outbox.storage();
        nextStatusNs = nowNs + settings.statusIntervalS() * 1000 * MS;
        if (!link.publish(topic, bytes("online"), true, 0)) {
            nextStatusNs = nowNs; // no room in the client: again next cycle
        }
    }

    /** The command figures to report from now on. */
    void reportCommands(RemoteCommands commands) {
        this.remote = commands;
    }

    byte[] bytes(String state) {
        return ResultMessages.bytes(fields(state));
    }

    /**
     * The Last Will for a connection made now: offline, with this run's {@code started} and
     * {@code version}, and without the figures of the moment ({@code storage}, {@code backlog},
     * {@code last_seq}, ...), which would be stale when the broker publishes it. It carries
     * {@code last_seq_at_connect} instead: the seqs given before this connection, a floor for the
     * station's own cross check after a power cut, not a subscriber's tail check.
     */
    byte[] willBytes() {
        Map<String, Object> m = ResultMessages.head("hammerstep.status.v1", UUID.randomUUID().toString(), ++statusSeq,
                station, clock.now());
        m.put("state", "offline");
        m.put("started", ResultMessages.time(started));
        m.put("version", version);
        m.put("last_seq_at_connect", lastSeq());
        return ResultMessages.bytes(m);
    }

    private Map<String, Object> lastSeq() {
        Map<String, Object> last = new LinkedHashMap<>();
        for (MessageKind k : MessageKind.values()) {
            last.put(k.topic(), outbox.nextSeq(k) - 1);
        }
        return last;
    }

    Map<String, Object> fields(String state) {
        Map<String, Object> m = ResultMessages.head("hammerstep.status.v1", UUID.randomUUID().toString(), ++statusSeq,
                station, clock.now());
        m.put("state", state);
        m.put("started", ResultMessages.time(started));
        m.put("version", version);
        m.put("storage", outbox.storage().name());
        m.put("backlog", outbox.backlog());
        m.put("last_seq", lastSeq());
        List<Outbox.Loss> lost = outbox.losses();
        if (!lost.isEmpty()) {
            m.put("lost", SeqCrossCheck.lostField(lost));
        }
        StationCommands.Activity a = activity();
        Map<String, Object> act = new LinkedHashMap<>();
        act.put("mode", a.mode());
        act.put("part_serial", a.partSerial());
        act.put("part_model", a.partModel());
        act.put("pattern", a.pattern());
        if (a.queuedSerial() != null) {
            Map<String, Object> queued = new LinkedHashMap<>();
            queued.put("serial", a.queuedSerial());
            queued.put("model", a.queuedModel());
            act.put("queued_part", queued);
        } else {
            act.put("queued_part", null);
        }
        m.put("activity", act);
        StationCommands.DataGaps gaps = dataGaps();
        if (gaps != null) {
            Map<String, Object> g = new LinkedHashMap<>();
            g.put("outside_rundowns", gaps.outsideRundowns());
            g.put("during_rundowns", gaps.duringRundowns());
            m.put("data_gaps", g);
        }
        RemoteCommands r = remote;
        if (r != null) {
            RemoteCommands.Figures f = r.figures();
            Map<String, Object> c = new LinkedHashMap<>();
            c.put("received", f.received());
            c.put("answered", f.answered());
            c.put("refused", f.refused());
            c.put("busy", f.busy());
            c.put("dropped", f.dropped());
            c.put("waiting", f.waiting());
            m.put("commands", c);
        }
        return m;
    }

    private StationCommands.DataGaps dataGaps() {
        try {
            return commands.dataGaps();
        } catch (RuntimeException e) {
            return null;
        }
    }

    private StationCommands.Activity activity() {
        try {
            StationCommands.Activity a = commands.activity();
            return a == null ? StationCommands.Activity.UNKNOWN : a;
        } catch (RuntimeException e) {
            return StationCommands.Activity.UNKNOWN;
        }
    }
}
