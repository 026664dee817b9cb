/**
 * The station: its ports to the hardware and the loop that wires them to the measurement chain
 * and the sequence.
 *
 * <p>Ports, one interface per device, implemented by the Pi4J adapters ({@code hammerstep.hardware})
 * and by the simulator ({@code hammerstep.sim.station}):
 * <ul>
 *   <li>{@link hammerstep.station.TorqueInput}: blocks of N·m samples, read by the station thread
 *       from a preallocated ring ({@link hammerstep.station.SampleRing}) that the acquisition side fills;</li>
 *   <li>{@link hammerstep.station.Lamps}: one lamp per pattern position and the tower lamps;</li>
 *   <li>{@link hammerstep.station.ToolEnable}: the tool enable relay;</li>
 *   <li>{@link hammerstep.station.OperatorInputs}: acknowledge button, supervisor key, part present,
 *       optional position confirm sensors and trigger signal;</li>
 *   <li>{@link hammerstep.station.PartIdentitySource}: the scanner or reader that names the part;</li>
 *   <li>{@link hammerstep.station.StationClock}: time; only {@link hammerstep.station.SystemStationClock}
 *       reads the system clock.</li>
 * </ul>
 *
 * <p>Threading: every port method except the writer side of {@link hammerstep.station.SampleRing} is
 * called from the station thread only, and must return quickly (no network, no waiting on a lock).
 * No hardware library type appears in this package.
 *
 * <p>Safety: the tool enable relay is a process interlock, not a safety function. Guarding, emergency
 * stop and lock-out of the tool's energy follow the machine's own safety design.
 */
package hammerstep.station;
