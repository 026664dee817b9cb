package hammerstep.sim.station;

import hammerstep.station.LampMode;
import hammerstep.station.Lamps;
import hammerstep.station.TowerLamp;

/**
 * Lamps of the virtual station: remembers each lamp's state and when it last changed, so an onlooker
 * (the scripted operator) can tell a steady lamp from a blinking one as a person would, by watching
 * for a moment.
 */
public final class VirtualLamps implements Lamps {

    private final boolean[] lit;
    private final long[] changedNs;
    private final int positions;
    private long nowNs;
    private final long watchNs;

    /**
     * @param watchNs how long an onlooker watches a lamp before calling it steady (a little more than a blink period)
     */
    public VirtualLamps(int positions, long watchNs) {
        this.positions = positions;
        this.lit = new boolean[positions + TowerLamp.values().length];
        this.changedNs = new long[lit.length];
        java.util.Arrays.fill(changedNs, Long.MIN_VALUE / 2);
        this.watchNs = watchNs;
    }

    /** The time stamped on the next changes; set by the virtual station before each station cycle. */
    void now(long ns) {
        this.nowNs = ns;
    }

    @Override
    public int positionLamps() {
        return positions;
    }

    @Override
    public void position(int index, boolean on) {
        set(index, on);
    }

    @Override
    public void tower(TowerLamp lamp, boolean on) {
        set(positions + lamp.ordinal(), on);
    }

    private void set(int k, boolean on) {
        if (lit[k] != on) {
            lit[k] = on;
            changedNs[k] = nowNs;
        }
    }

    public boolean positionLit(int index) {
        return lit[index];
    }

    public boolean towerLit(TowerLamp lamp) {
        return lit[positions + lamp.ordinal()];
    }

    /** What an onlooker who has watched until {@code atNs} makes of a position lamp. */
    public LampMode seenPosition(int index, long atNs) {
        return seen(index, atNs);
    }

    public LampMode seenTower(TowerLamp lamp, long atNs) {
        return seen(positions + lamp.ordinal(), atNs);
    }

    private LampMode seen(int k, long atNs) {
        boolean recent = atNs - changedNs[k] < watchNs;
        if (recent) {
            return LampMode.BLINKING;
        }
        return lit[k] ? LampMode.STEADY : LampMode.OFF;
    }
}
