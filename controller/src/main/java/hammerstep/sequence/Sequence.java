package hammerstep.sequence;

import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.ResultSink;
import hammerstep.results.UnfinishedPart;
import hammerstep.station.LampMode;
import hammerstep.station.OperatorInputs;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;

import java.time.LocalDate;

/**
 * The station's sequence of work on one part after another: a pure state machine. Events and
 * {@link #onTick(long)} go in; what comes out is state the station loop reads after each call
 * ({@link #toolEnabled()}, the lamp modes) and the records to store ({@link #nextToStore()}), which
 * the loop hands to the {@link ResultSink} and confirms with {@link #stored} or {@link #storeFailed}.
 * No threads, no sleeps, no clock: every time comes in as the station-clock {@code nowNs} of the call,
 * and the records carry it ({@link SequenceRecord#atNs()}). The loop that stores them turns it into
 * wall-clock time and words the events; the sequence builds no text.
 *
 * <p>Flow: waiting for a part → prompting a position → rundown → the result is stored → verdict
 * shown → next position; or rework (tool disabled until acknowledged, attempts counted) → pass
 * complete → next pass → part complete (GO), or part rejected (the supervisor key ends it). The tool
 * is enabled only while a position is prompted and, with confirm sensors, only while the tool is at
 * that position; it drops at the shut-off crossing. A verdict lamp shows only after its result was
 * stored.
 *
 * <p>A loosening (the tool in reverse, {@link JointResult#loosening()}) is stored as a joint result
 * (NO-GO, {@code LOOSENED}) of the position it undid, counts no attempt and needs no acknowledge. On a
 * position judged GO in the current pass it voids that position (alarm {@code LOOSENED}): the position
 * is pending again, its lamp prompts it again, and the part cannot complete until it is tightened
 * again. Which position: the confirm sensors' reading at the rundown's start; without sensors the
 * prompted one, except when the prompted position has no rundown yet in this pass (there is nothing on
 * it to loosen): then the position judged GO last, the bolt an operator backs off. A loosening of a
 * position not judged GO (not yet tightened, or backing out a NO-GO bolt) voids nothing: a notice
 * {@code LOOSENED}, and the prompt stands (docs/patterns.md).
 *
 * <p>Single-threaded: the station thread owns it.
 */
public final class Sequence {

    /**
     * What the sequence stamps on results besides the part.
     *
     * @param transducerSerial the fitted transducer, carried by every joint result
     * @param calibrationDue   its calibration due date, or null when unknown
     * @param completeHoldMs   how long a finished part shows green when no part-present sensor ends it
     */
    public record Settings(String transducerSerial, LocalDate calibrationDue, double completeHoldMs) {
    }

    private final Settings settings;
    private final boolean confirmSensors;
    private final Records records;

    private Phase phase = Phase.WAITING;
    private Phase resumeAfterFault = Phase.WAITING;
    private ResultSink.Storage storage = ResultSink.Storage.OK;
    private boolean warning;

    private PartIdentity part;
    private Pattern pattern;
    private String patternId;
    private String rejectedAs = "REJECTED";
    private Long partStartedNs;
    private final PartProgress progress = new PartProgress();
    private boolean abandonAfterStore;
    private int passIndex;

    private int prompted = -1;
    private int reworkPosition = -1;
    private boolean reworkRetry;
    private int rundownPosition = -1;
    private boolean shutoffSeen;
    private boolean unexpectedRundown;
    private int toolAt = OperatorInputs.NO_POSITION;
    private Verdict lastVerdict;
    private int judgedPosition = -1;
    private Verdict judgedVerdict;
    private boolean judgedLoosening;
    private boolean judgedVoids;
    private long completeAtNs;
    /** The finished part's GO record is on disk: only then does COMPLETE show, and its hold run. */
    private boolean completeOnDisk;
    private final SensorLockout lockout = new SensorLockout();

    /**
     * @param confirmSensors true when the fixture reports at which position the tool is
     */
    public Sequence(Settings settings, boolean confirmSensors) {
        this.settings = settings;
        this.records = new Records(settings);
        this.confirmSensors = confirmSensors;
    }

