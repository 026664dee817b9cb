package hammerstep.results;

import java.time.Instant;
import java.util.List;

/**
 * A part that was finished or abandoned.
 *
 * @param verdict  {@code GO} when every position passed every pass, else {@code NO_GO}
 * @param ended    how it ended: {@code COMPLETE}, {@code REJECTED}, {@code ABANDONED} or {@code INTERRUPTED}
 * @param jointIds ids (from {@link ResultSink.Receipt}) of every joint result of the part, in order
 */
public record PartOutcome(
        String partSerial,
        String partModel,
        String pattern,
        String verdict,
        String ended,
        List<String> jointIds,
        Instant started,
        Instant at) {

    public PartOutcome {
        jointIds = List.copyOf(jointIds);
    }
}
