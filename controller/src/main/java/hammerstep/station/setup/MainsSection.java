package hammerstep.station.setup;

import hammerstep.config.MapReader;
import hammerstep.config.StationSection;

import java.nio.file.Path;

/**
 * The optional {@code mains:} section: the frequency of the plant's mains, so that its hum and
 * harmonics are learned in the idle and taken off the torque signal before detection
 * ({@code hammerstep.signal.HumCanceller}). Without it nothing is removed, and hum of 6 N·m or more
 * is a sensor fault ({@code HUM}).
 *
 * <pre>
 * mains:
 *   frequency_hz: 50     # 50 or 60
 * </pre>
 */
public final class MainsSection implements StationSection<MainsSection.Mains> {

    public static final MainsSection INSTANCE = new MainsSection();

    /** @param frequencyHz 50 or 60; 0 when the station file names none */
    public record Mains(double frequencyHz) {
        public static final Mains NONE = new Mains(0);
    }

    @Override
    public String key() {
        return "mains";
    }

    @Override
    public boolean required() {
        return false;
    }

    @Override
    public Mains absent(Path base) {
        return Mains.NONE;
    }

    @Override
    public Mains read(MapReader r, Path base) {
        double hz = r.requiredNumber("frequency_hz", Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY);
        if (!Double.isNaN(hz) && hz != 50 && hz != 60) {
            r.problem("frequency_hz", "'" + r.path("frequency_hz") + "' is " + fmt(hz) + ": expected 50 or 60 (Hz)");
        }
        r.finish();
        return new Mains(hz == 50 || hz == 60 ? hz : 0);
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