    // ---- events --------------------------------------------------------------------------

    /**
     * A part was identified. Starts it when the station is waiting (or showing a finished part) and
     * the store has room; {@code pattern} is null when the station file knows no pattern for its model.
     *
     * @return true when the part was started
     */
    public boolean partArrived(PartIdentity identity, Pattern pattern, long nowNs) {
        if (phase == Phase.COMPLETE) {
            clearPart();
        }
        if (phase != Phase.WAITING) {
            records.event(new SequenceRecord.IdentityIgnored(identity.serial(), part == null ? null : part.serial(),
                    nowNs));
            return false;
        }
        if (storage == ResultSink.Storage.FULL) {
            return false;
        }
        if (pattern == null) {
            records.event(new SequenceRecord.UnknownModel(identity.serial(), identity.model(), nowNs));
            return false;
        }
        this.part = identity;
        this.pattern = pattern;
        this.patternId = pattern.id();
        this.rejectedAs = "REJECTED";
        this.partStartedNs = nowNs;
        this.abandonAfterStore = false;
        this.progress.startPart(pattern.size());
        this.passIndex = 0;
        this.lastVerdict = null;
        startPass(nowNs);
        return true;
    }

    /**
     * At start: the station stopped (power cut, kill) while {@code unfinished} was in work; its joints
     * are stored but it has no part record. Nothing resumes: the tool stays off, red blinks, an alarm
     * names the part, and a scan starts nothing until the supervisor key closes the part with a
     * part record {@code NO_GO}, ended {@code INTERRUPTED}, listing the joints stored before the stop.
     * Call before any other event.
     */
    public void partInterrupted(UnfinishedPart unfinished, long nowNs) {
        if (phase != Phase.WAITING || part != null) {
            throw new IllegalStateException("an interrupted part is taken over at start, before any other part");
        }
        part = new PartIdentity(unfinished.partSerial(), unfinished.partModel());
        pattern = null;
        patternId = unfinished.pattern();
        partStartedNs = null;
        progress.startPart(0);
        for (String id : unfinished.jointIds()) {
            progress.jointStored(id);
        }
        prompted = -1;
        rejectedAs = "INTERRUPTED";
        phase = Phase.REJECTED;
        int n = unfinished.jointIds().size();
        records.event(new SequenceRecord.PartInterrupted(part.serial(), n, nowNs));
    }

    /**
     * The part left the fixture (part-present sensor). A part in work is abandoned; a rundown under
     * way is still judged and stored first (the tool drops at once), so the tightening that happened
     * is on record; a rejected one still needs the key.
     */
    public void partRemoved(long nowNs) {
        switch (phase) {
            case PROMPT, REWORK -> abandon(nowNs);
            case RUNDOWN, STORING -> abandonAfterStore = true;
            case COMPLETE -> clearPart();
            default -> { }
        }
    }

    /**
     * The plant ended the part in work ({@code cmd/end-part}): a {@code PART_ENDED} notice with the
     * reason, then the part is stored as abandoned, as if it had left the fixture (a rundown under
     * way is judged and stored first, the tool drops at once; a rejected part ends as rejected).
     *
     * @return null when the part was ended, else why not: {@code NO_PART} or {@code FAULT}
     */
    public String endPart(String reason, long nowNs) {
        if (phase == Phase.FAULT) {
            return "FAULT";
        }
        if (part == null || phase == Phase.COMPLETE || abandonAfterStore) {
            return "NO_PART";
        }
        records.event(new SequenceRecord.PartEndedByPlant(part.serial(), reason, nowNs));
        if (phase == Phase.REJECTED) {
            partRecord("NO_GO", rejectedAs, nowNs);
            clearPart();
        } else {
            partRemoved(nowNs);
        }
        return null;
    }

