package hammerstep.sim.station;

import hammerstep.station.LampMode;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;

import java.util.Collections;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * An operator who follows the lamps of a {@link VirtualStation}, with the habits and mistakes of
 * {@link Habits}, deterministic from a seed. Call {@link #onTick(long)} once per station cycle.
 *
 * <p>What they do: at white (ready) they load the next part and scan it; at blue with one position
 * lamp blinking they put the socket on that position and pull the trigger until the tool stops; at
 * red with blue blinking (rework) they press acknowledge, and call the supervisor when that does not
 * release the tool; at red blinking (rejected, or a fault) the supervisor turns the key; at green
 * they take the part out.
 */
public final class ScriptedOperator {

    private enum Doing { LOOKING, MOVING, TIGHTENING, RELEASED, PRESSING, WAITING_SUPERVISOR, KEYING, LOADING, DONE }

    /** Loosening, the operator lets go once no strike came for this long. */
    static final double LOOSE_AFTER_MS = 60;

    private final VirtualStation station;
    private final Habits habits;
    private final SplittableRandom random;
    private final List<PartIdentity> parts;
    private final int positions;

    private Doing doing = Doing.LOOKING;
    private long untilNs;
    private long startedNs;
    private int target = -1;
    private int lastDone = -1;
    private boolean partLoaded;
    private int nextPart;
    private boolean releaseEarlyNow;
    private boolean holdLongNow;
    private int reworkStage;
    private long toolStoppedNs = Long.MIN_VALUE;

    private int mistakes;
    private final Map<Mistake, Integer> mistakesByKind = new EnumMap<>(Mistake.class);
    private int socketAt = -1;
    private boolean poweredSeen;
    private int blowsAtStart;
    private int earlyBlows;
    private boolean loosenNow;
    private int blowsSeen;
    private long lastBlowNs;

    public ScriptedOperator(VirtualStation station, Habits habits, List<PartIdentity> parts, long seed) {
        this.station = station;
        this.habits = habits;
        this.random = new SplittableRandom(seed);
        this.parts = List.copyOf(parts);
        this.positions = station.fixture().positions();
    }

    /** True once every part was loaded and the last one taken out again. */
    public boolean finished() {
        return doing == Doing.DONE;
    }

    /** Mistakes made so far (each drawn habit that fired). */
    public int mistakes() {
        return mistakes;
    }

    /** The mistakes made so far by kind, in the order of the habits; kinds never made are left out. */
    public Map<Mistake, Integer> mistakesByKind() {
        return Collections.unmodifiableMap(mistakesByKind);
    }

    /** The kinds of mistake, named as the station file's {@code operator.mistakes} keys. */
    public enum Mistake {
        SKIP("skip"), REHIT("rehit"), RELEASE_EARLY("release_early"), HOLD_TOO_LONG("hold_too_long"),
        FORGET_ACK("forget_ack"), LOOSEN("loosen");

        private final String key;

        Mistake(String key) {
            this.key = key;
        }

        /** The habit's key in the station file. */
        public String key() {
            return key;
        }
    }

    public void onTick(long nowNs) {
        if (nowNs - untilNs < 0) {
            return;
        }
        switch (doing) {
            case LOOKING -> look(nowNs);
            case MOVING -> {
                station.moveToolTo(target);
                socketAt = target;
                station.tool().setReverse(loosenNow);
                startTightening(nowNs);
            }
            case TIGHTENING -> tighten(nowNs);
            case RELEASED -> doing = Doing.LOOKING;
            case PRESSING -> {
                station.pressAcknowledge(false);
                doing = Doing.LOOKING;
                busyFor(nowNs, 0.5 * habits.reactionMs());
            }
            case WAITING_SUPERVISOR -> {
                station.turnKey(true);
                doing = Doing.KEYING;
                untilNs = nowNs + 300_000_000L;
            }
            case KEYING -> {
                station.turnKey(false);
                reworkStage = 0;
                doing = Doing.LOOKING;
                busyFor(nowNs, habits.reactionMs());
            }
            case LOADING -> {
                station.scan(parts.get(nextPart++));
                doing = Doing.LOOKING;
                busyFor(nowNs, 2 * habits.reactionMs());
            }
            default -> { }
        }
    }

    private void look(long now) {
        VirtualLamps l = station.lamps();
        LampMode white = l.seenTower(TowerLamp.WHITE, now);
        LampMode blue = l.seenTower(TowerLamp.BLUE, now);
        LampMode red = l.seenTower(TowerLamp.RED, now);
        LampMode green = l.seenTower(TowerLamp.GREEN, now);
        if (red == LampMode.STEADY && blue == LampMode.BLINKING) {
            rework(now);
            return;
        }
        if (red != LampMode.BLINKING) {
            reworkStage = 0;
        }
        if (red == LampMode.BLINKING && blue == LampMode.OFF) {
            callSupervisor(now);
            return;
        }
        if (blue == LampMode.STEADY) {
            int lit = blinkingPosition(now);
            if (lit >= 0) {
                prompt(lit, now);
            }
            return;
        }
        if (green == LampMode.STEADY && partLoaded && allPositionsSteady(now)) {
            unload(now);
            return;
        }
        if (white == LampMode.STEADY) {
            if (partLoaded) {
                unload(now); // the part ended (rejected or abandoned): take it out
                return;
            }
            if (nextPart < parts.size()) {
                station.loadPart();
                partLoaded = true;
                lastDone = -1;
                doing = Doing.LOADING;
                busyFor(now, habits.reactionMs());
            } else {
                doing = Doing.DONE;
            }
        }
    }

    private void unload(long now) {
        station.moveToolTo(VirtualStation.NO_POSITION);
        socketAt = -1;
        station.removePart();
        partLoaded = false;
        busyFor(now, 2 * habits.reactionMs());
    }

    private boolean allPositionsSteady(long now) {
        for (int i = 0; i < positions; i++) {
            if (station.lamps().seenPosition(i, now) == LampMode.BLINKING) {
                return false;
            }
        }
        return true;
    }

    private int blinkingPosition(long now) {
        int found = -1;
        for (int i = 0; i < positions; i++) {
            if (station.lamps().seenPosition(i, now) == LampMode.BLINKING) {
                if (found >= 0) {
                    return -1; // two look lit-and-changing: watch a moment longer
                }
                found = i;
            }
        }
        return found;
    }

    private void prompt(int lit, long now) {
        int go = lit;
        loosenNow = false;
        if (lastDone >= 0 && draw(Mistake.LOOSEN, habits.loosen())) {
            go = lastDone;
            loosenNow = true;
        } else if (lastDone >= 0 && draw(Mistake.REHIT, habits.rehit())) {
            go = lastDone;
        } else if (positions > 1 && draw(Mistake.SKIP, habits.skip())) {
            go = (lit + 1) % positions;
        }
        lastDone = -1;
        target = go;
        releaseEarlyNow = draw(Mistake.RELEASE_EARLY, habits.releaseEarly());
        earlyBlows = 1 + random.nextInt(2);
        holdLongNow = draw(Mistake.HOLD_TOO_LONG, habits.holdTooLong());
        doing = Doing.MOVING;
        busyFor(now, habits.reactionMs() + (go != socketAt ? habits.moveMs() : 0));
    }

    private void startTightening(long now) {
        station.pullTrigger(true);
        doing = Doing.TIGHTENING;
        startedNs = now;
        toolStoppedNs = Long.MIN_VALUE;
        poweredSeen = false;
        blowsAtStart = station.tool().blows();
        blowsSeen = blowsAtStart;
        lastBlowNs = now;
        untilNs = now;
    }

    /**
     * In reverse: lets go as the hammering stops (no strike for {@link #LOOSE_AFTER_MS}, a few blow
     * intervals), the bolt broken loose but not run off its thread.
     */
    private boolean loosened(long now) {
        int blows = station.tool().blows();
        if (blows != blowsSeen) {
            blowsSeen = blows;
            lastBlowNs = now;
        }
        return blows > blowsAtStart && now - lastBlowNs >= (long) (LOOSE_AFTER_MS * 1e6);
    }

    private void tighten(long now) {
        boolean stopped = !station.toolPowered();
        if (!stopped) {
            poweredSeen = true;
        } else if (!poweredSeen) {
            if (now - startedNs >= 1_000_000_000L) { // the tool does not run here: let go and look again
                station.pullTrigger(false);
                doing = Doing.RELEASED;
                busyFor(now, habits.reactionMs());
            }
            return;
        }
        int blows = station.tool().blows();
        boolean letGo = false;
        if (loosenNow) {
            letGo = loosened(now);
        } else if (releaseEarlyNow && blows - blowsAtStart >= earlyBlows) {
            letGo = true;
        } else if (stopped) {
            if (toolStoppedNs == Long.MIN_VALUE) {
                toolStoppedNs = now;
            }
            double afterMs = habits.releaseAfterMs() * (holdLongNow ? 10 : 1);
            letGo = now - toolStoppedNs >= (long) (afterMs * 1e6);
        } else {
            toolStoppedNs = Long.MIN_VALUE;
        }
        if (now - startedNs >= (long) (habits.maxHoldMs() * 1e6)) {
            letGo = true;
        }
        if (letGo) {
            station.pullTrigger(false);
            lastDone = loosenNow ? -1 : target;
            doing = Doing.RELEASED;
            busyFor(now, habits.reactionMs());
        }
    }

    /** Rework seen: maybe forget for a while, then press acknowledge, then call the supervisor if that did not help. */
    private void rework(long now) {
        switch (reworkStage) {
            case 0 -> {
                reworkStage = 1;
                if (draw(Mistake.FORGET_ACK, habits.forgetAck())) {
                    busyFor(now, habits.forgetAckMs());
                } else {
                    busyFor(now, habits.reactionMs());
                }
            }
            case 1 -> {
                reworkStage = 2;
                station.pressAcknowledge(true);
                doing = Doing.PRESSING;
                untilNs = now + 200_000_000L;
            }
            default -> {
                reworkStage = 0;
                callSupervisor(now);
            }
        }
    }

    private void callSupervisor(long now) {
        doing = Doing.WAITING_SUPERVISOR;
        busyFor(now, habits.supervisorMs());
    }

    /** The operator is busy (noticing, moving, waiting for the supervisor) for about {@code meanMs}, scattered ±40 %. */
    private void busyFor(long now, double meanMs) {
        double ms = meanMs * (0.6 + 0.8 * random.nextDouble());
        untilNs = now + (long) (ms * 1e6);
    }

    private boolean draw(Mistake kind, double p) {
        boolean hit = p > 0 && random.nextDouble() < p;
        if (hit) {
            mistakes++;
            mistakesByKind.merge(kind, 1, Integer::sum);
        }
        return hit;
    }
}
