package hammerstep.sequence;

import hammerstep.station.LampMode;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * The bookkeeping of the part in work: where each position stands in the current pass, its
 * attempts in that pass, which positions are left out of later passes, and the ids of the part's
 * stored joints. Owned by {@link Sequence}; single-threaded.
 */
final class PartProgress {

    private static final byte NOT_IN_PASS = 0;
    private static final byte PENDING = 1;
    private static final byte DONE = 2;
    private static final byte FAILED = 3;
    private static final byte SKIPPED = 4;

    private byte[] status = new byte[0];
    private int[] attempts = new int[0];
    private boolean[] leftOut = new boolean[0];
    private final List<String> jointIds = new ArrayList<>();
    private boolean failed;
    private int lastPassed = -1;

    /** A new part with {@code positions} positions: nothing done, nothing failed, no joints. */
    void startPart(int positions) {
        status = new byte[positions];
        attempts = new int[positions];
        leftOut = new boolean[positions];
        jointIds.clear();
        failed = false;
        lastPassed = -1;
    }

    /** A new pass: its positions pending (those left out skipped), attempts from zero. */
    void startPass(Pattern.Pass pass) {
        Arrays.fill(status, NOT_IN_PASS);
        Arrays.fill(attempts, 0);
        lastPassed = -1;
        for (int k = 0; k < pass.orderLength(); k++) {
            int pos = pass.orderAt(k);
            status[pos] = leftOut[pos] ? SKIPPED : PENDING;
        }
    }

    /** The first position of the pass's order still pending, or -1 when the pass is through. */
    int nextPending(Pattern.Pass pass) {
        for (int k = 0; k < pass.orderLength(); k++) {
            int pos = pass.orderAt(k);
            if (status[pos] == PENDING) {
                return pos;
            }
        }
        return -1;
    }

    int size() {
        return status.length;
    }

    /** True when {@code pos} is done (GO) in the current pass. */
    boolean done(int pos) {
        return pos < status.length && status[pos] == DONE;
    }

    /** Rundowns so far on {@code pos} in the current pass. */
    int attempts(int pos) {
        return pos < attempts.length ? attempts[pos] : 0;
    }

    /**
     * Counts a rundown on {@code pos}. Its verdict then sets the position's state: a rundown on a
     * position other than the prompted one is NO-GO, so it becomes pending (rework) or failed.
     *
     * @return the attempts on {@code pos} in this pass, this one included
     */
    int countAttempt(int pos) {
        return ++attempts[pos];
    }

    void passed(int pos) {
        status[pos] = DONE;
        lastPassed = pos;
    }

    /** The position judged GO most recently in the current pass and not voided since, or -1. */
    int lastPassed() {
        return lastPassed;
    }

    /**
     * A position judged GO was loosened: it is pending again, so it is prompted again and the pass
     * (and the part) cannot complete until it is tightened again. Its attempts stand.
     */
    void voided(int pos) {
        status[pos] = PENDING;
        if (lastPassed == pos) {
            lastPassed = -1;
        }
    }

    void retry(int pos) {
        status[pos] = PENDING;
    }

    /** {@code pos} failed for good: the part cannot end GO; {@code leaveOut} drops it from later passes. */
    void failed(int pos, boolean leaveOut) {
        status[pos] = FAILED;
        failed = true;
        if (leaveOut) {
            leftOut[pos] = true;
        }
    }

    /** True once some position has failed for good. */
    boolean partFailed() {
        return failed;
    }

    void jointStored(String id) {
        jointIds.add(id);
    }

    /** Ids of the part's stored joints, in order. */
    List<String> jointIds() {
        return jointIds;
    }

    /** While working: the position {@code blinking} blinks, done ones are steady, the rest off. */
    LampMode workingLamp(int index, int blinking) {
        return index == blinking ? LampMode.BLINKING : status[index] == DONE ? LampMode.STEADY : LampMode.OFF;
    }

    /** A rejected part: failed and left-out positions blink, done ones are steady. */
    LampMode rejectedLamp(int index) {
        return status[index] == FAILED || leftOut[index] ? LampMode.BLINKING
                : status[index] == DONE ? LampMode.STEADY : LampMode.OFF;
    }
}
