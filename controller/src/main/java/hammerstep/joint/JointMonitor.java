package hammerstep.joint;

import hammerstep.signal.BlowShapes;
import hammerstep.signal.Conditioner;
import hammerstep.signal.Conditioning;
import hammerstep.signal.PulseDetector;
import hammerstep.signal.PulseSink;
import hammerstep.signal.SignalFaults;

import java.util.Arrays;
import java.util.List;

/**
 * The whole measurement chain for one joint program: conditioning, blow detection, rundown
 * segmentation and the verdict. Feed it blocks of N·m samples in time order; it reports through
 * {@link JointEvents}. This is the same object in the station, in replay and in the simulator's
 * cross-checks.
 *
 * <p>Conditioning is done by an {@link InputStage}: a monitor either builds its own (replay, the
 * simulator's cross-checks) or shares the transducer's one with the monitors of the other programs
 * (the station), so that zero, filter and fault memory carry on across program switches. Either way
 * {@link #onSamples} takes raw N·m samples; the stage calls {@link #onConditioned} back. Blocks must
 * follow each other in time: a block that does not start where the one before ended is a data gap
 * ({@link SignalFaults#DATA_GAP}; see {@link InputStage}).
 *
 * <p>A rundown starts at the first sample that reaches {@code rundown.start_above} in the tightening
 * sense or {@code blows.count_above} against it (a loosening begins with a reverse strike; smaller
 * reverse wiggles, such as the contact of a free-running tool's hammer when it is braked, start
 * nothing), and ends once |torque| has stayed below {@code start_above} for {@code end_after_ms}; its
 * duration runs to the last sample above.
 * A rundown reaching {@code max_ms} is cut there and judged {@code TIME_LONG}; a new rundown can then
 * start only after the signal has been quiet for {@code end_after_ms}.
 *
 * <p>Direction: blows are found in either sense. Those in the tightening sense (positive; negative for
 * a {@linkplain JointProgram#leftHand() left-hand} program, whose signal is read with its sign flipped)
 * are the rundown's blows. Reverse strikes (main lobe at least {@link #MIN_REVERSE_STRIKE_MS} and
 * {@link #MIN_REVERSE_STRIKE_SAMPLES} samples wide, so that no interference spike counts) are kept apart; when they carry more impulse than the tightening
 * blows (and, when there are tightening blows, number at least {@link #MIN_REVERSE_STRIKES_AFTER_BLOWS}),
 * the rundown is a loosening: {@link Direction#LOOSEN}, its reverse strikes as negative peaks, NO-GO
 * {@link Reason#LOOSENED}. The lone reverse contact after the blows of a tightening (the hammer thrown
 * back when the tool stops) therefore leaves it a tightening, even after a single snug blow.
 *
 * <p>Allocation-free per block; allocates one {@link JointResult} per rundown. Single-threaded.
 */
public final class JointMonitor implements PulseSink {

    /** Blow figures kept per rundown; the count and the final torque stay right beyond it. */
    public static final int MAX_STORED_BLOWS = 1024;
    /**
     * A pulse whose main lobe is narrower than this cannot be a strike: strike pulses last about 1 to
     * 5 ms (memory of transducer practice). Three of them in a rundown, each closer to the pulse
     * before than any tool strikes, mean electrical noise: the {@code NOISE} fault (SENSOR_FAULT).
     */
    public static final double MIN_STRIKE_MS = 0.25;
    /**
     * A reverse pulse counts as a reverse strike only when its main lobe lasts this long and at least
     * {@link #MIN_REVERSE_STRIKE_SAMPLES} samples: a one- or two-sample spike never does. Lower than
     * {@link #MIN_STRIKE_MS} because the last strikes of a loosening, on a nut that already turns,
     * are short (0.2 ms above the release level in the simulator's cam-and-ball tool).
     */
    public static final double MIN_REVERSE_STRIKE_MS = 0.1;
    public static final int MIN_REVERSE_STRIKE_SAMPLES = 3;
    /**
     * After tightening blows, a loosening needs this many reverse strikes: a tool that stops after
     * hammering throws its hammer back onto the jaw behind it once (one reverse contact), which after
     * a single snug blow can carry more impulse than that blow.
     */
    public static final int MIN_REVERSE_STRIKES_AFTER_BLOWS = 2;

    private enum State { IDLE, ACTIVE, QUIET }