    /** A rundown began (reported by the joint monitor at its first sample). */
    public void rundownStarted(long nowNs) {
        if (effective() == Phase.PROMPT) {
            rundownPosition = confirmSensors && toolAt >= 0 && toolAt < progress.size() ? toolAt : prompted;
            go(Phase.RUNDOWN);
            shutoffSeen = false;
            lastVerdict = null;
        } else {
            unexpectedRundown = true;
        }
    }

    /** The joint reached its program's shut-off level: the tool drops until the next prompt. */
    public void shutoff(long nowNs) {
        if (effective() == Phase.RUNDOWN) {
            shutoffSeen = true;
        }
    }

    /** The rundown ended and was judged by the current pass's program. */
    public void jointJudged(JointResult result, long nowNs) {
        if (effective() != Phase.RUNDOWN) {
            if (unexpectedRundown) {
                records.event(new SequenceRecord.UnexpectedRundown(part == null ? null : part.serial(), result.blows(),
                        result.finalTorqueNm(), nowNs));
            }
            unexpectedRundown = false;
            return;
        }
        if (result.loosening()) {
            loosened(result, nowNs);
            return;
        }
        int pos = rundownPosition;
        JointResult r = result;
        if (pos != prompted) {
            boolean rehit = progress.done(pos);
            r = Records.withReason(result, rehit ? Reason.REHIT : Reason.OUT_OF_SEQUENCE);
            records.event(new SequenceRecord.WrongPosition(part.serial(), position(pos), position(prompted), rehit,
                    nowNs));
        }
        int attempt = progress.countAttempt(pos);
        Pattern.Pass pass = pass();
        records.joint(part, pattern, pos, pass.name(), attempt, r, nowNs);
        judgedPosition = pos;
        judgedVerdict = r.verdict();
        judgedLoosening = false;
        go(Phase.STORING);
    }

    /** A loosening was judged: stored against the position it undid; voids that position if it was GO. */
    private void loosened(JointResult result, long nowNs) {
        int pos = rundownPosition;
        boolean inferred = false;
        if (!confirmSensors && pos == prompted && progress.attempts(pos) == 0 && progress.lastPassed() >= 0) {
            pos = progress.lastPassed();
            inferred = true;
        }
        boolean voids = progress.done(pos);
        records.event(new SequenceRecord.Loosened(part.serial(), position(pos), voids, inferred, nowNs));
        records.joint(part, pattern, pos, pass().name(), Math.max(1, progress.attempts(pos)), result, nowNs);
        judgedPosition = pos;
        judgedVerdict = result.verdict();
        judgedLoosening = true;
        judgedVoids = voids;
        go(Phase.STORING);
    }

    /** Operator's acknowledge button was pressed (an edge). */
    public void acknowledge(long nowNs) {
        if (phase == Phase.REWORK && pass().acknowledge() == Acknowledge.OPERATOR) {
            releaseRework("operator", nowNs);
        }
    }

    /**
     * The supervisor key was turned (an edge): releases a sensor lockout once the signal is healthy
     * again (that turn does nothing else), else releases rework, ends a rejected part, retries a failed store.
     */
    public void supervisorKey(long nowNs) {
        if (lockout.active()) {
            if (lockout.release()) {
                records.event(new SequenceRecord.SensorFaultCleared(part == null ? null : part.serial(), nowNs));
            }
            return;
        }
        switch (phase) {
            case REWORK -> releaseRework("supervisor", nowNs);
            case REJECTED -> {
                partRecord("NO_GO", rejectedAs, nowNs);
                clearPart();
            }
            case FAULT -> phase = resumeAfterFault;
            default -> { }
        }
    }

    /** The confirm sensors' reading (a level; {@link OperatorInputs#NO_POSITION} for none). */
    public void toolAt(int position) {
        this.toolAt = position;
    }

    /**
     * A fault of the torque signal began (bits of {@code hammerstep.signal.SignalFaults}, named in
     * {@code names}): the tool is locked out, red and yellow blink, and an alarm is stored. A rundown
     * under way still ends and is judged (NO-GO, {@code SENSOR_FAULT}). The lockout holds until the
     * signal is healthy ({@link #sensorFaults}) and the supervisor key is turned.
     */
    public void sensorFault(int faults, String names, long nowNs) {
        if (lockout.fault(faults)) {
            records.event(new SequenceRecord.SensorFault(part == null ? null : part.serial(), names, nowNs));
        }
    }

