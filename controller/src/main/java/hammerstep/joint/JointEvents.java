package hammerstep.joint;

/**
 * What a {@link JointMonitor} reports while it processes samples. Called on the thread that feeds
 * samples, in sample order. Implementations on the station path must not block or allocate per call.
 */
public interface JointEvents {

    /** A rundown began at the sample at {@code startNs}. */
    default void onRundownStart(long startNs) {
    }

    /** Blow number {@code index} (0-based) closed with its peak. */
    default void onBlow(int index, double peakNm, long peakNs) {
    }

    /** A sample reached the program's shut-off level; called once per rundown, at the crossing sample. */
    default void onShutoff(long crossingNs) {
    }

    /** A sensor fault began (bits of {@link hammerstep.signal.SignalFaults}), inside or outside a rundown. */
    default void onFault(int faults, long atNs) {
    }

    /** The rundown ended and was judged. */
    void onRundown(JointResult result);
}
