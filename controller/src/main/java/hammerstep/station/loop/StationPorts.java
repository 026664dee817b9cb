package hammerstep.station.loop;

import hammerstep.station.Lamps;
import hammerstep.station.OperatorInputs;
import hammerstep.station.PartIdentitySource;
import hammerstep.station.ToolEnable;
import hammerstep.station.TorqueInput;

/** The hardware one station drives: the Pi4J adapters on a board, the virtual station in the simulator. */
public record StationPorts(TorqueInput torque, Lamps lamps, ToolEnable tool, OperatorInputs inputs,
                           PartIdentitySource identity) {
}
