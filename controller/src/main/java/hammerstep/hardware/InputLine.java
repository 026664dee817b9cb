package hammerstep.hardware;

/**
 * One digital input as the station file wires it.
 *
 * @param name       the line's name in messages, e.g. {@code inputs.acknowledge}
 * @param pin        BCM GPIO number
 * @param activeHigh true when the contact is made with the pin high
 * @param pull       the pin's own bias resistor
 * @param debounceMs how long a new level must hold before it counts
 */
public record InputLine(String name, int pin, boolean activeHigh, Pull pull, double debounceMs) {

    public enum Pull { NONE, UP, DOWN }

    public long debounceNs() {
        return Math.round(debounceMs * 1e6);
    }
}
