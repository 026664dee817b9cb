package hammerstep.signal;

/** Receives the blows a {@link PulseDetector} finds. Called on the detector's thread; must not allocate. */
public interface PulseSink {

    /**
     * One blow, closed. A blow that crossed {@code -count_above} (a reverse strike) reports its
     * peak and impulse negative; the levels then apply to the negated signal.
     *
     * @param startNs     time of the sample that crossed {@code count_above} (or {@code -count_above})
     * @param peakNm      highest torque within the blow in its sense (the lowest for a reverse strike)
     * @param peakNs      time of that sample
     * @param widthMs     from the crossing until torque first fell below the release level
     * @param impulseNms  ∫T dt over the blow's samples at or above the release level (in its sense)
     */
    void onPulse(long startNs, double peakNm, long peakNs, double widthMs, double impulseNms);
}
