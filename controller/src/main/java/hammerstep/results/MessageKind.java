package hammerstep.results;

/**
 * The kinds of result the outbox keeps. Each kind has its own gap-free {@code seq} per station,
 * so a subscriber of one topic alone can see a missing message.
 */
public enum MessageKind {
    JOINT("joint", "hammerstep.joint.v1"),
    PART("part", "hammerstep.part.v1"),
    EVENT("event", "hammerstep.event.v1");

    private final String topic;
    private final String schema;

    MessageKind(String topic, String schema) {
        this.topic = topic;
        this.schema = schema;
    }

    /** The last topic level under the station's prefix. */
    public String topic() {
        return topic;
    }

    /** The value of the message's {@code schema} field. */
    public String schema() {
        return schema;
    }

    private static final MessageKind[] VALUES = values();

    /** The kind stored under {@code code} ({@link #ordinal()}), or null for an unknown code. */
    public static MessageKind ofCode(int code) {
        return code >= 0 && code < VALUES.length ? VALUES[code] : null;
    }
}
