package hammerstep.hardware;

import java.util.List;
import java.util.Map;

/**
 * Everything the station file's {@code hardware:} section wires: the ADC, the outputs and the
 * inputs. Validated by {@link HardwareSection}; absent optional lines are null (lists empty).
 *
 * @param toolEnable    the enable relay; energised (active) enables the tool
 * @param shuntCal      output that switches the transducer's shunt resistor in, or null
 * @param tower         tower lamps by colour name ({@code blue, green, yellow, red, white})
 * @param positions     one lamp per pattern position, in position order
 * @param acknowledge   the operator's acknowledge button
 * @param supervisorKey the supervisor's key switch
 * @param partPresent   fixture sensor, or null
 * @param trigger       the tool's trigger or air-flow signal, or null
 * @param confirm       one confirm sensor per position, or empty
 */
public record HardwareSettings(
        AdcSettings adc,
        OutputLine toolEnable,
        OutputLine shuntCal,
        Map<String, OutputLine> tower,
        List<OutputLine> positions,
        InputLine acknowledge,
        InputLine supervisorKey,
        InputLine partPresent,
        InputLine trigger,
        List<InputLine> confirm) {

    /** Tower colours in the order the station file lists them. */
    public static final List<String> TOWER = List.of("white", "blue", "green", "yellow", "red");

    public HardwareSettings {
        tower = Map.copyOf(tower);
        positions = List.copyOf(positions);
        confirm = List.copyOf(confirm);
    }
}