    private final JointProgram program;
    private final InputStage stage;
    private final PulseDetector detector;
    private final BlowShapes shapes;
    private final ResidualEstimator residual = new ResidualEstimator();
    private final JointEvents events;
    private final double periodNs;
    private final float startAbove;
    private final float sense;
    private final double minReverseWidthMs;
    /** Idle: a sample at or above {@code idleHigh} or at or below {@code idleLow} starts a rundown. */
    private final float idleHigh;
    private final float idleLow;
    private final float shutoffNm;
    private final long endAfterSamples;
    private final long maxSamples;

    private State state = State.IDLE;
    private long sampleBase;
    private long startSample;
    private long lastAboveSample;
    private long startNs;
    private long lastAboveNs;
    private long shutoffNs;
    private int rundownFaults;
    private long rejectedAtStart;

    private int blows;
    private int narrowPulses;
    private long lastPulseStartNs;
    private int blowsAfterShutoff;
    private int firstBlowAtMin;
    private double maxPeak;
    private final double[] lastThree = new double[3];
    private final double[] peaks = new double[MAX_STORED_BLOWS];
    private final long[] peakTimes = new long[MAX_STORED_BLOWS];
    private final double[] widths = new double[MAX_STORED_BLOWS];
    private final double[] impulses = new double[MAX_STORED_BLOWS];
    private double tightenImpulse;
    private int reverseStrikes;
    private double reverseImpulse;
    private double reversePeak;
    private final double[] reversePeaks = new double[MAX_STORED_BLOWS];
    private final long[] reverseTimes = new long[MAX_STORED_BLOWS];
    private final double[] reverseWidths = new double[MAX_STORED_BLOWS];
    private final double[] reverseImpulses = new double[MAX_STORED_BLOWS];

    /**
     * A monitor with its own input stage (replay, the simulator's cross-checks).
     *
     * @param maxBlockLength the longest block that {@link #onSamples} will be given
     */
    public JointMonitor(JointProgram program, Conditioning conditioning, double rateHz, int maxBlockLength,
                        JointEvents events) {
        this(program, new InputStage(conditioning, rateHz, maxBlockLength), events);
    }

    /**
     * A monitor fed by {@code stage}, the transducer's input stage that the monitors of the other
     * programs share (the station). Feed it through {@link #onSamples} while it is the current one;
     * a monitor not fed misses nothing, since the stage runs on in the current monitor.
     */
    public JointMonitor(JointProgram program, InputStage stage, JointEvents events) {
        double rateHz = stage.rateHz();
        this.program = program;
        this.stage = stage;
        JointProgram.Blows b = program.blows();
        this.detector = new PulseDetector(b.countAboveNm(), b.releaseBelowNm(), b.deadTimeMs(), rateHz, this);
        this.shapes = new BlowShapes(b.countAboveNm(), b.releaseBelowNm(), program.tighteningSign(), rateHz);
        this.events = events;
        this.periodNs = 1e9 / rateHz;
        this.startAbove = (float) program.rundown().startAboveNm();
        this.sense = program.tighteningSign();
        this.minReverseWidthMs = Math.max(MIN_REVERSE_STRIKE_MS, (MIN_REVERSE_STRIKE_SAMPLES - 0.5) * 1e3 / rateHz);
        float reverseStart = (float) Math.max(program.rundown().startAboveNm(), b.countAboveNm());
        this.idleHigh = sense > 0 ? startAbove : reverseStart;
        this.idleLow = sense > 0 ? -reverseStart : -startAbove;
        this.shutoffNm = program.hasShutoff() ? (float) program.shutoffAtNm() : Float.POSITIVE_INFINITY;
        this.endAfterSamples = Math.max(1, (long) Math.ceil(program.rundown().endAfterMs() * 1e-3 * rateHz));
        this.maxSamples = Math.max(1, (long) Math.ceil(program.rundown().maxMs() * 1e-3 * rateHz));
    }

    /**
     * Conditioning suited to a program where the transducer's range is unknown: auto-zero follows
     * blocks whose samples all stay within the start level of their mean; impulses rejected.
     */
    public static Conditioning replayConditioning(JointProgram program) {
        return Conditioning.forReplay(program.rundown().startAboveNm());
    }

    /**
     * Processes raw samples {@code samples[offset, offset+length)}, the first taken at
     * {@code firstSampleNs}: the input stage conditions them and calls {@link #onConditioned} back.
     */
    public void onSamples(float[] samples, int offset, int length, long firstSampleNs) {
        stage.onSamples(samples, offset, length, firstSampleNs, this);
    }

