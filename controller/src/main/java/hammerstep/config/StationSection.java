package hammerstep.config;


import java.nio.file.Path;

/**
 * One top-level section of the station file and the reader that turns it into one validated
 * record. Each subsystem owns its section (identity and parts in the station's setup; transducer, hardware, broker,
 * storage in their own packages) and registers it in {@code hammerstep.app.StationSections}.
 *
 * @param <T> the record the section reads into
 */
public interface StationSection<T> {

    /** The top-level key, e.g. {@code identity}. */
    String key();

    /**
     * Reads the section. Problems go to the reader's collector (with file, line and column); the
     * reader calls {@link MapReader#finish()} itself so misspelt keys are reported. On problems it
     * may return any placeholder: the file is rejected as a whole.
     *
     * @param base the station file's folder, against which relative paths are resolved
     */
    T read(MapReader section, Path base);

    /** False when the file may leave the section out; {@link #absent} then gives its value. */
    default boolean required() {
        return true;
    }

    /** The value of an optional section the file leaves out (may be null). */
    default T absent(Path base) {
        return null;
    }

    /** A section another program reads (the simulator's {@code simulation}): accepted here unread. */
    static StationSection<Void> readElsewhere(String key) {
        return new StationSection<>() {
            @Override
            public String key() {
                return key;
            }

            @Override
            public Void read(MapReader section, Path base) {
                return null;
            }

            @Override
            public boolean required() {
                return false;
            }
        };
    }
}