    /** The signal's fault bits as they stand now (0 when healthy); called by the loop every cycle. */
    public void sensorFaults(int faultsNow) {
        lockout.faultsNow(faultsNow);
    }

    /** The fault bits that locked the tool out, or 0 when no sensor lockout stands. */
    public int sensorLockout() {
        return lockout.bits();
    }

    /** What the result store reported about its room. */
    public void storage(ResultSink.Storage storage) {
        this.storage = storage;
    }

    /** A standing warning of the station (calibration due, sensor fault, tool slowing): yellow lamp. */
    public void warning(boolean on) {
        this.warning = on;
    }

    public void onTick(long nowNs) {
        if (phase == Phase.COMPLETE && completeOnDisk && nowNs - completeAtNs - (long) (settings.completeHoldMs() * 1e6) >= 0) {
            clearPart();
        }
    }

    // ---- storing ------------------------------------------------------------------------------

    /** The oldest record waiting to be stored, or null; none is handed out while a store fault stands. */
    public SequenceRecord nextToStore() {
        return phase == Phase.FAULT ? null : records.peek();
    }

    /** The record from {@link #nextToStore()} was stored; a joint's verdict shows now. */
    public void stored(ResultSink.Receipt receipt, long nowNs) {
        SequenceRecord done = records.poll();
        if (done instanceof SequenceRecord.JointJudged) {
            progress.jointStored(receipt.id());
            if (phase == Phase.STORING) {
                applyVerdict(nowNs);
            }
        } else if (done instanceof SequenceRecord.PartClosed && phase == Phase.COMPLETE && !completeOnDisk) {
            completeOnDisk = true; // the part's GO shows from now, for the whole hold
            completeAtNs = nowNs;
        }
    }

    /** The record from {@link #nextToStore()} could not be stored: tool off until the supervisor key. */
    public void storeFailed(long nowNs) {
        if (phase != Phase.FAULT) {
            resumeAfterFault = phase;
            phase = Phase.FAULT;
        }
    }

    // ---- outputs ---------------------------------------------------------------------------

    public boolean toolEnabled() {
        boolean prompting = phase == Phase.PROMPT || (phase == Phase.RUNDOWN && !shutoffSeen);
        return prompting && !lockout.active() && !abandonAfterStore && (!confirmSensors || toolAt == prompted);
    }

    /** What position lamp {@code index} (0-based) shows. */
    public LampMode positionLamp(int index) {
        return LampPicture.position(index, part != null, lampPhase(effective()), progress, prompted, reworkPosition);
    }

    /** What the tower lamp shows. */
    public LampMode tower(TowerLamp lamp) {
        return LampPicture.tower(lamp, lampPhase(phase), lastVerdict, storage, lockout.active(), warning);
    }

    public Phase phase() {
        return phase;
    }

    /** The part in work, or null. */
    public PartIdentity part() {
        return part;
    }

    public Pattern pattern() {
        return pattern;
    }

    /** The pass in work, or null without a part. */
    public Pattern.Pass pass() {
        return pattern == null ? null : pattern.passes().get(passIndex);
    }

    public int passIndex() {
        return passIndex;
    }

    /** The program the joint monitor should judge the next rundown by, or null without a part. */
    public JointProgram program() {
        Pattern.Pass p = pass();
        return p == null ? null : p.program();
    }

    /** The prompted position (0-based), or -1. */
    public int prompted() {
        return phase == Phase.PROMPT || phase == Phase.RUNDOWN || phase == Phase.STORING ? prompted : -1;
    }

    /** The position that came out NO-GO while in {@link Phase#REWORK}, else -1. */
    public int reworkPosition() {
        return phase == Phase.REWORK ? reworkPosition : -1;
    }

