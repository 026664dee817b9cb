package hammerstep.sequence;

/** Who may release the tool after a NO-GO, so the position can be reworked. */
public enum Acknowledge {
    /** The operator's acknowledge button (the supervisor key also does). */
    OPERATOR("operator"),
    /** Only the supervisor key. */
    SUPERVISOR("supervisor");

    private final String key;

    Acknowledge(String key) {
        this.key = key;
    }

    public String key() {
        return key;
    }
}
