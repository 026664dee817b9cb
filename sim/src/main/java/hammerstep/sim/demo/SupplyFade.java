package hammerstep.sim.demo;

import hammerstep.sim.physics.DriveSpec;
import hammerstep.sim.physics.ToolSpec;
import hammerstep.sim.station.RigToolModel;

/**
 * The demo's falling supply ({@code --supply-drop PERCENT}): the first parts run at the nominal
 * supply, so the station learns its tool-health baseline; then, part by part, the air pressure
 * (air tools) or the battery voltage (cordless tools) falls linearly until it is PERCENT lower for
 * the last part. This is how a long hose, a shared air line or a battery running down shows.
 */
final class SupplyFade {

    /** Parts worked at full supply before the fall begins. */
    static final int STEADY_PARTS = 2;

    private final RigToolModel tool;
    private final boolean air;
    private final double nominal;
    private final double dropFraction;
    private final int parts;
    private int applied = -1;

    /** @param nominal the supply the run starts at: bar for an air tool, volts for a cordless tool */
    SupplyFade(RigToolModel tool, ToolSpec spec, double nominal, double dropPercent, int parts) {
        this.tool = tool;
        this.air = spec.drive() instanceof DriveSpec.Air;
        this.nominal = nominal;
        this.dropFraction = dropPercent / 100;
        this.parts = parts;
    }

    static double nominalOf(ToolSpec spec, double supplyBar, double batteryV) {
        if (spec.drive() instanceof DriveSpec.Air a) {
            return Double.isNaN(supplyBar) ? a.referencePressureBar() : supplyBar;
        }
        return Double.isNaN(batteryV) ? ((DriveSpec.Cordless) spec.drive()).voltageV() : batteryV;
    }

    /** The supply for part {@code index} (0-based). */
    double level(int index) {
        if (index < STEADY_PARTS || parts <= STEADY_PARTS) {
            return nominal;
        }
        double f = Math.min(1.0, (index - STEADY_PARTS + 1) / (double) (parts - STEADY_PARTS));
        return nominal * (1 - dropFraction * f);
    }

    /** Sets the supply for the part now being worked (after {@code partsDone} parts); returns a line when it changed. */
    String update(int partsDone) {
        if (partsDone == applied || dropFraction == 0 || partsDone >= parts) {
            return null;
        }
        applied = partsDone;
        double v = level(partsDone);
        if (air) {
            tool.setSupplyPressureBar(v);
        } else {
            tool.setBatteryVoltage(v);
        }
        return partsDone < STEADY_PARTS && partsDone > 0 ? null : String.format(java.util.Locale.ROOT,
                "supply: %s now %.2f %s (%.0f %% below nominal)", air ? "air pressure" : "battery voltage", v,
                air ? "bar" : "V", 100 * (1 - v / nominal));
    }
}
