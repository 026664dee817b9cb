package hammerstep.hardware;

import hammerstep.station.ToolEnable;

/**
 * The tool enable relay on a digital output: energised enables the tool, so a controller that
 * stops driving the pin (stopped service, power loss) leaves the tool disabled. Starts disabled.
 * A process interlock, not a safety function.
 */
public final class RelayToolEnable implements ToolEnable {

    private final DigitalOut relay;

    public RelayToolEnable(DigitalOut relay) {
        this.relay = relay;
        relay.set(false);
    }

    @Override
    public void set(boolean enabled) {
        relay.set(enabled);
    }

    /** Whether the relay is energised now (read back from the pin). */
    public boolean enabled() {
        return relay.isActive();
    }
}
