package hammerstep.station;

/**
 * The scanner, reader or line computer that names the part put into the fixture.
 *
 * <p>Threading: {@link #poll()} is called by the station thread once per duty cycle and must not
 * block; an adapter reading a serial port does so on its own thread and hands identities over.
 */
public interface PartIdentitySource {

    /** The identity that arrived since the last call, or null when none did. */
    PartIdentity poll();
}
