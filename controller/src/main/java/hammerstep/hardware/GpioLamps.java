package hammerstep.hardware;

import hammerstep.station.Lamps;
import hammerstep.station.TowerLamp;

import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * The station's {@link Lamps} on digital outputs: one per position, and the tower colours that are
 * fitted (a colour the station file leaves out is skipped). Station thread only; one GPIO write
 * per call.
 */
public final class GpioLamps implements Lamps {

    private final DigitalOut[] positions;
    private final DigitalOut[] tower = new DigitalOut[TowerLamp.values().length];

    /** @param tower outputs by colour name as in the station file ({@code red}, ...) */
    public GpioLamps(List<DigitalOut> positions, Map<String, DigitalOut> tower) {
        this.positions = positions.toArray(new DigitalOut[0]);
        Map<TowerLamp, DigitalOut> byLamp = new EnumMap<>(TowerLamp.class);
        tower.forEach((colour, out) -> byLamp.put(TowerLamp.valueOf(colour.toUpperCase(Locale.ROOT)), out));
        byLamp.forEach((lamp, out) -> this.tower[lamp.ordinal()] = out);
    }

    @Override
    public int positionLamps() {
        return positions.length;
    }

    @Override
    public void position(int index, boolean lit) {
        positions[index].set(lit);
    }

    @Override
    public void tower(TowerLamp lamp, boolean lit) {
        DigitalOut out = tower[lamp.ordinal()];
        if (out != null) {
            out.set(lit);
        }
    }

    /** Every lamp off. */
    public void allOff() {
        for (DigitalOut p : positions) {
            p.set(false);
        }
        for (DigitalOut t : tower) {
            if (t != null) {
                t.set(false);
            }
        }
    }
}
