package hammerstep.config;

import java.util.ArrayList;
import java.util.List;

/** Collects the problems of one file while it is read, so that all of them are reported at once. */
public final class Problems {

    private final String file;
    private final List<Problem> list = new ArrayList<>();

    public Problems(String file) {
        this.file = file;
    }

    public String file() {
        return file;
    }

    public void add(ConfigNode at, String message) {
        list.add(new Problem(file, at.line(), at.column(), message));
    }

    public void add(int line, int column, String message) {
        list.add(new Problem(file, line, column, message));
    }

    public boolean isEmpty() {
        return list.isEmpty();
    }

    public List<Problem> list() {
        return List.copyOf(list);
    }

    /** Throws when any problem was found. */
    public void throwIfAny() throws ConfigException {
        if (!list.isEmpty()) {
            throw new ConfigException(list);
        }
    }
}
