package hammerstep.sim.demo;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.MapReader;
import hammerstep.sim.physics.JointSpec;
import hammerstep.sim.physics.Presets;
import hammerstep.sim.physics.ToolSpec;
import hammerstep.sim.physics.TransducerSpec;
import hammerstep.sim.station.Habits;
import hammerstep.sim.station.VirtualStation;
import hammerstep.config.StationSection;

import java.nio.file.Path;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;

/**
 * The station file's {@code simulation:} section, read by hammerstep-sim only (the controller
 * accepts it unread): the modelled tool, joint and transducer, the fixture, the parts that come
 * down the line and the operator's habits. Keys in docs/patterns.md.
 */
public final class SimulationSection implements StationSection<SimulationSection.Simulation> {

    public static final SimulationSection INSTANCE = new SimulationSection();

    /** A stream of parts of one model with consecutive serial numbers. */
    public record PartStream(String model, String serialPrefix, int first, int digits) {
        public String serial(int k) {
            return serialPrefix + String.format("%0" + digits + "d", first + k);
        }
    }

    public record Simulation(double rateHz, int blockSamples, double internalRateHz, ToolSpec tool,
                             double supplyBar, double batteryV, JointSpec joint, TransducerSpec transducer,
                             String transducerSerial, LocalDate calibrationDue, VirtualStation.Fixture fixture,
                             List<PartStream> parts, Habits habits) {
    }

    /** The controller's station sections with this one in place of the unread {@code simulation}: what the demo reads. */
    public static List<StationSection<?>> withStationSections() {
        List<StationSection<?>> sections = new ArrayList<>(hammerstep.app.StationSections.all());
        sections.removeIf(s -> s.key().equals(INSTANCE.key()));
        sections.add(INSTANCE);
        return sections;
    }

    @Override
    public String key() {
        return "simulation";
    }

    @Override
    public Simulation read(MapReader r, Path base) {
        double rate = r.number("rate_hz", 20_000, 1_000, 200_000);
        int block = r.integer("block_samples", 64, 1, 8192);
        double internal = r.number("internal_rate_hz", 400_000, 50_000, 10_000_000);
        ToolSpec tool = preset(r, "tool", base, Presets::tool);
        double supply = r.number("supply_bar", Double.NaN, 0.5, 12);
        double battery = r.number("battery_v", Double.NaN, 6, 60);
        JointSpec joint = preset(r, "joint", base, Presets::joint);
        TransducerSpec transducer = r.has("transducer") ? preset(r, "transducer", base, Presets::transducer)
                : Presets.defaultTransducer();
        String serial = r.string("transducer_serial", "SIM-TQ-0001");
        LocalDate due = null;
        if (r.has("calibration_due")) {
            String text = r.string("calibration_due", "");
            try {
                due = LocalDate.parse(text);
            } catch (DateTimeParseException e) {
                r.problem("calibration_due", "'" + r.path("calibration_due") + "' is \"" + text
                        + "\": expected a date as YYYY-MM-DD");
            }
        }
        MapReader f = r.map("fixture");
        VirtualStation.Fixture fixture = new VirtualStation.Fixture(f.integer("positions", 1, 128),
                f.bool("part_present", true), f.bool("confirm_sensors", false), f.number("relay_delay_ms", 0, 0, 200));
        f.finish();
        List<PartStream> parts = new ArrayList<>();
        List<ConfigNode> items = r.list("parts", true);
        for (ConfigNode item : items) {
            MapReader p = MapReader.of(r.problems(), item);
            parts.add(new PartStream(p.string("model"), p.string("serial_prefix", ""), p.integer("first", 1, 0, 999_999_999),
                    p.integer("digits", 4, 1, 12)));
            p.finish();
        }
        if (items.isEmpty() && r.has("parts")) {
            r.problem("parts", "'" + r.path("parts") + "' is empty: expected at least one part stream");
        }
        Habits habits;
        try {
            habits = habits(r.map("operator"));
        } catch (IllegalArgumentException e) {
            habits = null; // a value out of its range, already reported by the reader with its line
        }
        r.finish();
        return new Simulation(rate, block, internal, tool, supply, battery, joint, transducer, serial, due, fixture,
                parts, habits);
    }

    private static Habits habits(MapReader o) {
        double reaction = o.number("reaction_ms", 400, 50, 10_000);
        double move = o.number("move_ms", 700, 0, 10_000);
        double release = o.number("release_after_ms", 150, 0, 10_000);
        double hold = o.number("max_hold_ms", 4000, 100, 60_000);
        double supervisor = o.number("supervisor_ms", 5000, 0, 600_000);
        double forgetMs = o.number("forget_ack_ms", 8000, 0, 600_000);
        MapReader m = o.optionalMap("mistakes");
        double skip = 0, rehit = 0, early = 0, longHold = 0, forget = 0, loosen = 0;
        if (m != null) {
            skip = m.number("skip", 0, 0, 1);
            rehit = m.number("rehit", 0, 0, 1);
            early = m.number("release_early", 0, 0, 1);
            longHold = m.number("hold_too_long", 0, 0, 1);
            forget = m.number("forget_ack", 0, 0, 1);
            loosen = m.number("loosen", 0, 0, 1);
            m.finish();
        }
        o.finish();
        return new Habits(reaction, move, release, hold, supervisor, skip, rehit, early, longHold, forget, forgetMs,
                loosen);
    }

    private interface Loader<T> {
        T load(String nameOrPath) throws ConfigException;
    }

    private static <T> T preset(MapReader r, String key, Path base, Loader<T> loader) {
        String v = r.string(key);
        if (v.isEmpty()) {
            return null;
        }
        String ref = Presets.isPath(v) ? base.resolve(v).toString() : v;
        try {
            return loader.load(ref);
        } catch (ConfigException e) {
            r.problem(key, "'" + r.path(key) + "': " + e.problems().get(0).message()
                    + (e.problems().get(0).line() > 0 ? " (" + e.problems().get(0) + ")" : ""));
            return null;
        }
    }
}
