package hammerstep.results;

import java.util.List;

/**
 * A part that was in work when the station stopped (power cut, kill, crash): its joints are stored
 * but no part record followed. Found in the store at start; the station closes it as
 * {@code INTERRUPTED} once the supervisor has seen to it.
 *
 * @param jointIds ids of the part's stored joint results, in order; never empty
 */
public record UnfinishedPart(String partSerial, String partModel, String pattern, List<String> jointIds) {

    public UnfinishedPart {
        jointIds = List.copyOf(jointIds);
    }
}
