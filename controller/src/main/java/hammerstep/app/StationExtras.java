package hammerstep.app;

import hammerstep.health.InterferenceSection;
import hammerstep.health.InterferenceWatch;
import hammerstep.health.ToolHealth;
import hammerstep.health.ToolHealthSection;
import hammerstep.station.loop.StationAgent;
import hammerstep.station.setup.StationConfig;
import hammerstep.trace.TraceKeeper;
import hammerstep.trace.TracesSection;

import java.io.IOException;

/**
 * Attaches the line engineer's watches to a station loop, from the station file: the trace keeper
 * ({@code traces:}, off without the section), tool health ({@code tool_health:}, on by default) and
 * the interference warning ({@code interference:}, on by default).
 * Used by {@code hammerstep run} and by the simulator's demo alike.
 */
public final class StationExtras {

    private StationExtras() {
    }

    public static void attach(StationAgent agent, StationConfig config, double rateHz) {
        TracesSection.Traces traces = config.get(TracesSection.INSTANCE);
        if (traces != null) {
            try {
                agent.keepTraces(TraceKeeper.open(traces, rateHz));
            } catch (IOException e) {
                throw new UserError(config.file() + ": traces: cannot use " + traces.dir() + ": " + e.getMessage());
            }
        }
        ToolHealthSection.Watch watch = config.has(ToolHealthSection.INSTANCE) ? config.get(ToolHealthSection.INSTANCE)
                : ToolHealthSection.Watch.DEFAULT;
        if (watch.enabled()) {
            agent.watchTool(watch.tool(), new ToolHealth(watch.settings()));
        }
        InterferenceSection.Watch interference = config.has(InterferenceSection.INSTANCE)
                ? config.get(InterferenceSection.INSTANCE) : InterferenceSection.Watch.DEFAULT;
        if (interference.enabled()) {
            agent.watchInterference(new InterferenceWatch(interference.warnPerHour()));
        }
    }
}
