package hammerstep.results;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.station.StationClock;
import hammerstep.station.SystemStationClock;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.UUID;
import java.util.function.Supplier;

/**
 * The station's {@link ResultSink} on top of an {@link Outbox}: gives each result its id and the
 * next {@code seq} of its kind, writes the message and stores it durably; delivery happens on
 * another thread that reads the outbox. Never touches the network.
 *
 * <p>When the outbox's storage state changes, the sink records an event of its own
 * ({@code STORAGE_LOW} warning, {@code STORAGE_FULL} alarm, {@code STORAGE_OK} notice), so the
 * station only has to show the lamp. When the outbox reported damage at start, the first call
 * records a {@code OUTBOX_RECOVERED} warning. Each range of results the outbox found gone (at start,
 * or later by the cross check with the broker) is recorded as a {@code RESULTS_LOST} alarm naming
 * the kind and the seq range, before the record that the call stores; see {@link #reportLosses()}.
 */
public final class OutboxResultSink implements ResultSink {

    private final Outbox outbox;
    private final StationId station;
    private final Supplier<String> ids;
    private final StationClock clock;
    private Storage lastStorage = Storage.OK;
    private boolean recoveryReported;

    public OutboxResultSink(Outbox outbox, StationId station, Supplier<String> ids, StationClock clock) {
        this.outbox = outbox;
        this.station = station;
        this.ids = ids;
        this.clock = clock;
    }

    /** Random (type 4) UUIDs as ids, the system clock for the sink's own events. */
    public OutboxResultSink(Outbox outbox, StationId station) {
        this(outbox, station, () -> UUID.randomUUID().toString(), new SystemStationClock());
    }

    @Override
    public Receipt joint(JointOutcome joint) throws ResultStoreException {
        reportRecovery();
        String id = ids.get();
        long seq = outbox.nextSeq(MessageKind.JOINT);
        outbox.append(MessageKind.JOINT, seq, id, ResultMessages.joint(station, id, seq, joint));
        return after(new Receipt(id, seq));
    }

    @Override
    public Receipt part(PartOutcome part) throws ResultStoreException {
        reportRecovery();
        String id = ids.get();
        long seq = outbox.nextSeq(MessageKind.PART);
        outbox.append(MessageKind.PART, seq, id, ResultMessages.part(station, id, seq, part));
        return after(new Receipt(id, seq));
    }

    @Override
    public Receipt event(StationEvent event) throws ResultStoreException {
        reportRecovery();
        Receipt r = store(event);
        return after(r);
    }

    /** From the joints the outbox found after its last part record; those of the last joint's part. */
    @Override
    public UnfinishedPart unfinishedPart() {
        List<Outbox.Entry> joints = outbox.unfinishedPartJoints();
        if (joints.isEmpty()) {
            return null;
        }
        ObjectMapper json = new ObjectMapper();
        List<JsonNode> parsed = new ArrayList<>();
        for (Outbox.Entry e : joints) {
            try {
                parsed.add(json.readTree(e.payload()));
            } catch (IOException ex) {
                parsed.add(null); // not ours to judge here; the publisher sends it as stored
            }
        }
        JsonNode last = null;
        for (JsonNode n : parsed) {
            if (n != null && n.hasNonNull("part_serial")) {
                last = n;
            }
        }
        if (last == null) {
            return null;
        }
        String serial = last.get("part_serial").asText();
        List<String> ids = new ArrayList<>();
        for (int k = 0; k < joints.size(); k++) {
            JsonNode n = parsed.get(k);
            if (n != null && n.hasNonNull("part_serial") && serial.equals(n.get("part_serial").asText())) {
                ids.add(joints.get(k).id());
            }
        }
        return new UnfinishedPart(serial, text(last, "part_model"), text(last, "pattern"), ids);
    }

    private static String text(JsonNode n, String field) {
        JsonNode v = n.get(field);
        return v == null || v.isNull() ? null : v.asText();
    }

