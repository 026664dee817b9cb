package hammerstep.joint;

import hammerstep.signal.Conditioner;
import hammerstep.signal.Conditioning;
import hammerstep.signal.SignalFaults;

/**
 * The input stage of one transducer, ahead of the per-program {@link JointMonitor}s: it conditions
 * each block once (zero, filter, fault watch, in the transducer's one {@link Conditioner}), checks
 * that the blocks follow each other without a gap, and hands the conditioned samples with their
 * fault bits to whichever monitor is current. Zero, filter and fault memory therefore run on
 * unbroken across program and pass switches: a monitor chosen for the next pass judges against the
 * zero the transducer has now, not the one it had when that program last ran.
 *
 * <p>Gaps: a block whose {@code firstSampleNs} is not where the previous block ended (within half a
 * sample period, either way), or a block the source announced a loss before ({@link #gap()}: a
 * block dropped by the sample ring, conversions the ADC made and nobody read), follows a data gap.
 * While a rundown is under way, or when the rundown starts at the block's very first sample (its
 * start may be in the lost samples), the gap is the {@link SignalFaults#DATA_GAP} fault of that
 * rundown: it is judged {@code SENSOR_FAULT}, never GO. Outside a rundown a gap only counts
 * ({@link #gapsOutsideRundowns()}, shown in the station's status). Gap blocks in a row count as one
 * gap (missed conversions inside a block are announced for it and show in the next block's stamp).
 *
 * <p>The current monitor tells the stage whether a rundown is under way: auto-zero follows the
 * signal only while it is idle. Allocation-free per block. Single-threaded: the thread that feeds
 * the samples owns it.
 */
public final class InputStage {

    private final Conditioner conditioner;
    private final float[] scratch;
    private final double periodNs;
    private final long toleranceNs;
    /** How far the conditioned samples run behind the raw ones, ns (impulse rejection's look-ahead). */
    private final long delayNs;

    private boolean any;
    private long expectedNs;
    private boolean gapAnnounced;
    private boolean lastWasGap;
    private int reportedFaults;
    private long gapsOutside;
    private long gapsDuring;
    private long samplesLost;
    private long rejectedBeforeBlock;

    /**
     * @param maxBlockLength the longest block the stage will be given
     */
    public InputStage(Conditioning conditioning, double rateHz, int maxBlockLength) {
        if (maxBlockLength < 1) {
            throw new IllegalArgumentException("maxBlockLength must be at least 1");
        }
        this.conditioner = new Conditioner(conditioning, rateHz);
        this.scratch = new float[maxBlockLength];
        this.periodNs = 1e9 / rateHz;
        this.toleranceNs = (long) (0.5 * periodNs);
        this.delayNs = Math.round(conditioner.delaySamples() * periodNs);
    }

    /**
     * Conditions {@code raw[offset, offset+length)}, taken from {@code firstSampleNs} on, and hands it
     * to {@code monitor}.
     */
    public void onSamples(float[] raw, int offset, int length, long firstSampleNs, JointMonitor monitor) {
        if (length > scratch.length) {
            throw new IllegalArgumentException("block of " + length + " samples exceeds " + scratch.length);
        }
        boolean gap = gapAnnounced;
        gapAnnounced = false;
        if (any) {
            long off = firstSampleNs - expectedNs;
            if (off > toleranceNs || off < -toleranceNs) {
                gap = true;
                if (off > 0) {
                    samplesLost += Math.round(off / periodNs);
                }
            }
        }
        any = true;
        expectedNs = firstSampleNs + Math.round(length * periodNs);
        rejectedBeforeBlock = conditioner.rejectedImpulses();
        int faults = conditioner.process(raw, offset, length, scratch, monitor.idle());
        int rising = faults & ~reportedFaults;
        reportedFaults = faults;
        if (gap) {
            faults |= SignalFaults.DATA_GAP;
        }
        // the conditioned samples run the rejector's look-ahead behind: stamp them with their own times
        boolean taken = monitor.onConditioned(scratch, 0, length, firstSampleNs - delayNs, faults, rising);
        // a loss announced for a block also shows in the next block's stamp: one gap, counted once
        if (gap && !lastWasGap) {
            if (taken) {
                gapsDuring++;
            } else {
                gapsOutside++;
            }
        }
        lastWasGap = gap;
    }

    /**
     * The source lost samples before the next block (a block dropped by the sample ring, missed
     * conversions): that block follows a data gap even if its time stamp does not show it.
     */
    public void gap() {
        gapAnnounced = true;
    }

    /** Data gaps seen while no rundown was under way (counted, not a fault). */
    public long gapsOutsideRundowns() {
        return gapsOutside;
    }

    /** Data gaps that fell into a rundown (each made its rundown {@code SENSOR_FAULT}). */
    public long gapsDuringRundowns() {
        return gapsDuring;
    }

    /** Samples missing by the time stamps (gaps announced by the source without a time jump add none). */
    public long samplesLost() {
        return samplesLost;
    }

    /** The conditioner's count of rejected impulses before the block now being handed on. */
    long rejectedBeforeBlock() {
        return rejectedBeforeBlock;
    }

    /** The fault bits of the signal as they stand after the last block (0 when healthy). */
    public int faults() {
        return conditioner.faults();
    }

    /** The fault bits already reported as begun; a bit reported stays so until it clears. */
    int reportedFaults() {
        return reportedFaults;
    }

    /** Sample rate in Hz. */
    public double rateHz() {
        return conditioner.rateHz();
    }

    public Conditioner conditioner() {
        return conditioner;
    }
}
