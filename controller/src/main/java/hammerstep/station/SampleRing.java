package hammerstep.station;

import java.util.concurrent.atomic.AtomicLong;

/**
 * A single-producer, single-consumer ring of preallocated sample blocks: the hand-over from the
 * acquisition thread to the station thread. Nothing is allocated after construction and neither
 * side ever waits: a full ring drops the new block and counts it.
 *
 * <p>Writer side (one acquisition thread): either {@link #claim()}, fill the returned array from
 * index 0, then {@link #commit(int, long)}; or {@link #offer}, which copies. Reader side (the
 * station thread): {@link #poll}, which lends each block's array to the handler for the call.
 *
 * <p>Losses reach the reader in order: the writer counts every block it drops and every loss it
 * reports ({@link #lost()}, e.g. missed conversions), and stamps each block it commits with that
 * count; the reader calls {@link SampleBlockHandler#onGap()} before the first block whose stamp
 * differs from the one before. So the consumer learns of a gap at the block that follows it, on its
 * own thread, without comparing counters.
 */
public final class SampleRing implements TorqueInput {

    private final double rateHz;
    private final int blockLength;
    private final int mask;
    private final float[][] blocks;
    private final int[] lengths;
    private final long[] firstNs;
    private final long[] lossStamps;
    private final AtomicLong head = new AtomicLong(); // next block to read; written by the reader
    private final AtomicLong tail = new AtomicLong(); // next block to write; written by the writer
    private final AtomicLong dropped = new AtomicLong();
    private long cachedHead; // writer's view of head
    private long losses; // writer only: blocks dropped and losses reported so far
    private long lossesSeen; // reader only: the stamp of the last block handed out

    /**
     * @param capacity number of blocks, a power of two
     */
    public SampleRing(double rateHz, int blockLength, int capacity) {
        if (!(rateHz > 0)) {
            throw new IllegalArgumentException("rateHz must be positive");
        }
        if (blockLength < 1) {
            throw new IllegalArgumentException("blockLength must be at least 1");
        }
        if (capacity < 2 || Integer.bitCount(capacity) != 1) {
            throw new IllegalArgumentException("capacity must be a power of two of at least 2: " + capacity);
        }
        this.rateHz = rateHz;
        this.blockLength = blockLength;
        this.mask = capacity - 1;
        this.blocks = new float[capacity][blockLength];
        this.lengths = new int[capacity];
        this.firstNs = new long[capacity];
        this.lossStamps = new long[capacity];
    }

    @Override
    public double rateHz() {
        return rateHz;
    }

    @Override
    public int maxBlockLength() {
        return blockLength;
    }

    public int capacity() {
        return mask + 1;
    }

    /**
     * Writer: the array to fill with the next block, or null when the ring is full (the block is then
     * counted as dropped). Call {@link #commit} before claiming again.
     */
    public float[] claim() {
        long t = tail.get();
        if (t - cachedHead > mask) {
            cachedHead = head.get();
            if (t - cachedHead > mask) {
                dropped.incrementAndGet();
                losses++;
                return null;
            }
        }
        return blocks[(int) t & mask];
    }

    /** Writer: publishes the claimed block with its first {@code length} samples. */
    public void commit(int length, long firstSampleNs) {
        if (length < 0 || length > blockLength) {
            throw new IllegalArgumentException("block length " + length + " outside 0.." + blockLength);
        }
        long t = tail.get();
        int slot = (int) t & mask;
        lengths[slot] = length;
        firstNs[slot] = firstSampleNs;
        lossStamps[slot] = losses;
        tail.lazySet(t + 1);
    }

    /**
     * Writer: samples were lost other than by a full ring (e.g. conversions the ADC made and nobody
     * read); the next block committed carries the gap to the reader.
     */
    public void lost() {
        losses++;
    }

    /** Writer: copies a block in; false when the ring was full and the block was dropped. */
    public boolean offer(float[] samples, int offset, int length, long firstSampleNs) {
        if (length > blockLength) {
            throw new IllegalArgumentException("block of " + length + " exceeds " + blockLength);
        }
        float[] slot = claim();
        if (slot == null) {
            return false;
        }
        System.arraycopy(samples, offset, slot, 0, length);
        commit(length, firstSampleNs);
        return true;
    }

    @Override
    public int poll(SampleBlockHandler handler, int maxBlocks) {
        long h = head.get();
        long available = tail.get() - h;
        int n = (int) Math.min(available, maxBlocks);
        for (int k = 0; k < n; k++) {
            int slot = (int) (h + k) & mask;
            long stamp = lossStamps[slot];
            if (stamp != lossesSeen) {
                lossesSeen = stamp;
                handler.onGap();
            }
            handler.onBlock(blocks[slot], 0, lengths[slot], firstNs[slot]);
            head.lazySet(h + k + 1);
        }
        return n;
    }

    /** Blocks waiting for the reader. */
    public int waiting() {
        return (int) (tail.get() - head.get());
    }

    @Override
    public long droppedBlocks() {
        return dropped.get();
    }
}
