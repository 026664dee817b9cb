package hammerstep.sequence;

import hammerstep.joint.Verdict;
import hammerstep.results.ResultSink;
import hammerstep.station.LampMode;
import hammerstep.station.TowerLamp;

/**
 * What the lamps show for a state of the {@link Sequence}: pure functions from its state to the
 * lamp picture, no state of their own. Position lamps: the prompted (or reworked) position blinks,
 * done positions are steady; on a rejected part the failed and left-out positions blink; a complete
 * part lights them all. A store fault keeps the position picture of the phase it interrupted.
 */
final class LampPicture {

    private LampPicture() {
    }

    /**
     * @param shown          the phase whose picture to show: while a store fault stands, the one it interrupted
     * @param prompted       the prompted position, or -1
     * @param reworkPosition the position in rework, or -1
     */
    static LampMode position(int index, boolean hasPart, Phase shown, PartProgress progress, int prompted,
                             int reworkPosition) {
        if (!hasPart || index >= progress.size()) {
            return LampMode.OFF;
        }
        switch (shown) {
            case PROMPT, RUNDOWN, STORING:
                return progress.workingLamp(index, prompted);
            case REWORK:
                return progress.workingLamp(index, reworkPosition);
            case REJECTED:
                return progress.rejectedLamp(index);
            case COMPLETE:
                return LampMode.STEADY;
            default:
                return LampMode.OFF;
        }
    }

    /**
     * @param phase       the sequence's phase ({@link Phase#FAULT} while a store fault stands)
     * @param lastVerdict the verdict of the last joint shown, or null
     * @param lockedOut   true while a sensor lockout stands
     * @param warning     true while a standing warning of the station is on
     */
    static LampMode tower(TowerLamp lamp, Phase phase, Verdict lastVerdict, ResultSink.Storage storage,
                          boolean lockedOut, boolean warning) {
        switch (lamp) {
            case WHITE:
                return phase == Phase.WAITING && storage != ResultSink.Storage.FULL ? LampMode.STEADY : LampMode.OFF;
            case BLUE:
                return switch (phase) {
                    case PROMPT, RUNDOWN, STORING -> LampMode.STEADY;
                    case REWORK -> LampMode.BLINKING;
                    default -> LampMode.OFF;
                };
            case GREEN:
                return phase == Phase.COMPLETE || (phase == Phase.PROMPT && lastVerdict == Verdict.GO)
                        ? LampMode.STEADY : LampMode.OFF;
            case RED:
                if (lockedOut) {
                    return LampMode.BLINKING;
                }
                return switch (phase) {
                    case REWORK -> LampMode.STEADY;
                    case REJECTED, FAULT -> LampMode.BLINKING;
                    default -> LampMode.OFF;
                };
            default:
                if (phase == Phase.FAULT || storage == ResultSink.Storage.FULL || lockedOut) {
                    return LampMode.BLINKING;
                }
                return warning || storage == ResultSink.Storage.LOW ? LampMode.STEADY : LampMode.OFF;
        }
    }
}
