package hammerstep.sim.station;

/**
 * A modelled tool on the fasteners of a part, seen through the transducer: what the virtual station
 * drives. Each position has its own fastener, which keeps its state from pass to pass. The physics
 * rig is the real model ({@link RigToolModel}); tests may use simpler ones. Single-threaded.
 */
public interface ToolModel {

    /** The operator pulls (true) or releases the trigger. */
    void setTrigger(boolean pulled);

    /** The enable relay: without it the tool has no power, whatever the trigger. */
    void setEnabled(boolean enabled);

    /**
     * The tool's direction switch (true: reverse, loosening), set with the trigger released. A model
     * without a reverse accepts only false.
     */
    default void setReverse(boolean reverse) {
        if (reverse) {
            throw new UnsupportedOperationException(getClass().getSimpleName() + " has no reverse");
        }
    }

    /** Writes the transducer's next {@code length} samples in N·m, advancing the model's time. */
    void fill(float[] out, int offset, int length);

    /** Puts the socket on position {@code index}'s fastener (0-based). */
    void moveTo(int index);

    /** A new part: fresh, untightened fasteners on every position. */
    void newPart();

    /** Blows struck on the current fastener since it was fitted. */
    int blows();

    /** Torque the current fastener holds now, N·m. */
    double residualTorqueNm();
}
