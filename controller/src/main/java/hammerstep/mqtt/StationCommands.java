package hammerstep.mqtt;

import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionStage;

/**
 * What the station lets the plant ask of it over MQTT. The station implements this port and hands
 * it to the {@link ResultPublisher}; commands arrive already validated (well-formed, within size,
 * not expired).
 *
 * <p>Threading: every method is called on the delivery thread, never on the station thread, and
 * must not block: hand the command over to the station thread (e.g. through a queue it drains once
 * per duty cycle) and complete the returned stage there. The response is sent when it completes.
 */
public interface StationCommands {

    /**
     * The station's answer.
     *
     * @param code    {@code OK}, or an upper-case reason such as {@code BUSY} (a part is in progress),
     *                {@code UNKNOWN_MODEL}, {@code STORAGE_FULL}, {@code RELOAD_FAILED}
     * @param message one line for a person
     */
    record Reply(boolean ok, String code, String message) {

        public static Reply accepted(String message) {
            return new Reply(true, "OK", message);
        }

        public static Reply refused(String code, String message) {
            return new Reply(false, code, message);
        }
    }

    /**
     * What the station is doing, for status messages.
     *
     * @param mode         e.g. {@code READY}, {@code IN_PART}, {@code FAULT}; the station's own words
     * @param queuedSerial the part named for the fixture that has not arrived yet ({@code cmd/part}
     *                     answered "starts when it is in the fixture", or a scanned label), or null
     * @param queuedModel  its model, or null
     */
    record Activity(String mode, String partSerial, String partModel, String pattern, String queuedSerial,
                    String queuedModel) {

        public static final Activity UNKNOWN = new Activity("UNKNOWN", null, null, null);

        /** Without a queued part. */
        public Activity(String mode, String partSerial, String partModel, String pattern) {
            this(mode, partSerial, partModel, pattern, null, null);
        }
    }

    /** {@code cmd/part}: a part with this serial and model is in the fixture; the model selects the pattern. */
    CompletionStage<Reply> startPart(String serial, String model);

    /**
     * {@code cmd/end-part}: end the part in progress as abandoned, with the requester's reason; with no
     * part in progress, cancel the part that waits for the fixture (it never started, so nothing is stored).
     */
    CompletionStage<Reply> endPart(String reason);

    /** {@code cmd/reload}: read the program and pattern files again, after the part in progress. */
    CompletionStage<Reply> reloadPrograms();

    /** A snapshot of the station's activity; thread-safe. */
    Activity activity();

    /**
     * Gaps in the torque samples since the station started (blocks the sample ring dropped,
     * conversions the acquisition missed, blocks out of time), for status messages.
     *
     * @param outsideRundowns gaps while no rundown was under way: counted, not a fault
     * @param duringRundowns  gaps that fell into a rundown: each made its joint NO-GO {@code SENSOR_FAULT}
     */
    record DataGaps(long outsideRundowns, long duringRundowns) {
    }

    /** The data gaps counted so far, or null when this station does not count them; thread-safe. */
    default DataGaps dataGaps() {
        return null;
    }

    /** A station that takes no commands (before one is wired in). */
    StationCommands NONE = new StationCommands() {
        private CompletionStage<Reply> none() {
            return CompletableFuture.completedFuture(Reply.refused("UNAVAILABLE", "this station takes no commands"));
        }

        @Override
        public CompletionStage<Reply> startPart(String serial, String model) {
            return none();
        }

        @Override
        public CompletionStage<Reply> endPart(String reason) {
            return none();
        }

        @Override
        public CompletionStage<Reply> reloadPrograms() {
            return none();
        }

        @Override
        public Activity activity() {
            return Activity.UNKNOWN;
        }
    };
}
