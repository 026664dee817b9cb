package hammerstep.station.loop;

import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.health.InterferenceWatch;
import hammerstep.health.ToolHealth;
import hammerstep.health.ToolHealthEvents;
import hammerstep.results.JointOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.results.ResultStoreException;
import hammerstep.results.UnfinishedPart;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.sequence.Store;
import hammerstep.signal.Conditioning;
import hammerstep.signal.SignalFaults;
import hammerstep.station.OperatorInputs;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleBlockHandler;
import hammerstep.station.StationClock;
import hammerstep.trace.TraceKeeper;
import org.agrona.ErrorHandler;
import org.agrona.concurrent.Agent;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The station's duty cycle: reads the clock once, polls the operator inputs and the part identity,
 * feeds waiting sample blocks through the current pass's {@link JointMonitor}, hands the sequence's
 * records to the {@link ResultSink}, then drives the tool enable and the lamps from the sequence.
 * After every block the tool output is brought up to date, so tool enable drops within one block of
 * the shut-off crossing.
 *
 * <p>Run it on one thread with Agrona's {@code AgentRunner} ({@link StationRunner}), or call
 * {@link #doWork()} by hand on a virtual clock (tests, {@code --fast}). Single-threaded; the sample
 * path allocates nothing.
 */
public final class StationAgent implements Agent, SampleBlockHandler, JointEvents {

    private static final Logger LOG = LoggerFactory.getLogger(StationAgent.class);
    private static final int MAX_BLOCKS_PER_CYCLE = 8;

    private final StationClock clock;
    private final StationPorts ports;
    private final ResultSink sink;
    private final Sequence sequence;
    private Map<String, Pattern> patternsByModel;
    private Map<JointProgram, JointMonitor> monitors = new HashMap<>();
    private JointMonitor watch;
    private final Conditioning conditioning;
    private final LampDriver lampDriver;
    private final StationListener listener;
    private final ErrorHandler errorHandler;

    private CommandDesk commands;
    private TraceKeeper traces;
    private ToolHealth toolHealth;
    private InterferenceWatch interference;
    private String toolName = "tool";
    private JointMonitor current;
    private long nowNs;
    private boolean shutoffPending;
    private long shutoffNs;
    private boolean toolOn;
    private boolean toolWritten;
    private boolean ackBefore;
    private boolean keyBefore;
    private boolean presentBefore;
    private int confirmedBefore = Integer.MIN_VALUE;
    private PartIdentity waitingIdentity;
    private long errors;
    private long lastShutoffToRelayNs = -1;
    private long maxShutoffToRelayNs = -1;

    /**
     * @param patternsByModel part model → pattern; every program of every pattern gets its monitor here
     * @param conditioning    the transducer's conditioning (auto-zero, range, filter)
     */
    public StationAgent(StationClock clock, StationPorts ports, ResultSink sink, Sequence sequence,
                        Map<String, Pattern> patternsByModel, Conditioning conditioning, long blinkPeriodNs,
                        StationListener listener, ErrorHandler errorHandler) {
        if (patternsByModel.isEmpty()) {
            throw new IllegalArgumentException("a station needs at least one part model with its pattern");
        }
        this.clock = clock;
        this.ports = ports;
        this.sink = sink;
        this.sequence = sequence;
        this.patternsByModel = new LinkedHashMap<>(patternsByModel);
        this.listener = listener;
        this.errorHandler = errorHandler;
        this.conditioning = conditioning;
        String problem = PatternMonitors.lampProblem(this.patternsByModel, ports.lamps().positionLamps());
        if (problem != null) {
            throw new IllegalArgumentException(problem);
        }
        this.monitors = PatternMonitors.of(this.patternsByModel, Map.of(), conditioning, ports.torque(), this);
        this.watch = monitors.get(PatternMonitors.firstProgram(this.patternsByModel));
        this.current = watch;
        this.lampDriver = new LampDriver(ports.lamps(), blinkPeriodNs);
        ports.tool().set(false);
        UnfinishedPart unfinished = sink.unfinishedPart();
        if (unfinished != null) {
            LOG.warn("part {} was in work when the station stopped ({} joints stored): supervisor key closes it"
                    + " as INTERRUPTED", unfinished.partSerial(), unfinished.jointIds().size());
            sequence.partInterrupted(unfinished, clock.nanoTime());
        }
    }

    @Override
    public String roleName() {
        return "station";
    }

    @Override
    public int doWork() {
        try {
            return cycle();
        } catch (Throwable t) {
            errors++;
            safeOff();
            errorHandler.onError(t);
            return 1;
        }
    }

    private int cycle() {
        nowNs = clock.nanoTime();
        sequence.storage(sink.storage()); // fresh before a part may start (commands, inputs)
        int work = commands == null ? 0 : commands.serve(this, nowNs);
        work += pollInputs();
        selectMonitor();
        work += ports.torque().poll(this, MAX_BLOCKS_PER_CYCLE);
        work += drainStores();
        sequence.storage(sink.storage());
        sequence.sensorFaults(current.conditioner().faults());
        if (interference != null) {
            watchInterference();
        }
        sequence.onTick(nowNs);
        work += drainStores();
        applyTool();
        work += lampDriver.apply(sequence, nowNs);
        return work;
    }

    private int pollInputs() {
        OperatorInputs in = ports.inputs();
        int work = 0;
        boolean ack = in.acknowledge();
        if (ack && !ackBefore) {
            sequence.acknowledge(nowNs);
            work++;
        }
        ackBefore = ack;
        boolean key = in.supervisorKey();
        if (key && !keyBefore) {
            sequence.supervisorKey(nowNs);
            work++;
        }
        keyBefore = key;
        boolean present = !in.hasPartPresent() || in.partPresent();
        if (!present && presentBefore) {
            sequence.partRemoved(nowNs);
            work++;
        }
        presentBefore = present;
        if (in.hasConfirmSensors()) {
            int at = in.confirmedPosition();
            if (at != confirmedBefore) {
                sequence.toolAt(at);
                confirmedBefore = at;
                work++;
            }
        }
        PartIdentity id = ports.identity().poll();
        if (id != null) {
            waitingIdentity = id;
            work++;
        }
        if (waitingIdentity != null && present) {
            sequence.partArrived(waitingIdentity, patternsByModel.get(waitingIdentity.model()), nowNs);
            waitingIdentity = null;
        }
        return work;
    }

    private void selectMonitor() {
        if (current.inRundown()) {
            return;
        }
        JointProgram program = sequence.program();
        JointMonitor next = program == null ? watch : monitors.get(program);
        current = next == null ? watch : next;
    }

    @Override
    public void onBlock(float[] samples, int offset, int length, long firstSampleNs) {
        if (traces != null) {
            traces.onSamples(samples, offset, length, firstSampleNs);
        }
        long rejectedBefore = current.conditioner().rejectedImpulses();
        current.onSamples(samples, offset, length, firstSampleNs);
        if (interference != null) {
            interference.add(current.conditioner().rejectedImpulses() - rejectedBefore);
        }
        if (shutoffPending) {
            shutoffPending = false;
            sequence.shutoff(shutoffNs);
            applyTool();
            lastShutoffToRelayNs = clock.nanoTime() - shutoffNs;
            if (lastShutoffToRelayNs > maxShutoffToRelayNs) {
                maxShutoffToRelayNs = lastShutoffToRelayNs;
            }
        }
        selectMonitor();
    }

    // ---- JointEvents from the current monitor, during onSamples ---------------------------------

    @Override
    public void onRundownStart(long startNs) {
        sequence.rundownStarted(startNs);
        listener.onRundownStart(startNs);
    }

    @Override
    public void onBlow(int index, double peakNm, long peakNs) {
        listener.onBlow(index, peakNm, peakNs);
    }

    @Override
    public void onShutoff(long crossingNs) {
        shutoffPending = true;
        shutoffNs = crossingNs;
    }

    @Override
    public void onFault(int faults, long atNs) {
        // rare: the names are built only when a fault begins
        sequence.sensorFault(faults, SignalFaults.names(faults).toString(), atNs);
        if (toolOn && !sequence.toolEnabled()) {
            applyTool();
        }
    }

    @Override
    public void onRundown(JointResult result) {
        sequence.jointJudged(result, nowNs);
        drainStores();
    }

    // ---- outputs --------------------------------------------------------------------------------

    private int drainStores() {
        int n = 0;
        Store s;
        while ((s = sequence.nextToStore()) != null) {
            if (traces != null && s instanceof Store.Joint j) {
                s = new Store.Joint(traces.keep(j.outcome()));
            }
            ResultSink.Receipt receipt;
            try {
                receipt = store(s);
            } catch (ResultStoreException e) {
                sequence.storeFailed(nowNs);
                applyTool();
                LOG.error("result not stored, station stopped until the supervisor key: {}", e.getMessage());
                listener.onStoreFailed(e.getMessage());
                return n;
            }
            sequence.stored(receipt, nowNs);
            n++;
            if (s instanceof Store.Joint j) {
                listener.onJoint(j.outcome(), receipt);
                if (!watchTool(j.outcome())) {
                    return n;
                }
            } else if (s instanceof Store.Part p) {
                listener.onPart(p.outcome(), receipt);
            } else if (s instanceof Store.Event e) {
                listener.onEvent(e.event(), receipt);
            }
        }
        return n;
    }

    /**
     * Tool health: the joint's blow rate and energy against the tool's baseline on its program; a
     * change is stored as an event, and a weak tool holds the yellow lamp. False when the event
     * could not be stored (the station then stands in FAULT, as for any result).
     */
    private boolean watchTool(JointOutcome joint) {
        if (toolHealth == null) {
            return true;
        }
        for (ToolHealth.Change c : toolHealth.observe(toolName, joint.result().program().id(), joint.result())) {
            StationEvent event = ToolHealthEvents.of(c, joint.partSerial(), clock.instantOf(nowNs));
            try {
                ResultSink.Receipt receipt = sink.event(event);
                listener.onEvent(event, receipt);
            } catch (ResultStoreException e) {
                sequence.storeFailed(nowNs);
                applyTool();
                LOG.error("event not stored, station stopped until the supervisor key: {}", e.getMessage());
                listener.onStoreFailed(e.getMessage());
                return false;
            }
        }
        sequence.warning(toolHealth.anyWeak());
        return true;
    }

    /**
     * Interference: rejected impulses per hour against the warning level; a change is stored as an
     * event. False when the event could not be stored (the station then stands in FAULT).
     */
    private boolean watchInterference() {
        StationEvent event = interference.poll(nowNs, clock.instantOf(nowNs));
        if (event == null) {
            return true;
        }
        try {
            ResultSink.Receipt receipt = sink.event(event);
            listener.onEvent(event, receipt);
            return true;
        } catch (ResultStoreException e) {
            sequence.storeFailed(nowNs);
            applyTool();
            LOG.error("event not stored, station stopped until the supervisor key: {}", e.getMessage());
            listener.onStoreFailed(e.getMessage());
            return false;
        }
    }

    /** Warns when rejected impulses pass a level per hour. Call before the agent runs. */
    public void watchInterference(InterferenceWatch watch) {
        this.interference = watch;
    }

    public InterferenceWatch interference() {
        return interference;
    }

    /** Keeps every joint's torque trace and names it in the joint's result. Call before the agent runs. */
    public void keepTraces(TraceKeeper keeper) {
        this.traces = keeper;
    }

    /** Watches the tool's blow rate and energy per program ({@code tool} names it in events). Call before the agent runs. */
    public void watchTool(String tool, ToolHealth health) {
        this.toolName = tool;
        this.toolHealth = health;
    }

    public ToolHealth toolHealth() {
        return toolHealth;
    }

    public TraceKeeper traces() {
        return traces;
    }

    private ResultSink.Receipt store(Store s) throws ResultStoreException {
        if (s instanceof Store.Joint j) {
            return sink.joint(j.outcome());
        }
        if (s instanceof Store.Part p) {
            return sink.part(p.outcome());
        }
        return sink.event(((Store.Event) s).event());
    }

    private void applyTool() {
        boolean on = sequence.toolEnabled();
        if (on != toolOn || !toolWritten) {
            ports.tool().set(on);
            toolOn = on;
            toolWritten = true;
            listener.onTool(on, nowNs);
        }
    }

    private void safeOff() {
        try {
            ports.tool().set(false);
            toolOn = false;
        } catch (Throwable t) {
            errorHandler.onError(t);
        }
    }

    @Override
    public void onClose() {
        safeOff();
        if (commands != null) {
            commands.close();
        }
    }

    // ---- the plant's commands (CommandDesk, on this thread) --------------------------------------

    /** Takes the plant's commands from {@code desk} at the start of every cycle. Call before the agent runs. */
    public void takeCommands(CommandDesk desk) {
        this.commands = desk;
    }

    Map<String, Pattern> patterns() {
        return patternsByModel;
    }

    ResultSink.Storage storage() {
        return sink.storage();
    }

    boolean partPresent() {
        OperatorInputs in = ports.inputs();
        return !in.hasPartPresent() || in.partPresent();
    }

    boolean inRundown() {
        return current.inRundown();
    }

    /** A part named by the plant: started as a scanned one is, once it is in the fixture. */
    void identify(PartIdentity identity) {
        waitingIdentity = identity;
    }

    /**
     * Puts reloaded patterns in place (no part in work, no rundown under way): a program unchanged
     * keeps its monitor, a new or changed one gets a new monitor.
     *
     * @return null when done, else why nothing changed
     */
    String replacePatterns(Map<String, Pattern> next) {
        String problem = PatternMonitors.lampProblem(next, ports.lamps().positionLamps());
        if (problem != null) {
            return problem;
        }
        patternsByModel = new LinkedHashMap<>(next);
        monitors = PatternMonitors.of(patternsByModel, monitors, conditioning, ports.torque(), this);
        watch = monitors.get(PatternMonitors.firstProgram(patternsByModel));
        current = watch;
        return null;
    }

    public Sequence sequence() {
        return sequence;
    }

    public boolean toolOn() {
        return toolOn;
    }

    /** Errors caught by the duty cycle so far (each also went to the error handler). */
    public long errors() {
        return errors;
    }

    /** Station-clock time from the last shut-off crossing sample to the relay command; -1 before the first. */
    public long lastShutoffToRelayNs() {
        return lastShutoffToRelayNs;
    }

    /** The longest such time so far; -1 before the first shut-off. */
    public long maxShutoffToRelayNs() {
        return maxShutoffToRelayNs;
    }
}
