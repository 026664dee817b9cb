package hammerstep.station;

/**
 * The operator's and the fixture's inputs, read as levels once per duty cycle by the station
 * thread; the station finds the edges. Debouncing belongs to the adapter: a level it reports is
 * already stable.
 *
 * <p>Optional inputs (part present, position confirm sensors, trigger) say whether they are fitted;
 * the station ignores one that is not.
 */
public interface OperatorInputs {

    /** Position confirm value when no single confirm sensor is active, or none are fitted. */
    int NO_POSITION = -1;

    /** True while the acknowledge button is held. */
    boolean acknowledge();

    /** True while the supervisor key is turned. */
    boolean supervisorKey();

    /** True when a part-present sensor is fitted. */
    boolean hasPartPresent();

    /** True while a part sits in the fixture; meaningful only when {@link #hasPartPresent()}. */
    boolean partPresent();

    /** True when every position of the fixture has a confirm sensor (socket tray, arm encoder, ...). */
    boolean hasConfirmSensors();

    /**
     * The 0-based position whose confirm sensor is active, or {@link #NO_POSITION} when none or more
     * than one is active.
     */
    int confirmedPosition();

    /** True when the tool's trigger or air-flow signal is wired. */
    boolean hasTrigger();

    /** True while the trigger is pulled (or air flows); meaningful only when {@link #hasTrigger()}. */
    boolean trigger();
}
