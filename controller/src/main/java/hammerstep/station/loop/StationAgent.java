package hammerstep.station.loop;

import hammerstep.joint.InputStage;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.health.InterferenceWatch;
import hammerstep.health.ToolHealth;
import hammerstep.health.ToolHealthEvents;
import hammerstep.results.JointOutcome;
import hammerstep.results.JournalWriter;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.results.UnfinishedPart;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.sequence.SequenceRecord;
import hammerstep.sequence.Store;
import hammerstep.signal.Conditioner;
import hammerstep.signal.Conditioning;
import hammerstep.signal.SignalFaults;
import hammerstep.station.OperatorInputs;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleBlockHandler;
import hammerstep.station.StationClock;
import hammerstep.trace.TraceKeeper;
import org.agrona.ErrorHandler;
import org.agrona.concurrent.Agent;
import org.agrona.concurrent.AgentTerminationException;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.util.ArrayDeque;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The station's duty cycle: reads the clock once, polls the operator inputs and the part identity,
 * feeds waiting sample blocks through the transducer's one {@link InputStage} into the current
 * pass's {@link JointMonitor} (a block the sample ring lost is a data gap, see {@link #onGap}),
 * hands the sequence's records to the {@link JournalWriter}, then drives the tool enable and the
 * lamps from the sequence.
 * After every block the tool output is brought up to date, so tool enable drops within one block of
 * the shut-off crossing.
 *
 * <p>Storing never waits on a disk: a record is offered to the writer's ring, one sequence record at
 * a time, and the sequence hears {@link Sequence#stored} only when the writer's answer comes back
 * (a cycle later, or after a stalled forced write), so a verdict lamp still means "on disk". Built
 * on a {@link ResultSink}, the agent steps its own writer inline after each offer (tests, tools
 * with a memory store); built on a {@link JournalWriter}, the writer runs elsewhere (its own
 * thread, or stepped by the simulator).
 *
 * <p>Run it on one thread with Agrona's {@code AgentRunner} ({@link StationRunner}), or call
 * {@link #doWork()} by hand on a virtual clock (tests, {@code --fast}). Single-threaded; the sample
 * path allocates nothing. A cycle that throws is caught once: the tool drops and the lamps show the
 * fault picture; an {@link Exception} is counted and the loop goes on, an {@link Error} stops it.
 */
public final class StationAgent implements Agent, SampleBlockHandler, JointEvents {

    private static final Logger LOG = LoggerFactory.getLogger(StationAgent.class);
    private static final int MAX_BLOCKS_PER_CYCLE = 8;

    private final StationClock clock;
    private final StationPorts ports;
    private final JournalWriter journal;
    private final boolean journalInline;
    private final Sequence sequence;
    private Map<String, Pattern> patternsByModel;
    private Map<JointProgram, JointMonitor> monitors = new HashMap<>();
    private JointMonitor watch;
    private final InputStage stage;
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
    private boolean halted;
    /** The sequence's record handed to the journal (or waiting for room in its ring), or null. */
    private Store awaiting;
    private boolean awaitingOffered;
    /** Tool-health events waiting for room in the journal's ring. */
    private final ArrayDeque<Store> eventsToOffer = new ArrayDeque<>();
    private long lastShutoffToRelayNs = -1;
    private long maxShutoffToRelayNs = -1;

    /**
     * A station that stores through {@code sink} on the station's own thread, stepping a
     * {@link JournalWriter} inline after each record: for tests and tools whose store does not
     * touch a disk.
     *
     * @param patternsByModel part model → pattern; every program of every pattern gets its monitor here
     * @param conditioning    the transducer's conditioning (auto-zero, range, filter)
     */
    public StationAgent(StationClock clock, StationPorts ports, ResultSink sink, Sequence sequence,
                        Map<String, Pattern> patternsByModel, Conditioning conditioning, long blinkPeriodNs,
                        StationListener listener, ErrorHandler errorHandler) {
        this(clock, ports, new JournalWriter(sink), true, sequence, patternsByModel, conditioning, blinkPeriodNs,
                listener, errorHandler);
    }

    /**
     * A station that hands its records to {@code journal}, whose {@code doWork()} runs elsewhere: on
     * the writer's own thread ({@link JournalWriter#start}), or stepped by the caller in virtual time.
     */
    public StationAgent(StationClock clock, StationPorts ports, JournalWriter journal, Sequence sequence,
                        Map<String, Pattern> patternsByModel, Conditioning conditioning, long blinkPeriodNs,
                        StationListener listener, ErrorHandler errorHandler) {
        this(clock, ports, journal, false, sequence, patternsByModel, conditioning, blinkPeriodNs, listener,
                errorHandler);
    }

    private StationAgent(StationClock clock, StationPorts ports, JournalWriter journal, boolean journalInline,
                         Sequence sequence, Map<String, Pattern> patternsByModel, Conditioning conditioning,
                         long blinkPeriodNs, StationListener listener, ErrorHandler errorHandler) {
        if (patternsByModel.isEmpty()) {
            throw new IllegalArgumentException("a station needs at least one part model with its pattern");
        }
        this.clock = clock;
        this.ports = ports;
        this.journal = journal;
        this.journalInline = journalInline;
        this.sequence = sequence;
        this.patternsByModel = new LinkedHashMap<>(patternsByModel);
        this.listener = listener;
        this.errorHandler = errorHandler;
        this.stage = new InputStage(conditioning, ports.torque().rateHz(), ports.torque().maxBlockLength());
        String problem = PatternMonitors.lampProblem(this.patternsByModel, ports.lamps().positionLamps());
        if (problem != null) {
            throw new IllegalArgumentException(problem);
        }
        this.monitors = PatternMonitors.of(this.patternsByModel, Map.of(), stage, this);
        this.watch = monitors.get(PatternMonitors.firstProgram(this.patternsByModel));
        this.current = watch;
        this.lampDriver = new LampDriver(ports.lamps(), blinkPeriodNs);
        ports.tool().set(false);
        UnfinishedPart unfinished = journal.unfinishedPart();
        if (unfinished != null) {
            int stored = unfinished.jointIds().size();
            LOG.warn("part {} was in work when the station stopped ({} {} stored): supervisor key closes it"
                    + " as INTERRUPTED", unfinished.partSerial(), stored, stored == 1 ? "joint" : "joints");
            sequence.partInterrupted(unfinished, clock.nanoTime());
        }
    }

    @Override
    public String roleName() {
        return "station";
    }

    /**
     * One duty cycle. Whatever it throws is caught here, once: the tool drops, the lamps show the
     * fault picture and the error handler hears of it. After an {@link Exception} the loop goes on
     * (the next cycle brings tool and lamps back to what the sequence asks); after an {@link Error}
     * (out of memory, a linkage error) the station stops for good: every later call does nothing, and
     * an {@link AgentTerminationException} carrying the error ends the runner's thread.
     */
    @Override
    public int doWork() {
        if (halted) {
            return 0;
        }
        try {
            return cycle();
        } catch (Throwable t) {
            errors++;
            halted = t instanceof Error; // before anything else can throw
            safeOff();
            errorHandler.onError(t);
            if (t instanceof Error e) {
                throw new AgentTerminationException(e);
            }
            return 1;
        }
    }

    private int cycle() {
        nowNs = clock.nanoTime();
        if (journalInline) {
            journal.doWork(); // reads the store's room afresh, as the writer's own thread does every cycle
        }
        sequence.storage(journal.storage()); // fresh before a part may start (commands, inputs)
        int work = commands == null ? 0 : commands.serve(this, nowNs);
        work += pollInputs();
        selectMonitor();
        work += ports.torque().poll(this, MAX_BLOCKS_PER_CYCLE);
        work += drainStores();
        sequence.storage(journal.storage());
        sequence.sensorFaults(current.conditioner().faults());
        if (interference != null) {
            watchInterference();
        }
        sequence.onTick(nowNs);
        work += drainStores();
        applyTool();
        work += lampDriver.apply(sequence, nowNs);
        listener.onCycle(this, nowNs);
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
            traces.onBlock(samples, offset, length, firstSampleNs, inputConditioner());
        }
        long rejectedBefore = current.conditioner().rejectedImpulses();
        current.onSamples(samples, offset, length, firstSampleNs);
        listener.onTorque(samples, offset, length, firstSampleNs);
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

    /** The ring lost samples before the next block: that block follows a data gap. */
    @Override
    public void onGap() {
        stage.gap();
    }

    /** The transducer's input stage (its data-gap counts feed the status). */
    public InputStage inputStage() {
        return stage;
    }

    /**
     * The conditioner that conditions the next block (the input stage): the stored trace keeps its
     * state at a rundown's start, so that replay starts where the station did.
     */
    private Conditioner inputConditioner() {
        return stage.conditioner();
    }

    // ---- JointEvents from the current monitor, during onSamples ---------------------------------

    @Override
    public void onRundownStart(long startNs) {
        if (traces != null) {
            traces.rundownStarted(startNs);
        }
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
        if (traces != null) {
            traces.rundownJudged(result.startNs());
        }
        sequence.jointJudged(result, nowNs);
        drainStores();
    }

    // ---- outputs --------------------------------------------------------------------------------

    /**
     * Takes the journal's answers, then hands over what waits: tool-health events first, then the
     * sequence's oldest record, one at a time (the sequence hands out its next record only after
     * the last one is stored). With an inline journal the writer is stepped at once, so everything
     * is stored within the cycle, as the sequence asks.
     */
    private int drainStores() {
        int n = takeAnswers();
        while (true) {
            while (!eventsToOffer.isEmpty() && journal.offer(eventsToOffer.peek())) {
                eventsToOffer.poll();
                n++;
            }
            if (awaiting == null) {
                SequenceRecord r = sequence.nextToStore();
                if (r == null) {
                    break;
                }
                Store s = SequenceRecords.toStore(r, clock);
                if (traces != null && s instanceof Store.Joint j) {
                    s = new Store.Joint(traces.keep(j.outcome()));
                }
                awaiting = s;
                awaitingOffered = false;
            }
            if (awaitingOffered || !journal.offer(awaiting)) {
                break;
            }
            awaitingOffered = true;
            n++;
            if (!journalInline) {
                break;
            }
            stepInlineJournal();
            n += takeAnswers();
        }
        if (journalInline && !eventsToOffer.isEmpty()) {
            stepInlineJournal();
            n += takeAnswers();
        }
        return n;
    }

    private void stepInlineJournal() {
        while (journal.doWork() > 0) {
            // stores what was offered, one record a cycle
        }
    }

    /** The journal's answers: the sequence hears of its record, the listener of every stored one. */
    private int takeAnswers() {
        int n = 0;
        JournalWriter.Done d;
        while ((d = journal.poll()) != null) {
            n++;
            Store s = (Store) d.record();
            boolean sequenceRecord = s == awaiting;
            if (sequenceRecord) {
                awaiting = null;
                awaitingOffered = false;
            }
            if (!d.stored()) {
                sequence.storeFailed(nowNs);
                applyTool();
                LOG.error("{} not stored, station stopped until the supervisor key: {}",
                        s instanceof Store.Event ? "event" : "result", d.failure());
                listener.onStoreFailed(d.failure());
                continue;
            }
            ResultSink.Receipt receipt = d.receipt();
            if (sequenceRecord) {
                sequence.stored(receipt, nowNs);
            }
            if (s instanceof Store.Joint j) {
                listener.onJoint(j.outcome(), receipt);
                watchTool(j.outcome());
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
     * change is stored as an event (ahead of the sequence's next record), and a weak tool holds the
     * yellow lamp. An event the journal cannot store puts the station in FAULT, as any result does.
     */
    private void watchTool(JointOutcome joint) {
        if (toolHealth == null) {
            return;
        }
        for (ToolHealth.Change c : toolHealth.observe(toolName, joint.result().program().id(), joint.result())) {
            eventsToOffer.add(new Store.Event(ToolHealthEvents.of(c, joint.partSerial(), clock.instantOf(nowNs))));
        }
        sequence.warning(toolHealth.anyWeak());
    }

    /**
     * Interference: rejected impulses per hour against the warning level; a change is stored as an
     * event, ahead of the sequence's next record (an event the journal cannot store puts the station
     * in FAULT, as any result does).
     */
    private void watchInterference() {
        StationEvent event = interference.poll(nowNs, clock.instantOf(nowNs));
        if (event != null) {
            eventsToOffer.add(new Store.Event(event));
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

    private void applyTool() {
        boolean on = sequence.toolEnabled();
        if (on != toolOn || !toolWritten) {
            ports.tool().set(on);
            toolOn = on;
            toolWritten = true;
            listener.onTool(on, nowNs);
        }
    }

    /**
     * Tool off, then the fault picture on the lamps: red lit, every other lamp dark, so no green or
     * position lamp left from before can read as GO while the loop is not running. Each write is
     * tried on its own; a failing one goes to the error handler.
     */
    private void safeOff() {
        toolOff();
        try {
            lampDriver.faultPicture();
        } catch (Throwable t) {
            errorHandler.onError(t);
        }
    }

    private void toolOff() {
        try {
            ports.tool().set(false);
            toolOn = false;
        } catch (Throwable t) {
            errorHandler.onError(t);
        }
    }

    /** A normal stop: the tool drops; the lamps are left to the hardware's own close. */
    @Override
    public void onClose() {
        toolOff();
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

    /** The store's room as the journal last reported it. */
    public ResultSink.Storage storage() {
        return journal.storage();
    }

    boolean partPresent() {
        OperatorInputs in = ports.inputs();
        return !in.hasPartPresent() || in.partPresent();
    }

    /** True while a record of the sequence is with the journal and its answer has not come back. */
    public boolean storing() {
        return awaiting != null || !eventsToOffer.isEmpty();
    }

    /** True while the current monitor is inside a rundown. */
    public boolean inRundown() {
        return current.inRundown();
    }

    /** A part named by the plant: started as a scanned one is, once it is in the fixture. */
    void identify(PartIdentity identity) {
        waitingIdentity = identity;
    }

    /** The part named (by the plant or the scanner) that waits for the fixture, or null. */
    public PartIdentity queuedPart() {
        return waitingIdentity;
    }

    /** Forgets the part that waits for the fixture, so it never starts; returns it, or null when none waited. */
    PartIdentity cancelQueuedPart() {
        PartIdentity p = waitingIdentity;
        waitingIdentity = null;
        return p;
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
        monitors = PatternMonitors.of(patternsByModel, monitors, stage, this);
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
