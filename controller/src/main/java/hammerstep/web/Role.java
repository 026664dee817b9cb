package hammerstep.web;

/** What an account may do in the web view. */
public enum Role {
    /** Looks at the station, results, traces and capability. */
    VIEWER,
    /** A viewer who may also run what-if studies and upload programs (when the view offers them). */
    ENGINEER;

    /** True when this role may do what {@code needed} may. */
    public boolean covers(Role needed) {
        return this == ENGINEER || needed == VIEWER;
    }

    public String label() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}
