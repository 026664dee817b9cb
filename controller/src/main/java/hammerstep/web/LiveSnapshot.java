package hammerstep.web;

import java.util.List;

/**
 * The station as it stood at one change, handed from the station thread to the web side. Immutable:
 * built on the station thread only when something shown changed (never per sample or per block).
 *
 * @param version        grows by one with every snapshot
 * @param phase          the sequence's phase (WAITING, PROMPT, RUNDOWN, ...)
 * @param partSerial     the part in work, or "" without one
 * @param positions      the pattern's position labels, empty without a part
 * @param positionLamps  what each position lamp shows: OFF, STEADY or BLINKING
 * @param towerLamps     WHITE, BLUE, GREEN, YELLOW, RED in that order: OFF, STEADY or BLINKING
 * @param pass           the pass in work ("" without a part), {@code passNumber} of {@code passes}
 * @param prompted       the prompted position's label, or ""
 * @param rework         the position in rework, or ""
 * @param signalFaults   the transducer's standing faults, by name
 * @param zeroNm         the transducer's zero offset in N·m
 * @param toolWeak       tool health: a blow rate or energy below its baseline
 * @param program        the program the next rundown is judged by ("" without a part), with its window,
 *                       target and shut-off level in N·m (shut-off NaN when it has none)
 */
public record LiveSnapshot(long version, String phase, String partSerial, String model, String pattern,
                           List<String> positions, List<String> positionLamps, List<String> towerLamps,
                           String pass, int passNumber, int passes, String prompted, String rework,
                           boolean toolEnabled, String storage, List<String> signalFaults, double zeroNm,
                           boolean toolWeak, long errors, String program, double torqueMinNm,
                           double torqueMaxNm, double targetNm, double shutoffNm) {

    public LiveSnapshot {
        positions = List.copyOf(positions);
        positionLamps = List.copyOf(positionLamps);
        towerLamps = List.copyOf(towerLamps);
        signalFaults = List.copyOf(signalFaults);
    }

    /** Before the station's first cycle. */
    static LiveSnapshot idle() {
        return new LiveSnapshot(0, "WAITING", "", "", "", List.of(), List.of(),
                List.of("OFF", "OFF", "OFF", "OFF", "OFF"), "", 0, 0, "", "", false, "OK", List.of(), 0, false, 0, "",
                Double.NaN, Double.NaN, Double.NaN, Double.NaN);
    }
}
