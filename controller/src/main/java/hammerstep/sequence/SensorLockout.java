package hammerstep.sequence;

/**
 * The tool lockout after a fault of the torque signal (bits of {@code hammerstep.signal.SignalFaults}):
 * it starts with the first fault, collects the bits of every fault while it stands, and is released
 * only by the supervisor key once the signal is healthy again. The {@link Sequence} records the alarms.
 */
final class SensorLockout {

    private int lockedBy;
    private int faultsNow;

    /**
     * A fault began.
     *
     * @return true when it starts a lockout (none stood before), so an alarm is due
     */
    boolean fault(int faults) {
        if (faults == 0) {
            return false;
        }
        boolean starts = lockedBy == 0;
        lockedBy |= faults;
        faultsNow |= faults;
        return starts;
    }

    /** The signal's fault bits as they stand now (0 when healthy). */
    void faultsNow(int faults) {
        this.faultsNow = faults;
    }

    /** True while the tool is locked out. */
    boolean active() {
        return lockedBy != 0;
    }

    /** The fault bits that locked the tool out, or 0. */
    int bits() {
        return lockedBy;
    }

    /**
     * The supervisor key was turned while the lockout stands.
     *
     * @return true when it was released (the signal is healthy), false when it still holds
     */
    boolean release() {
        if (faultsNow != 0) {
            return false;
        }
        lockedBy = 0;
        return true;
    }
}
