package hammerstep.station;

/** What a lamp should show. Blinking is done by the station loop from the clock, never by a timer thread. */
public enum LampMode {
    OFF,
    STEADY,
    BLINKING
}
