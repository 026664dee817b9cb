package hammerstep.hardware;

/** What a simulated ADC converts: the next conversion's signed counts. Called on the acquisition thread. */
@FunctionalInterface
public interface CountSource {
    int nextCounts();
}
