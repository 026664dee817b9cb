package hammerstep.web;

import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;

import java.time.Instant;
import java.util.List;

/**
 * The stored results the web view shows: the last joints, parts and events as the station stored
 * them (each with its message id and seq), kept in memory in bounded rings. Written by the station
 * thread (through {@link LiveBoard}), read by the web's threads; no lock.
 */
public final class ResultLog {

    /** A stored joint with its message identity. */
    public record JointRow(String id, long seq, JointOutcome joint) { }

    /** A stored part with its message identity. */
    public record PartRow(String id, long seq, PartOutcome part) { }

    /** A stored event (or a store failure, as an ALARM {@code STORE_FAILED} with seq -1). */
    public record EventRow(String id, long seq, StationEvent event) { }

    /** Joints kept by default: about 10 MB of heap (estimate: about 1 kB a joint with its blows). */
    public static final int DEFAULT_JOINTS = 10_000;

    private final Ring<JointRow> joints;
    private final Ring<PartRow> parts;
    private final Ring<EventRow> events = new Ring<>(200);

    public ResultLog(int maxJoints) {
        this.joints = new Ring<>(maxJoints);
        this.parts = new Ring<>(Math.max(1, maxJoints / 2));
    }

    void joint(JointOutcome joint, ResultSink.Receipt receipt) {
        joints.add(new JointRow(receipt.id(), receipt.seq(), joint));
    }

    /** Ids of the joints read back from the journal at start (their blows' times are not known). */
    private final java.util.Set<String> restored = java.util.concurrent.ConcurrentHashMap.newKeySet();

    /** A joint read back from the journal at start, before the station stores anything new. */
    void restoredJoint(JointOutcome joint, ResultSink.Receipt receipt) {
        restored.add(receipt.id());
        joints.add(new JointRow(receipt.id(), receipt.seq(), joint));
    }

    /** True when the joint with this id was read back from the journal at start. */
    public boolean restored(String id) {
        return restored.contains(id);
    }

    void part(PartOutcome part, ResultSink.Receipt receipt) {
        parts.add(new PartRow(receipt.id(), receipt.seq(), part));
    }

    void event(StationEvent event, ResultSink.Receipt receipt) {
        events.add(new EventRow(receipt.id(), receipt.seq(), event));
    }

    void storeFailed(String message) {
        events.add(new EventRow("", -1, new StationEvent(StationEvent.Severity.ALARM, "STORE_FAILED",
                "a result could not be stored: " + message, null, Instant.now())));
    }

    /** The joints kept, oldest first. */
    public List<JointRow> joints() {
        return joints.items();
    }

    /** Joints stored since the station started, including those no longer kept. */
    public long jointsStored() {
        return joints.added();
    }

    /** Events stored (or store failures) since the station started, including those no longer kept. */
    public long eventsStored() {
        return events.added();
    }

    public List<PartRow> parts() {
        return parts.items();
    }

    public List<EventRow> events() {
        return events.items();
    }

    /** The joint with message id {@code id}, or null when it is not (or no longer) kept. */
    public JointRow joint(String id) {
        List<JointRow> all = joints.items();
        for (int i = all.size() - 1; i >= 0; i--) {
            if (all.get(i).id().equals(id)) {
                return all.get(i);
            }
        }
        return null;
    }
}