    /**
     * The input stage's entry: conditioned samples {@code x[offset, offset+length)} with the fault
     * bits standing for the block ({@code faults}; {@link SignalFaults#DATA_GAP} when samples are
     * missing just before the block) and those of them that began with it ({@code risingFaults},
     * reported through {@link JointEvents#onFault}).
     *
     * @return true when the block's data gap fell into a rundown (the rundown is then a SENSOR_FAULT);
     *     false when there was none or no rundown was under way
     */
    public boolean onConditioned(float[] x, int offset, int length, long firstSampleNs, int faults,
                                 int risingFaults) {
        if (risingFaults != 0) {
            events.onFault(risingFaults, firstSampleNs);
        }
        int gap = faults & SignalFaults.DATA_GAP;
        boolean gapTaken = false;
        if (state == State.ACTIVE && gap != 0) {
            gapTaken = true;
            rundownGap(firstSampleNs);
        }
        if (state != State.IDLE) {
            rundownFaults |= faults & ~SignalFaults.DATA_GAP;
        }
        int i = offset;
        int end = offset + length;
        long blockNs = firstSampleNs - (long) (offset * periodNs);
        // sample indices below run over x[offset, end); sampleBase counts from x[0] for this block
        sampleBase -= offset;
        while (i < end) {
            switch (state) {
                case IDLE:
                    i = scanIdle(x, i, end, blockNs, faults);
                    if (i == offset && state == State.ACTIVE && gap != 0) {
                        // the rundown began at the first sample after the gap: its start may be lost
                        gapTaken = true;
                        rundownGap(firstSampleNs);
                    }
                    break;
                case ACTIVE:
                    i = scanActive(x, i, end, blockNs);
                    break;
                default:
                    i = scanQuiet(x, i, end);
                    break;
            }
        }
        sampleBase += end;
        return gapTaken;
    }

    private void rundownGap(long atNs) {
        if ((rundownFaults & SignalFaults.DATA_GAP) == 0) {
            rundownFaults |= SignalFaults.DATA_GAP;
            events.onFault(SignalFaults.DATA_GAP, atNs);
        }
    }

    /** True while the monitor waits for a rundown: auto-zero may follow the signal (see {@link InputStage}). */
    boolean idle() {
        return state == State.IDLE;
    }

    private int scanIdle(float[] x, int i, int length, long firstNs, int faults) {
        // mains hum not yet learned is still in the signal: it must not start a rundown
        Conditioner conditioner = stage.conditioner();
        float settling = conditioner.humSettlingNm();
        float high = idleHigh + settling;
        float low = idleLow - settling;
        if (conditioner.conditionedHigh() < high && conditioner.conditionedLow() > low) {
            // x is the block the stage's conditioner just wrote: nothing in it starts a rundown
            return length;
        }
        while (i < length && x[i] < high && x[i] > low) {
            i++;
        }
        if (i < length) {
            state = State.ACTIVE;
            startSample = sampleBase + i;
            lastAboveSample = startSample;
            startNs = firstNs + (long) (i * periodNs);
            lastAboveNs = startNs;
            shutoffNs = Long.MIN_VALUE;
            rundownFaults = faults & ~SignalFaults.DATA_GAP;
            // impulses are counted per block: those of the block the rundown starts in are its own
            rejectedAtStart = stage.rejectedBeforeBlock();
            blows = 0;
            narrowPulses = 0;
            blowsAfterShutoff = 0;
            firstBlowAtMin = 0;
            maxPeak = 0;
            tightenImpulse = 0;
            reverseStrikes = 0;
            reverseImpulse = 0;
            reversePeak = 0;
            detector.reset();
            shapes.reset();
            residual.reset();
            events.onRundownStart(startNs);
        }
        return i;
    }

