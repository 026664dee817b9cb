package hammerstep.sim.demo;

import hammerstep.results.StationId;
import hammerstep.sim.station.SimulatedStation;
import hammerstep.station.setup.StationConfig;

import java.io.PrintStream;
import java.util.Locale;

/** One line per result or event, stamped with virtual time: for logs, pipes and tests. */
final class PlainView implements DemoView {

    private final PrintStream out;

    PlainView(PrintStream out) {
        this.out = out;
    }

    @Override
    public void start(StationId id, StationConfig config, int parts) {
        out.println("demo station " + id + " (" + config.file() + ", revision " + config.revision() + "), "
                + DemoText.count(parts, "part"));
    }

    @Override
    public void status(String text) {
        out.println(text);
    }

    @Override
    public void line(long nowNs, String text) {
        out.println(String.format(Locale.ROOT, "%9.3f s  %s", nowNs * 1e-9, text));
    }

    @Override
    public void frame(SimulatedStation station, DemoTally tally) {
    }

    @Override
    public void end(SimulatedStation station, DemoTally tally) {
    }
}
