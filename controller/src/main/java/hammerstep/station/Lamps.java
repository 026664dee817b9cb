package hammerstep.station;

/**
 * The lamps the operator follows: one per position of the pattern (numbered from 0 in the
 * pattern's position list) and the {@link TowerLamp}s. The port switches lamps on and off; the
 * station loop makes them blink by switching them at the blink phase, and calls only on a change.
 *
 * <p>Threading: station thread only; each call must return in microseconds (a GPIO write).
 */
public interface Lamps {

    /** How many position lamps are fitted; a pattern with more positions cannot run on this station. */
    int positionLamps();

    /** Switches position lamp {@code index} (0-based) on or off. */
    void position(int index, boolean lit);

    void tower(TowerLamp lamp, boolean lit);
}