    /** Rundowns so far on {@code position} in the current pass. */
    public int attempts(int position) {
        return progress.attempts(position);
    }

    /** True when {@code position} is done (GO) in the current pass. */
    public boolean done(int position) {
        return progress.done(position);
    }

    /** True once some position of the part has failed for good: the part cannot end GO. */
    public boolean partFailed() {
        return progress.partFailed();
    }

    // ---- inside ----------------------------------------------------------------------------

    /** The phase the lamps show: a finished part shows as storing until its GO record is on disk. */
    private Phase lampPhase(Phase p) {
        return p == Phase.COMPLETE && !completeOnDisk ? Phase.STORING : p;
    }

    /** The phase that events act on: while a store fault stands, the phase it interrupted. */
    private Phase effective() {
        return phase == Phase.FAULT ? resumeAfterFault : phase;
    }

    private void go(Phase next) {
        if (phase == Phase.FAULT) {
            resumeAfterFault = next;
        } else {
            phase = next;
        }
    }

    private void startPass(long nowNs) {
        progress.startPass(pass());
        advance(nowNs);
    }

    private void advance(long nowNs) {
        int next = progress.nextPending(pass());
        if (next >= 0) {
            prompted = next;
            phase = Phase.PROMPT;
            return;
        }
        prompted = -1;
        if (passIndex + 1 < pattern.passes().size()) {
            passIndex++;
            startPass(nowNs);
            return;
        }
        if (progress.partFailed()) {
            phase = Phase.REJECTED;
            return;
        }
        partRecord("GO", "COMPLETE", nowNs);
        phase = Phase.COMPLETE;
        completeAtNs = nowNs;
        completeOnDisk = false;
    }

    private void applyVerdict(long nowNs) {
        int pos = judgedPosition;
        lastVerdict = judgedVerdict;
        if (judgedLoosening) {
            if (judgedVoids) {
                progress.voided(pos);
            }
            if (abandonAfterStore) {
                abandon(nowNs);
            } else {
                advance(nowNs);
            }
            return;
        }
        if (judgedVerdict == Verdict.GO) {
            progress.passed(pos);
            if (abandonAfterStore) {
                abandon(nowNs);
            } else {
                advance(nowNs);
            }
            return;
        }
        Pattern.Pass pass = pass();
        reworkPosition = pos;
        int tried = progress.attempts(pos);
        if (tried < pass.attempts()) {
            progress.retry(pos);
            reworkRetry = true;
        } else {
            progress.failed(pos, pass.afterNoGo() == AfterNoGo.SKIP_POSITION);
            reworkRetry = false;
            records.event(new SequenceRecord.PositionFailed(part.serial(), position(pos), tried, pass.name(), nowNs));
            if (pass.afterNoGo() == AfterNoGo.REJECT) {
                prompted = -1;
                phase = Phase.REJECTED;
                abandonAfterStore = false; // a rejected part still needs the key, taken out or not
                return;
            }
        }
        if (abandonAfterStore) {
            abandon(nowNs);
            return;
        }
        phase = Phase.REWORK;
    }

    private void releaseRework(String by, long nowNs) {
        records.event(new SequenceRecord.ReworkAcknowledged(part.serial(), position(reworkPosition), by, nowNs));
        if (reworkRetry) {
            prompted = reworkPosition;
            phase = Phase.PROMPT;
        } else {
            advance(nowNs);
        }
        reworkPosition = -1;
    }

    private void abandon(long nowNs) {
        partRecord("NO_GO", "ABANDONED", nowNs);
        clearPart();
    }

    private void clearPart() {
        part = null;
        pattern = null;
        patternId = null;
        rejectedAs = "REJECTED";
        prompted = -1;
        reworkPosition = -1;
        abandonAfterStore = false;
        phase = Phase.WAITING;
    }

    private void partRecord(String verdict, String ended, long nowNs) {
        records.part(part, patternId, verdict, ended, progress.jointIds(), partStartedNs, nowNs);
    }

    private SequenceRecord.Position position(int pos) {
        return Records.position(pattern, pos);
    }
}
