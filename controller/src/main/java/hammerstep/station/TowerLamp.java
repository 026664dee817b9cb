package hammerstep.station;

/**
 * The tower (stack) lamps, in the colour meanings of IEC 60204-1 §10.3 / IEC 60073: blue the
 * operator must act, green accepted, yellow warning, red rejected or fault, white ready.
 */
public enum TowerLamp {
    BLUE,
    GREEN,
    YELLOW,
    RED,
    WHITE
}
