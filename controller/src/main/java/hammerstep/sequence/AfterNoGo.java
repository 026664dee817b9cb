package hammerstep.sequence;

/**
 * What a position that stays NO-GO after its last allowed attempt means for the rest of the part.
 * In every case the part can no longer end GO.
 */
public enum AfterNoGo {
    /** The part is rejected at once; the supervisor key ends it. */
    REJECT("reject"),
    /** The failed position is left out of the later passes; the rest of the pattern goes on. */
    SKIP_POSITION("skip_position"),
    /** The failed position stays in the later passes (a later pass may still bring it to torque). */
    CONTINUE("continue");

    private final String key;

    AfterNoGo(String key) {
        this.key = key;
    }

    public String key() {
        return key;
    }
}
