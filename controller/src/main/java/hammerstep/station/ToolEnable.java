package hammerstep.station;

/**
 * The tool enable relay: when off, the tool cannot run (air valve closed, or the cordless tool's
 * enable input released). The station drops it at shut-off and whenever no position is prompted.
 *
 * <p>This is a process interlock, <b>not a safety function</b>: it is not rated, monitored or
 * redundant. Lock out the tool's energy before working on the fixture.
 *
 * <p>Threading: station thread only; {@link #set} must act at once (one GPIO write), because the
 * time from the shut-off sample to the relay command is part of the over-torque budget.
 */
public interface ToolEnable {

    void set(boolean enabled);
}
