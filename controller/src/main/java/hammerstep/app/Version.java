package hammerstep.app;

import picocli.CommandLine;

/** The version from the jar manifest, or "development" when run from classes. */
public final class Version implements CommandLine.IVersionProvider {

    @Override
    public String[] getVersion() {
        String v = Version.class.getPackage().getImplementationVersion();
        return new String[] {"hammerstep " + (v == null ? "development" : v)};
    }
}