    @Override
    public Storage storage() {
        return outbox.storage();
    }

    /** Records that arrived at the outbox and are not yet acknowledged by the broker. */
    public long backlog() {
        return outbox.backlog();
    }

    /**
     * At start: when the store is already LOW or FULL, records its {@code STORAGE_LOW} warning or
     * {@code STORAGE_FULL} alarm now (it goes out when the broker is reached), as it would have been
     * recorded had the store filled in service. Call once, before the first result of the run.
     * Appender thread.
     *
     * @return the store's state
     */
    public Storage reportStorageAtStart() throws ResultStoreException {
        Storage now = outbox.storage();
        if (now != Storage.OK && lastStorage == Storage.OK) {
            lastStorage = now;
            if (now == Storage.FULL) {
                store(new StationEvent(StationEvent.Severity.ALARM, "STORAGE_FULL",
                        "result storage is full at start: no new part can start until results are delivered",
                        null, clock.now()));
            } else {
                store(new StationEvent(StationEvent.Severity.WARNING, "STORAGE_LOW",
                        "result storage is running low at start; results are kept, clear space or restore the network",
                        null, clock.now()));
            }
        }
        return now;
    }

    private Receipt store(StationEvent event) throws ResultStoreException {
        String id = ids.get();
        long seq = outbox.nextSeq(MessageKind.EVENT);
        outbox.append(MessageKind.EVENT, seq, id, ResultMessages.event(station, id, seq, event));
        return new Receipt(id, seq);
    }

    private Receipt after(Receipt r) throws ResultStoreException {
        Storage now = outbox.storage();
        if (now != lastStorage) {
            lastStorage = now;
            switch (now) {
                case LOW -> store(new StationEvent(StationEvent.Severity.WARNING, "STORAGE_LOW",
                        "result storage is running low; results are kept, clear space or restore the network",
                        null, clock.now()));
                case FULL -> store(new StationEvent(StationEvent.Severity.ALARM, "STORAGE_FULL",
                        "result storage is full: no new part can start until results are delivered",
                        null, clock.now()));
                case OK -> store(new StationEvent(StationEvent.Severity.NOTICE, "STORAGE_OK",
                        "result storage has room again", null, clock.now()));
            }
        }
        return r;
    }

    private void reportRecovery() throws ResultStoreException {
        if (!recoveryReported) {
            recoveryReported = true;
            Outbox.Recovery rec = outbox.recovery();
            if (!rec.notes().isEmpty() || rec.tornBytes() != 0) {
                store(new StationEvent(StationEvent.Severity.WARNING, "OUTBOX_RECOVERED",
                        "result store repaired at start: " + String.join("; ", rec.notes()), null, clock.now()));
            }
        }
        reportLosses();
    }

    /**
     * Stores a {@code RESULTS_LOST} alarm for each loss the outbox has not yet seen reported, then
     * tells the outbox they are. Called before every record the sink stores; call it once at start
     * too, so a loss found at opening is on its way at once. Station (appender) thread.
     *
     * @return the losses reported now
     */
    public List<Outbox.Loss> reportLosses() throws ResultStoreException {
        List<Outbox.Loss> losses = outbox.unreportedLosses();
        if (losses.isEmpty()) {
            return losses;
        }
        for (Outbox.Loss l : losses) {
            store(new StationEvent(StationEvent.Severity.ALARM, "RESULTS_LOST", lossMessage(l), null, clock.now()));
        }
        outbox.lossesReported(losses);
        return losses;
    }

    /** One line for a person: what is gone, and that its seqs are not given again. */
    public static String lossMessage(Outbox.Loss l) {
        return l.count() + (l.count() == 1 ? " stored " + l.kind().topic() + " result is" : " stored "
                + l.kind().topic() + " results are") + " gone from the station's journal: " + l.range()
                + "; these seqs are not given again (results you already received with them stand)";
    }
}
