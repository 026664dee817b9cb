package hammerstep.sim.station;

import hammerstep.station.OperatorInputs;
import hammerstep.station.PartIdentity;
import hammerstep.station.PartIdentitySource;
import hammerstep.station.SampleRing;
import hammerstep.station.ToolEnable;
import hammerstep.station.loop.StationPorts;

import java.util.ArrayDeque;

/**
 * The station's hardware in simulation: a modelled tool and fastener behind the transducer, the
 * lamps, the enable relay, the buttons, the fixture's sensors and the scanner, all implementing the
 * controller's ports. Test-control methods ({@link #pullTrigger}, {@link #pressAcknowledge},
 * {@link #turnKey}, {@link #scan}, {@link #moveToolTo}, ...) stand for the operator's hands.
 *
 * <p>Single-threaded and in virtual time: {@link #acquire(long)} writes the next block of samples into
 * the ring, as the ADC reader does on a board.
 */
public final class VirtualStation implements ToolEnable, OperatorInputs, PartIdentitySource {

    /** What the fixture has fitted. */
    public record Fixture(int positions, boolean partPresentSensor, boolean confirmSensors, double relayDelayMs) {
    }

    private final ToolModel tool;
    private final SampleRing ring;
    private final VirtualLamps lamps;
    private final Fixture fixture;
    private final long periodNs;
    private final long relayDelayNs;
    private final float[] block;
    private final ArrayDeque<PartIdentity> scans = new ArrayDeque<>();

    private boolean relayCommand;
    private long relayCommandNs;
    private boolean toolPowered;
    private boolean trigger;
    private boolean ack;
    private boolean key;
    private boolean partPresent;
    private int toolAt = NO_POSITION;
    private long relayOffCommands;
    private long lastCycleNs;

    public VirtualStation(ToolModel tool, Fixture fixture, double rateHz, int blockLength, int ringBlocks,
                          long blinkWatchNs) {
        this.tool = tool;
        this.fixture = fixture;
        this.ring = new SampleRing(rateHz, blockLength, ringBlocks);
        this.lamps = new VirtualLamps(fixture.positions(), blinkWatchNs);
        this.periodNs = (long) (blockLength * 1e9 / rateHz);
        this.relayDelayNs = (long) (fixture.relayDelayMs() * 1e6);
        this.block = new float[blockLength];
    }

    public StationPorts ports() {
        return new StationPorts(ring, lamps, this, this, this);
    }

    public VirtualLamps lamps() {
        return lamps;
    }

    public Fixture fixture() {
        return fixture;
    }

    /** Time one block spans, ns. */
    public long blockNs() {
        return periodNs;
    }

    /**
     * Acquires the block that starts at {@code firstSampleNs}: applies the relay (after its delay),
     * lets the tool run and hands the samples to the ring.
     */
    public void acquire(long firstSampleNs) {
        if (relayCommand != toolPowered && firstSampleNs - relayCommandNs - relayDelayNs >= 0) {
            toolPowered = relayCommand;
            tool.setEnabled(toolPowered);
        }
        tool.fill(block, 0, block.length);
        ring.offer(block, 0, block.length, firstSampleNs);
    }

    /** Stamps lamp changes made by the station cycle that follows. */
    public void beforeStationCycle(long nowNs) {
        lamps.now(nowNs);
        this.lastCycleNs = nowNs;
    }

    // ---- ToolEnable ----------------------------------------------------------------------------

    @Override
    public void set(boolean enabled) {
        if (relayCommand && !enabled) {
            relayOffCommands++;
        }
        if (relayCommand != enabled) {
            relayCommand = enabled;
            relayCommandNs = lastCycleNs;
        }
    }

    /** True while the relay is commanded on. */
    public boolean relayOn() {
        return relayCommand;
    }

    /** True while the tool has power (the relay is on and its delay has passed). */
    public boolean toolPowered() {
        return toolPowered;
    }

    public long relayOffCommands() {
        return relayOffCommands;
    }

    // ---- the operator's hands --------------------------------------------------------------------

    public void pullTrigger(boolean pulled) {
        trigger = pulled;
        tool.setTrigger(pulled);
    }

    public boolean triggerPulled() {
        return trigger;
    }

    public void pressAcknowledge(boolean held) {
        ack = held;
    }

    public void turnKey(boolean turned) {
        key = turned;
    }

    /** The scanner reads a part's label. */
    public void scan(PartIdentity identity) {
        scans.add(identity);
    }

    /** The part is taken out of the fixture. */
    public void removePart() {
        partPresent = false;
    }

    /** The socket goes onto a position's fastener ({@link #NO_POSITION}: off the part). */
    public void moveToolTo(int position) {
        toolAt = position;
        if (position >= 0) {
            tool.moveTo(position);
        }
    }

    /** A new part goes into the fixture: fresh fasteners. */
    public void loadPart() {
        tool.newPart();
        partPresent = true;
    }

    public ToolModel tool() {
        return tool;
    }

    // ---- OperatorInputs and PartIdentitySource -----------------------------------------------------

    @Override
    public boolean acknowledge() {
        return ack;
    }

    @Override
    public boolean supervisorKey() {
        return key;
    }

    @Override
    public boolean hasPartPresent() {
        return fixture.partPresentSensor();
    }

    @Override
    public boolean partPresent() {
        return partPresent;
    }

    @Override
    public boolean hasConfirmSensors() {
        return fixture.confirmSensors();
    }

    @Override
    public int confirmedPosition() {
        return fixture.confirmSensors() ? toolAt : NO_POSITION;
    }

    @Override
    public boolean hasTrigger() {
        return true;
    }

    @Override
    public boolean trigger() {
        return trigger;
    }

    @Override
    public PartIdentity poll() {
        return scans.poll();
    }
}
