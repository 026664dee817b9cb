package hammerstep.health;

import hammerstep.results.StationEvent;

import java.time.Instant;

/** The station events of tool health: {@code TOOL_WEAK} (warning, yellow lamp) and {@code TOOL_OK} (notice). */
public final class ToolHealthEvents {

    public static final String WEAK = "TOOL_WEAK";
    public static final String OK = "TOOL_OK";

    private ToolHealthEvents() {
    }

    public static StationEvent of(ToolHealth.Change change, String partSerial, Instant at) {
        return new StationEvent(change.weak() ? StationEvent.Severity.WARNING : StationEvent.Severity.NOTICE,
                change.weak() ? WEAK : OK, change.message(), partSerial, at);
    }
}
