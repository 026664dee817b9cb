package hammerstep.hardware;

import hammerstep.signal.Calibration;
import hammerstep.station.SampleRing;
import hammerstep.station.StationClock;
import org.agrona.concurrent.Agent;

/**
 * The acquisition duty cycle: polls the ADC's data-ready, reads each conversion, converts counts to
 * N·m with the transducer's {@link Calibration} and zero, and fills the station's {@link SampleRing}
 * block by block, each block stamped with the clock time of its first sample.
 *
 * <p>Overruns are counted, never waited for: a conversion that came and went unread (the time since
 * the previous one exceeds 1.5 sample periods) counts as missed and is reported to the ring
 * ({@link SampleRing#lost()}), so the station sees a data gap at the block that holds or follows
 * it; a block that finds the ring full is discarded whole and counted by the ring.
 *
 * <p>Time stamps follow the conversions, not the moment the thread happened to read them: each
 * conversion is one period after the one before (plus the periods missed), pulled a sixteenth of
 * the way toward the clock at every read so that the stamps follow the clock without taking up
 * its jitter. A read late by less than a missed conversion thus never looks like a gap in
 * {@code firstSampleNs}, and a missed conversion always does. Runs on its own thread (an Agrona {@code AgentRunner}
 * with a busy-spin idle strategy on the Pi); in tests {@link #doWork()} is called by hand with a
 * fake clock. Allocation-free after construction.
 */
public final class Acquisition implements Agent {

    private final AdcDriver adc;
    private final DataReady dataReady;
    private final StationClock clock;
    private final SampleRing ring;
    private final int blockSamples;
    private final float nmPerCount;
    private final long periodNs;
    private final long lateNs;
    private final float[] scratch;
    private volatile int zeroCounts;
    private float[] block;
    private boolean discarding;
    private int fill;
    private long blockFirstNs;
    private long lastNs;
    private long stampNs;
    private boolean any;
    private volatile long samples;
    private volatile long missedSamples;
    private volatile int lastCounts;

    public Acquisition(AdcDriver adc, DataReady dataReady, StationClock clock, Calibration calibration, int zeroCounts,
                       SampleRing ring) {
        if (Math.abs(ring.rateHz() - adc.rateHz()) > 1e-9 * adc.rateHz()) {
            throw new IllegalArgumentException("ring rate " + ring.rateHz() + " Hz differs from the ADC's " + adc.rateHz());
        }
        this.adc = adc;
        this.dataReady = dataReady;
        this.clock = clock;
        this.ring = ring;
        this.blockSamples = ring.maxBlockLength();
        this.nmPerCount = (float) calibration.nmPerCount();
        this.zeroCounts = zeroCounts;
        this.periodNs = Math.round(1e9 / adc.rateHz());
        this.lateNs = periodNs + periodNs / 2;
        this.scratch = new float[blockSamples];
    }

    @Override
    public void onStart() {
        adc.start();
    }

    @Override
    public int doWork() {
        long now = clock.nanoTime();
        if (!dataReady.ready(now)) {
            return 0;
        }
        int counts = adc.read();
        dataReady.taken(now);
        if (any) {
            long gap = now - lastNs;
            long missed = 0;
            if (gap > lateNs) {
                missed = (gap + periodNs / 2) / periodNs - 1;
                missedSamples += missed;
                ring.lost();
            }
            stampNs += (1 + missed) * periodNs;
            stampNs += (now - stampNs) >> 4;
        } else {
            stampNs = now;
        }
        any = true;
        lastNs = now;
        lastCounts = counts;
        samples++;
        if (fill == 0) {
            blockFirstNs = stampNs;
            block = ring.claim();
            discarding = block == null;
            if (discarding) {
                block = scratch;
            }
        }
        block[fill++] = (counts - zeroCounts) * nmPerCount;
        if (fill == blockSamples) {
            if (!discarding) {
                ring.commit(fill, blockFirstNs);
            }
            fill = 0;
            block = null;
        }
        return 1;
    }

    @Override
    public void onClose() {
        adc.stop();
    }

    @Override
    public String roleName() {
        return "acquisition";
    }

    /** Sets the zero the counts are taken from (e.g. after {@code hammerstep zero}). */
    public void zeroCounts(int counts) {
        this.zeroCounts = counts;
    }

    /** Conversions read since start. */
    public long samples() {
        return samples;
    }

    /** Conversions the part made that were never read (data-ready missed). */
    public long missedSamples() {
        return missedSamples;
    }

    /** Blocks discarded because the station had not emptied the ring. */
    public long droppedBlocks() {
        return ring.droppedBlocks();
    }

    /** The raw counts of the newest conversion (for status displays). */
    public int lastCounts() {
        return lastCounts;
    }
}
