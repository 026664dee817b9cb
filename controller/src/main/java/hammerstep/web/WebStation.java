package hammerstep.web;

import hammerstep.sequence.Pattern;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.function.Supplier;

/**
 * What the web view knows of the station's files besides the live board: where its joints' traces
 * are stored (for the what-if), the patterns in use by part model (for the programs page and the
 * stored programs of a what-if), and how to validate the station's files as {@code hammerstep check}
 * does (one {@code file:line:column: message} line per problem; none when all are valid).
 *
 * @param tracesDir  the stored traces' folder, or null when the station keeps none
 * @param patterns   part model → pattern, in the station file's order
 * @param validation the lines {@code check} prints for the station file and the files it names
 */
public record WebStation(Path tracesDir, Map<String, Pattern> patterns, Supplier<List<String>> validation) {

    public WebStation {
        patterns = patterns == null ? Map.of() : java.util.Collections.unmodifiableMap(
                new java.util.LinkedHashMap<>(patterns));
        validation = validation == null ? List::of : validation;
    }

    /** Nothing known beyond the live board (a view started without the station's files). */
    public static WebStation none() {
        return new WebStation(null, Map.of(), null);
    }
}
