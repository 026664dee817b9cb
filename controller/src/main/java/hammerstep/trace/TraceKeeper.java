package hammerstep.trace;

import hammerstep.joint.JointResult;
import hammerstep.results.JointOutcome;
import hammerstep.signal.Conditioner;
import hammerstep.signal.Conditioning;
import hammerstep.signal.ConditionerText;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Keeps the torque trace of every judged joint for the station: a {@link TraceRecorder} fed with
 * every sample block, and a {@link TraceStore} that each joint's span (from {@code leadMs} before
 * its start to the last sample the recorder has) is written to. {@link #keep} returns the joint
 * with its {@code tracePath} set.
 *
 * <p>So that replay gives the station's answer, the keeper also notes what the chain needs (see
 * docs/design.md, "Stored traces"): fed through {@link #onBlock} with the input stage's conditioner
 * before the chain sees each block, it keeps that conditioner's state at the start of the block in
 * which a rundown starts ({@link #rundownStarted}) and the sample that block starts at; the trace is
 * then cut from {@code leadMs} before that sample to the end of the block in which the rundown was
 * judged ({@link #rundownJudged}), and its metadata carries the conditioning, that state, the
 * station's block length and the index of the block's first sample ({@code judge_from}).
 * Allocation-free per block.
 *
 * <p>A trace that cannot be written never stops the station: the joint is stored without a trace,
 * the failure is logged and counted ({@link #failures()}). Station thread only.
 */
public final class TraceKeeper implements SampleSink {

    private static final Logger LOG = LoggerFactory.getLogger(TraceKeeper.class);

    private final TraceRecorder recorder;
    private final TraceStore store;
    private final long leadNs;
    private long lastSampleNs = Long.MIN_VALUE;
    private long failures;

    // the input stage's state at the start of the block under way, and at the start of the block
    // in which the last rundown started
    private Conditioner beforeBlock;
    private Conditioner atStart;
    private Conditioning blockSettings;
    private Conditioning startSettings;
    private long blockIndex = -1;
    private int blockLength;
    private long startIndex = -1;
    private int startBlockLength;
    private long startNs = Long.MIN_VALUE;
    private long judgedEndIndex = -1;
    private long judgedStartNs = Long.MIN_VALUE;

    public TraceKeeper(TraceRecorder recorder, TraceStore store, double leadMs) {
        this.recorder = recorder;
        this.store = store;
        this.leadNs = Math.round(leadMs * 1e6);
    }

    /** A keeper for {@code settings} at the station's sample rate. */
    public static TraceKeeper open(TracesSection.Traces settings, double rateHz) throws IOException {
        return new TraceKeeper(TraceRecorder.forSeconds(rateHz, settings.ringSeconds()),
                new TraceStore(settings.dir(), settings.maxCount(), settings.maxBytes(), settings.encoding()),
                settings.leadMs());
    }

    @Override
    public void onSamples(float[] samples, int offset, int length, long firstSampleNs) {
        recorder.onSamples(samples, offset, length, firstSampleNs);
        if (length > 0) {
            lastSampleNs = firstSampleNs + Math.round((length - 1) * 1e9 / recorder.rateHz());
        }
    }

    /**
     * Records a block before the chain processes it; {@code input} is the conditioner that will
     * condition it (the input stage's), whose state now is the state the block starts from.
     */
    public void onBlock(float[] samples, int offset, int length, long firstSampleNs, Conditioner input) {
        if (beforeBlock == null || beforeBlock.rateHz() != input.rateHz()) {
            beforeBlock = new Conditioner(input.settings(), input.rateHz());
            atStart = new Conditioner(input.settings(), input.rateHz());
        }
        input.copyStateTo(beforeBlock);
        blockSettings = input.settings();
        blockIndex = recorder.written();
        blockLength = length;
        onSamples(samples, offset, length, firstSampleNs);
    }

    /** The chain started a rundown at {@code startNs} in the block last given to {@link #onBlock}. */
    public void rundownStarted(long startNs) {
        if (blockIndex < 0) {
            return;
        }
        beforeBlock.copyStateTo(atStart);
        startSettings = blockSettings;
        startIndex = blockIndex;
        startBlockLength = blockLength;
        this.startNs = startNs;
    }

    /** The chain judged the rundown that started at {@code startNs}, in the block last recorded. */
    public void rundownJudged(long startNs) {
        judgedStartNs = startNs;
        judgedEndIndex = recorder.written();
    }

    /** Writes the joint's trace and returns the joint naming it; the joint unchanged when it could not be written. */
    public JointOutcome keep(JointOutcome joint) {
        JointResult r = joint.result();
        Map<String, String> meta = new LinkedHashMap<>();
        meta.put("part_serial", String.valueOf(joint.partSerial()));
        meta.put("position", String.valueOf(joint.position()));
        meta.put("pass", String.valueOf(joint.pass()));
        meta.put("attempt", Integer.toString(joint.attempt()));
        meta.put("program", r.program().id());
        meta.put("program_revision", r.program().revision());
        meta.put("verdict", r.verdict().name());
        putJudgement(r, meta);
        String name = joint.partSerial() + "_" + joint.position() + "_" + joint.pass() + "_" + joint.attempt();
        try {
            Path p = reproducible(r) ? saveWithChain(name, meta)
                    : store.save(name, meta, recorder, r.startNs() - leadNs, Math.max(r.endNs(), lastSampleNs));
            return new JointOutcome(joint.partSerial(), joint.partModel(), joint.pattern(), joint.position(),
                    joint.positionIndex(), joint.pass(), joint.attempt(), joint.result(), joint.transducerSerial(),
                    joint.calibrationDue(), joint.at(), p.toString());
        } catch (IOException | RuntimeException e) {
            failures++;
            LOG.warn("trace of {} not kept: {}", name, e.toString());
            return joint;
        }
    }

    /** Most peaks written into a trace's metadata (which is at most 4 KiB); the count is always written. */
    static final int MAX_PEAKS_IN_METADATA = 64;

    /**
     * The station's judgement, exactly (numbers read back to the same bits): {@code blows},
     * {@code final_torque_nm}, {@code reasons} (comma-separated, station reasons included) and, up
     * to {@value #MAX_PEAKS_IN_METADATA} blows, {@code peaks_nm}.
     */
    private static void putJudgement(JointResult r, Map<String, String> meta) {
        meta.put("blows", Integer.toString(r.blows()));
        meta.put("final_torque_nm", Double.toString(r.finalTorqueNm()));
        StringBuilder reasons = new StringBuilder();
        for (hammerstep.joint.Reason reason : r.reasons()) {
            reasons.append(reasons.length() == 0 ? "" : ",").append(reason.name());
        }
        meta.put("reasons", reasons.toString());
        if (r.peaksNm().length <= MAX_PEAKS_IN_METADATA) {
            StringBuilder peaks = new StringBuilder();
            for (double p : r.peaksNm()) {
                peaks.append(peaks.length() == 0 ? "" : ",").append(p);
            }
            meta.put("peaks_nm", peaks.toString());
        }
    }

    /**
     * True when the keeper saw this joint's rundown start and end through {@link #onBlock} and the
     * ring still holds the block it started in.
     */
    private boolean reproducible(JointResult r) {
        return startIndex >= 0 && startNs == r.startNs() && judgedStartNs == r.startNs()
                && judgedEndIndex > startIndex && startIndex >= recorder.oldest()
                && judgedEndIndex - startIndex <= recorder.capacity();
    }

    /** Cuts from the lead before the rundown's start block to the end of the block it was judged in. */
    private Path saveWithChain(String name, Map<String, String> meta) throws IOException {
        long leadSamples = (long) Math.ceil(leadNs * 1e-9 * recorder.rateHz() - 1e-9);
        long from = Math.max(recorder.oldest(), Math.max(startIndex - leadSamples, judgedEndIndex - recorder.capacity()));
        meta.put("block_samples", Integer.toString(startBlockLength));
        meta.put("judge_from", Long.toString(startIndex - from));
        if (Double.isFinite(startSettings.overRangeNm()) && startSettings.overRangeNm() > 0) {
            meta.put("range_nm", Double.toString(startSettings.overRangeNm()));
        }
        ConditionerText.write(startSettings, atStart.state(), meta);
        return store.saveIndices(name, meta, recorder, from, judgedEndIndex);
    }

    /** Traces that could not be written. */
    public long failures() {
        return failures;
    }

    public TraceStore store() {
        return store;
    }
}
