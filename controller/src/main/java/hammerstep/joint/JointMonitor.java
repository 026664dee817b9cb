package hammerstep.joint;

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
 * <p>A rundown starts at the first sample at or above {@code rundown.start_above} and ends once
 * torque has stayed below it for {@code end_after_ms}; its duration runs to the last sample above.
 * A rundown reaching {@code max_ms} is cut there and judged {@code TIME_LONG}; a new rundown can then
 * start only after the signal has been quiet for {@code end_after_ms}.
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

    private enum State { IDLE, ACTIVE, QUIET }

    private final JointProgram program;
    private final Conditioner conditioner;
    private final PulseDetector detector;
    private final JointEvents events;
    private final float[] scratch;
    private final double periodNs;
    private final float startAbove;
    private final float shutoffNm;
    private final long endAfterSamples;
    private final long maxSamples;
    /** How far the conditioned samples run behind the input, ns (impulse rejection's look-ahead). */
    private final long delayNs;

    private State state = State.IDLE;
    private long sampleBase;
    private long startSample;
    private long lastAboveSample;
    private long startNs;
    private long lastAboveNs;
    private long shutoffNs;
    private int rundownFaults;
    private long rejectedAtStart;
    private int reportedFaults;

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

    /**
     * @param maxBlockLength the longest block that {@link #onSamples} will be given
     */
    public JointMonitor(JointProgram program, Conditioning conditioning, double rateHz, int maxBlockLength,
                        JointEvents events) {
        this.program = program;
        this.conditioner = new Conditioner(conditioning, rateHz);
        JointProgram.Blows b = program.blows();
        this.detector = new PulseDetector(b.countAboveNm(), b.releaseBelowNm(), b.deadTimeMs(), rateHz, this);
        this.events = events;
        this.scratch = new float[maxBlockLength];
        this.periodNs = 1e9 / rateHz;
        this.startAbove = (float) program.rundown().startAboveNm();
        this.shutoffNm = program.hasShutoff() ? (float) program.shutoffAtNm() : Float.POSITIVE_INFINITY;
        this.endAfterSamples = Math.max(1, (long) Math.ceil(program.rundown().endAfterMs() * 1e-3 * rateHz));
        this.maxSamples = Math.max(1, (long) Math.ceil(program.rundown().maxMs() * 1e-3 * rateHz));
        this.delayNs = Math.round(conditioner.delaySamples() * periodNs);
    }

    /**
     * Conditioning suited to a program where the transducer's range is unknown: auto-zero follows
     * blocks whose samples all stay within the start level of their mean; impulses rejected.
     */
    public static Conditioning replayConditioning(JointProgram program) {
        return Conditioning.forReplay(program.rundown().startAboveNm());
    }

    /** Processes {@code samples[offset, offset+length)}; the first was taken at {@code firstSampleNs}. */
    public void onSamples(float[] samples, int offset, int length, long firstSampleNs) {
        if (length > scratch.length) {
            throw new IllegalArgumentException("block of " + length + " samples exceeds " + scratch.length);
        }
        long rejectedBefore = conditioner.rejectedImpulses();
        int faults = conditioner.process(samples, offset, length, scratch, state == State.IDLE);
        // the conditioned samples run the rejector's look-ahead behind: stamp them with their own times
        firstSampleNs -= delayNs;
        int rising = faults & ~reportedFaults;
        reportedFaults = faults;
        if (rising != 0) {
            events.onFault(rising, firstSampleNs);
        }
        if (state != State.IDLE) {
            rundownFaults |= faults;
        }
        float[] x = scratch;
        int i = 0;
        while (i < length) {
            switch (state) {
                case IDLE:
                    i = scanIdle(x, i, length, firstSampleNs, faults, rejectedBefore);
                    break;
                case ACTIVE:
                    i = scanActive(x, i, length, firstSampleNs);
                    break;
                default:
                    i = scanQuiet(x, i, length);
                    break;
            }
        }
        sampleBase += length;
    }

    private int scanIdle(float[] x, int i, int length, long firstNs, int faults, long rejectedBefore) {
        float level = startAbove;
        while (i < length && x[i] < level) {
            i++;
        }
        if (i < length) {
            state = State.ACTIVE;
            startSample = sampleBase + i;
            lastAboveSample = startSample;
            startNs = firstNs + (long) (i * periodNs);
            lastAboveNs = startNs;
            shutoffNs = Long.MIN_VALUE;
            rundownFaults = faults;
            // impulses are counted per block: those of the block the rundown starts in are its own
            rejectedAtStart = rejectedBefore;
            blows = 0;
            narrowPulses = 0;
            blowsAfterShutoff = 0;
            firstBlowAtMin = 0;
            maxPeak = 0;
            detector.reset();
            events.onRundownStart(startNs);
        }
        return i;
    }

    private int scanActive(float[] x, int from, int length, long firstNs) {
        float level = startAbove;
        long base = sampleBase;
        // block-relative indices: the rundown is cut at cutIdx and ends at the first sample below
        // the level once endAfter samples have passed since the last one above it
        long cutRel = startSample + maxSamples - base;
        int stop = (int) Math.min(length, Math.max(from, cutRel));
        long lastAboveRel = lastAboveSample - base;
        long endRel = lastAboveRel + endAfterSamples;
        int i = from;
        boolean ended = false;
        for (; i < stop; i++) {
            float v = x[i];
            if (v >= level) {
                lastAboveRel = i;
                endRel = i + endAfterSamples;
                if (v >= shutoffNm && shutoffNs == Long.MIN_VALUE) {
                    shutoffNs = firstNs + (long) (i * periodNs);
                    events.onShutoff(shutoffNs);
                }
            } else if (i >= endRel) {
                ended = true;
                break;
            }
        }
        boolean cut = !ended && i == stop && stop < length || !ended && base + i >= startSample + maxSamples;
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
        long base = sampleBase;
        for (; i < length; i++) {
            if (x[i] >= level) {
                lastAboveSample = base + i;
            } else if (base + i - lastAboveSample >= endAfterSamples) {
                state = State.IDLE;
                return i;
            }
        }
        return i;
    }

    @Override
    public void onPulse(long pulseStartNs, double peakNm, long peakNs, double widthMs, double impulseNms) {
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
        blows = n + 1;
        events.onBlow(n, peakNm, peakNs);
    }

    private void finishRundown(boolean cut) {
        detector.flush();
        double finalNm = Evaluator.finalTorque(program.finalTorque(), blows, maxPeak, lastThree);
        double durationMs = (lastAboveNs - startNs) * 1e-6;
        List<Reason> reasons = Evaluator.reasons(program, blows, finalNm, cut, firstBlowAtMin, rundownFaults);
        int stored = Math.min(blows, MAX_STORED_BLOWS);
        JointResult result = new JointResult(program, startNs, lastAboveNs, blows,
                Arrays.copyOf(peaks, stored), Arrays.copyOf(peakTimes, stored),
                Arrays.copyOf(widths, stored), Arrays.copyOf(impulses, stored),
                finalNm, durationMs, shutoffNs, blowsAfterShutoff, rundownFaults,
                reasons.isEmpty() ? Verdict.GO : Verdict.NO_GO, reasons,
                (int) Math.min(Integer.MAX_VALUE, conditioner.rejectedImpulses() - rejectedAtStart));
        events.onRundown(result);
    }

    /** Ends and judges a rundown still under way (end of a trace, or the station abandoning a joint). */
    public void finish() {
        if (state == State.ACTIVE) {
            finishRundown(false);
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
        return state == State.IDLE ? new IdleState(conditioner.state(), reportedFaults) : null;
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
        return conditioner;
    }
}