    private int scanActive(float[] x, int from, int length, long firstNs) {
        float level = startAbove;
        float low = -startAbove;
        float sign = sense;
        long base = sampleBase;
        // block-relative indices: the rundown is cut at cutIdx and ends at the first sample below
        // the level once endAfter samples have passed since the last one above it
        long cutRel = startSample + maxSamples - base;
        int stop = (int) Math.min(length, Math.max(from, cutRel));
        long lastAboveRel = lastAboveSample - base;
        long endRel = lastAboveRel + endAfterSamples;
        int i = from;
        boolean ended = false;
        Conditioner conditioner = stage.conditioner();
        if (conditioner.conditionedHigh() < level && conditioner.conditionedLow() > low) {
            // x is the block the stage's conditioner just wrote and nothing in it reaches the level:
            // go straight to where the rundown ends (the loop then stops there at once), or past the end
            i = (int) Math.min(stop, Math.max(from, endRel));
        }
        for (; i < stop; i++) {
            float v = x[i];
            if (v >= level || v <= low) {
                lastAboveRel = i;
                endRel = i + endAfterSamples;
                if (sign * v >= shutoffNm && shutoffNs == Long.MIN_VALUE) {
                    shutoffNs = firstNs + (long) (i * periodNs);
                    events.onShutoff(shutoffNs);
                }
            } else if (i >= endRel) {
                ended = true;
                break;
            }
        }
        boolean cut = !ended && i == stop && stop < length || !ended && base + i >= startSample + maxSamples;
        // the shapes first: a blow's lobe has closed by the time the detector reports the blow
        shapes.process(x, from, i - from, firstNs + (long) (from * periodNs));
        detector.process(x, from, i - from, firstNs + (long) (from * periodNs));
        if (lastAboveRel + base != lastAboveSample) {
            lastAboveSample = lastAboveRel + base;
            lastAboveNs = firstNs + (long) (lastAboveRel * periodNs);
        }
        if (ended || cut) {
            finishRundown(cut);
            state = cut ? State.QUIET : State.IDLE;
            lastAboveSample = base + i;
        }
        return i;
    }

    private int scanQuiet(float[] x, int i, int length) {
        float level = startAbove;
        float low = -startAbove;
        long base = sampleBase;
        for (; i < length; i++) {
            if (x[i] >= level || x[i] <= low) {
                lastAboveSample = base + i;
            } else if (base + i - lastAboveSample >= endAfterSamples) {
                state = State.IDLE;
                return i;
            }
        }
        return i;
    }

    @Override
    public void onPulse(long pulseStartNs, double signedPeakNm, long peakNs, double widthMs, double signedImpulseNms) {
        double peakNm = sense * signedPeakNm;
        double impulseNms = sense * signedImpulseNms;
        if (peakNm < 0) {
            reverseStrike(peakNm, peakNs, widthMs, impulseNms);
            return;
        }
        tightenImpulse += impulseNms;
        int n = blows;
        // a spike narrower than any strike that follows the previous pulse sooner than any tool
        // strikes (the dead time is half the shortest interval between blows) is noise; three such
        // spikes in one rundown raise NOISE
        boolean crowded = n > 0 && (pulseStartNs - lastPulseStartNs) * 1e-6 < 1.5 * program.blows().deadTimeMs();
        lastPulseStartNs = pulseStartNs;
        if (widthMs < MIN_STRIKE_MS && crowded) {
            narrowPulses++;
            if (narrowPulses >= 3 && (rundownFaults & SignalFaults.NOISE) == 0) {
                rundownFaults |= SignalFaults.NOISE;
                events.onFault(SignalFaults.NOISE, pulseStartNs);
            }
        }
        if (n < MAX_STORED_BLOWS) {
            peaks[n] = peakNm;
            peakTimes[n] = peakNs;
            widths[n] = widthMs;
            impulses[n] = impulseNms;
        }
        lastThree[n % 3] = peakNm;
        if (peakNm > maxPeak) {
            maxPeak = peakNm;
        }
        if (firstBlowAtMin == 0 && peakNm >= program.torque().minNm()) {
            firstBlowAtMin = n + 1;
        }
        if (shutoffNs != Long.MIN_VALUE && pulseStartNs > shutoffNs) {
            blowsAfterShutoff++;
        }
        residual.onBlow(shapes, shapes.find(pulseStartNs));
        blows = n + 1;
        events.onBlow(n, peakNm, peakNs);
    }

    /** A strike against the tightening sense; one narrower than any strike is interference and ignored. */
    private void reverseStrike(double peakNm, long peakNs, double widthMs, double impulseNms) {
        if (widthMs < minReverseWidthMs) {
            return;
        }
        int n = reverseStrikes;
        if (n < MAX_STORED_BLOWS) {
            reversePeaks[n] = peakNm;
            reverseTimes[n] = peakNs;
            reverseWidths[n] = widthMs;
            reverseImpulses[n] = impulseNms;
        }
        if (peakNm < reversePeak) {
            reversePeak = peakNm;
        }
        reverseImpulse -= impulseNms;
        reverseStrikes = n + 1;
    }

    private void finishRundown(boolean cut) {
        finishRundown(cut, false);
    }

