package hammerstep.config;

import java.util.List;

/** A configuration file that cannot be used, with every problem found in it. */
public final class ConfigException extends Exception {

    private final List<Problem> problems;

    public ConfigException(List<Problem> problems) {
        super(problems.isEmpty() ? "invalid configuration" : problems.get(0).toString());
        if (problems.isEmpty()) {
            throw new IllegalArgumentException("a ConfigException needs at least one problem");
        }
        this.problems = List.copyOf(problems);
    }

    public ConfigException(Problem problem) {
        this(List.of(problem));
    }

    public List<Problem> problems() {
        return problems;
    }
}
