package hammerstep.station.loop;

import hammerstep.sequence.Sequence;
import hammerstep.station.LampMode;
import hammerstep.station.Lamps;
import hammerstep.station.TowerLamp;

/**
 * Turns the sequence's lamp modes into on/off writes: a blinking lamp is lit in the first half of
 * each blink period, the phase taken from the clock reading, so no timer thread is needed and all
 * blinking lamps blink together. Writes a lamp only when its state changes.
 */
public final class LampDriver {

    /** Blink period: 1 Hz, equal on and off. */
    public static final long DEFAULT_BLINK_PERIOD_NS = 1_000_000_000L;

    private static final TowerLamp[] TOWER = TowerLamp.values();

    private final Lamps lamps;
    private final long halfPeriodNs;
    private final boolean[] positionLit;
    private final boolean[] towerLit = new boolean[TOWER.length];

    public LampDriver(Lamps lamps, long blinkPeriodNs) {
        if (blinkPeriodNs < 2) {
            throw new IllegalArgumentException("blink period too short: " + blinkPeriodNs);
        }
        this.lamps = lamps;
        this.halfPeriodNs = blinkPeriodNs / 2;
        this.positionLit = new boolean[lamps.positionLamps()];
        for (int i = 0; i < positionLit.length; i++) {
            lamps.position(i, false);
        }
        for (TowerLamp t : TOWER) {
            lamps.tower(t, false);
        }
    }

    /** True when a blinking lamp is lit at {@code nowNs}. */
    public boolean blinkOn(long nowNs) {
        return Math.floorMod(nowNs / halfPeriodNs, 2L) == 0;
    }

    static boolean lit(LampMode mode, boolean blinkOn) {
        return mode == LampMode.STEADY || (mode == LampMode.BLINKING && blinkOn);
    }

    /**
     * The fault picture, written whatever the lamps show now: red lit, every other tower and position
     * lamp dark (a station that stopped must not leave a green or a position lamp lit that reads as
     * GO). Red is lit steadily because no further cycle may come to blink it. The next
     * {@link #apply} brings the lamps back to what the sequence asks.
     */
    public void faultPicture() {
        for (int i = 0; i < positionLit.length; i++) {
            positionLit[i] = false;
            lamps.position(i, false);
        }
        for (int k = 0; k < TOWER.length; k++) {
            boolean on = TOWER[k] == TowerLamp.RED;
            towerLit[k] = on;
            lamps.tower(TOWER[k], on);
        }
    }

    /** Brings every lamp to what {@code sequence} asks for at {@code nowNs}; returns the number of writes. */
    public int apply(Sequence sequence, long nowNs) {
        boolean blink = blinkOn(nowNs);
        int writes = 0;
        for (int i = 0; i < positionLit.length; i++) {
            boolean on = lit(sequence.positionLamp(i), blink);
            if (on != positionLit[i]) {
                positionLit[i] = on;
                lamps.position(i, on);
                writes++;
            }
        }
        for (int k = 0; k < TOWER.length; k++) {
            boolean on = lit(sequence.tower(TOWER[k]), blink);
            if (on != towerLit[k]) {
                towerLit[k] = on;
                lamps.tower(TOWER[k], on);
                writes++;
            }
        }
        return writes;
    }
}
