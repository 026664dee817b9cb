package hammerstep.sim.station;

import hammerstep.results.JournalWriter;
import hammerstep.results.ResultSink;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.signal.Conditioning;
import hammerstep.station.PartIdentity;
import hammerstep.station.VirtualClock;
import hammerstep.station.loop.StationAgent;
import hammerstep.station.loop.StationListener;
import org.agrona.ErrorHandler;

import java.util.List;
import java.util.Map;

/**
 * A whole station in virtual time on one thread: the virtual hardware, the controller's station
 * loop and a scripted operator, advanced one sample block at a time. The same objects as on a
 * board, with the simulator standing in for the hardware. The journal's writer, a thread of its own
 * on a board, is stepped here once per block after the station's cycle: a record the station offers
 * in one block is on disk at the end of it, and the station hears so in the next.
 */
public final class SimulatedStation {

    private final VirtualClock clock;
    private final VirtualStation hardware;
    private final StationAgent agent;
    private final JournalWriter journal;
    private final ScriptedOperator operator;
    private final long blockNs;

    public SimulatedStation(VirtualClock clock, VirtualStation hardware, ResultSink sink,
                            Map<String, Pattern> patternsByModel, Sequence.Settings settings,
                            Conditioning conditioning, long blinkPeriodNs, Habits habits, List<PartIdentity> parts,
                            long seed, StationListener listener, ErrorHandler errors) {
        this(clock, hardware, new JournalWriter(sink), patternsByModel, settings, conditioning, blinkPeriodNs, habits,
                parts, seed, listener, errors);
    }

    /** A station whose records go to {@code journal}, stepped by {@link #step()}. */
    public SimulatedStation(VirtualClock clock, VirtualStation hardware, JournalWriter journal,
                            Map<String, Pattern> patternsByModel, Sequence.Settings settings,
                            Conditioning conditioning, long blinkPeriodNs, Habits habits, List<PartIdentity> parts,
                            long seed, StationListener listener, ErrorHandler errors) {
        this.clock = clock;
        this.hardware = hardware;
        this.blockNs = hardware.blockNs();
        this.journal = journal;
        Sequence sequence = new Sequence(settings, hardware.fixture().confirmSensors());
        this.agent = new StationAgent(clock, hardware.ports(), journal, sequence, patternsByModel, conditioning,
                blinkPeriodNs, listener, errors);
        this.operator = new ScriptedOperator(hardware, habits, parts, seed);
    }

    /**
     * One block: the transducer acquires the samples of the coming block period, time moves to its
     * end, the station runs a duty cycle on it and the operator reacts.
     */
    public void step() {
        long t = clock.nanoTime();
        hardware.acquire(t);
        clock.setNs(t + blockNs);
        long now = clock.nanoTime();
        hardware.beforeStationCycle(now);
        agent.doWork();
        journal.doWork();
        operator.onTick(now);
    }

    /**
     * Steps on (at most {@code maxSteps} blocks) until every record the station offered is stored and
     * the station has heard so: the end of a run, before its results are counted.
     */
    public void settle(int maxSteps) {
        for (int k = 0; k < maxSteps && (journal.waiting() > 0 || agent.storing()); k++) {
            step();
        }
    }

    public JournalWriter journal() {
        return journal;
    }

    /** True once the operator has worked through every part. */
    public boolean finished() {
        return operator.finished();
    }

    public long nowNs() {
        return clock.nanoTime();
    }

    public VirtualStation hardware() {
        return hardware;
    }

    public StationAgent agent() {
        return agent;
    }

    public ScriptedOperator operator() {
        return operator;
    }
}
