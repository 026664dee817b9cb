package hammerstep.hardware;

/**
 * One digital output as the station file wires it.
 *
 * @param name       the line's name in messages, e.g. {@code outputs.tower.red}
 * @param pin        BCM GPIO number
 * @param activeHigh true when the load is on with the pin high
 */
public record OutputLine(String name, int pin, boolean activeHigh) {
}