    private void finishRundown(boolean cut, boolean traceEnded) {
        shapes.flush();
        detector.flush();
        if (reverseStrikes > 0 && reverseImpulse > tightenImpulse
                && (blows == 0 || reverseStrikes >= MIN_REVERSE_STRIKES_AFTER_BLOWS)) {
            finishLoosening(cut, traceEnded);
            return;
        }
        ResidualEstimate estimate = residual.estimate(rundownFaults, program.residualCalibration());
        double finalNm = program.finalTorque() == FinalTorque.RESIDUAL_ESTIMATE
                ? (estimate.present() ? estimate.torqueNm() : 0.0)
                : Evaluator.finalTorque(program.finalTorque(), blows, maxPeak, lastThree);
        double durationMs = (lastAboveNs - startNs) * 1e-6;
        List<Reason> reasons = Evaluator.reasons(program, blows, finalNm, cut, firstBlowAtMin, rundownFaults,
                estimate.present());
        if (traceEnded) {
            reasons = new java.util.ArrayList<>(reasons);
            reasons.add(Reason.TRACE_ENDED);
            reasons = List.copyOf(reasons);
        }
        int stored = Math.min(blows, MAX_STORED_BLOWS);
        JointResult result = new JointResult(program, startNs, lastAboveNs, blows,
                Arrays.copyOf(peaks, stored), Arrays.copyOf(peakTimes, stored),
                Arrays.copyOf(widths, stored), Arrays.copyOf(impulses, stored),
                finalNm, durationMs, shutoffNs, blowsAfterShutoff, rundownFaults,
                reasons.isEmpty() ? Verdict.GO : Verdict.NO_GO, reasons, Direction.TIGHTEN, rejectedSinceStart(),
                estimate);
        events.onRundown(result);
    }

    /**
     * A loosening: the reverse strikes are its blows (negative peaks), its final torque the strongest of
     * them (negative); NO-GO {@code LOOSENED}, with {@code TIME_LONG} and {@code SENSOR_FAULT} as for a
     * tightening. The program's windows do not apply.
     */
    private void finishLoosening(boolean cut, boolean traceEnded) {
        double durationMs = (lastAboveNs - startNs) * 1e-6;
        List<Reason> reasons = new java.util.ArrayList<>(3);
        reasons.add(Reason.LOOSENED);
        if (cut) {
            reasons.add(Reason.TIME_LONG);
        }
        if (rundownFaults != 0) {
            reasons.add(Reason.SENSOR_FAULT);
        }
        if (traceEnded) {
            reasons.add(Reason.TRACE_ENDED);
        }
        int stored = Math.min(reverseStrikes, MAX_STORED_BLOWS);
        JointResult result = new JointResult(program, startNs, lastAboveNs, reverseStrikes,
                Arrays.copyOf(reversePeaks, stored), Arrays.copyOf(reverseTimes, stored),
                Arrays.copyOf(reverseWidths, stored), Arrays.copyOf(reverseImpulses, stored),
                reversePeak, durationMs, shutoffNs, 0, rundownFaults, Verdict.NO_GO, List.copyOf(reasons),
                Direction.LOOSEN, rejectedSinceStart(), null);
        events.onRundown(result);
    }

    /** Electrical impulses the input stage replaced since the block the rundown started in. */
    private int rejectedSinceStart() {
        return (int) Math.min(Integer.MAX_VALUE, stage.conditioner().rejectedImpulses() - rejectedAtStart);
    }

    /**
     * The end of a trace: a rundown still under way is judged NO-GO with {@link Reason#TRACE_ENDED}
     * (added to whatever else its figures give), since its end and perhaps its last blows are not in
     * the trace.
     */
    public void finish() {
        if (state == State.ACTIVE) {
            finishRundown(false, true);
        }
        state = State.IDLE;
    }

    /**
     * The state carried into the next block while no rundown is under way, or null during a
     * rundown and the quiet spell after a cut one. Between rundowns the blow detector and the
     * rundown figures hold nothing that the next rundown reads before it sets it, so two monitors
     * of the same program and rate with equal idle states judge the samples that follow alike
     * (the split replay relies on it).
     */
    public IdleState idleState() {
        return state == State.IDLE ? new IdleState(stage.conditioner().state(), stage.reportedFaults()) : null;
    }

    /** See {@link #idleState()}. */
    public record IdleState(Conditioner.State conditioner, int reportedFaults) {
    }

    /** True while a rundown is under way. */
    public boolean inRundown() {
        return state == State.ACTIVE;
    }

    /** Blows so far in the current rundown. */
    public int blowsSoFar() {
        return blows;
    }

    public JointProgram program() {
        return program;
    }

    public Conditioner conditioner() {
        return stage.conditioner();
    }

    /** The input stage this monitor is fed by (its own, or the transducer's shared one). */
    public InputStage inputStage() {
        return stage;
    }
}
