package hammerstep.results.journal;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.zip.CRC32C;

/**
 * The journal's high-water file {@code highwater.hsw}: the next position and the next seq of each
 * kind ever to be given, and the first seq of each kind that retention still keeps. It is written
 * after each result's record, before the append returns, and forced before any record it covers is
 * handed out for sending (and at rotation, retention, opening and close), so every seq that ever
 * left the station is on the device; it lets the journal see that its tail, a whole segment, or
 * all of it is gone, and never give a seq twice.
 *
 * <p>Two slots, 4096 bytes apart (separate pages of the medium), written in turn; each slot is
 * {@code magic u32 | generation u64 | next position u64 | kinds u8 | next seq u64 per kind |
 * floor seq u64 per kind | CRC32C u32} over everything before the CRC. A write that power cuts
 * short leaves the other slot whole, one result behind at most; that result was never confirmed,
 * and its record, if whole, is in the journal.
 * Reading takes the whole slot with the higher generation. One forced overwrite of a block the file
 * already has: no rename, no directory sync, no metadata to commit on each result. Not thread-safe:
 * {@link FileOutbox} serialises all use.
 */
final class HighWater {

    static final String NAME = "highwater.hsw";
    static final int MAGIC = 0x48535731;
    private static final int SLOT_BYTES = 4096;

    /** What a slot holds; {@code nextSeq} and {@code floorSeq} are indexed by kind. */
    record State(long generation, long nextPosition, long[] nextSeq, long[] floorSeq) { }

    private final Path path;
    private final FileChannel channel;
    private final int kinds;
    private final ByteBuffer buf;
    private final CRC32C crc = new CRC32C();
    private long generation;
    private boolean created;

    private HighWater(Path path, FileChannel channel, int kinds) {
        this.path = path;
        this.channel = channel;
        this.kinds = kinds;
        this.buf = ByteBuffer.allocate(slotLength(kinds));
    }

    private static int slotLength(int kinds) {
        return 4 + 8 + 8 + 1 + 16 * kinds + 4;
    }

    /**
     * Opens the file in {@code dir}, creating it (both slots zero, forced, the folder synced) when it
     * is missing; {@link #created()} tells which.
     */
    static HighWater open(Path dir, int kinds) throws IOException {
        Path path = dir.resolve(NAME);
        boolean exists = Files.exists(path);
        FileChannel ch = FileChannel.open(path, StandardOpenOption.CREATE, StandardOpenOption.READ,
                StandardOpenOption.WRITE);
        HighWater hw = new HighWater(path, ch, kinds);
        if (!exists || ch.size() == 0) {
            ByteBuffer zeros = ByteBuffer.allocate(2 * SLOT_BYTES);
            long p = 0;
            while (zeros.hasRemaining()) {
                p += ch.write(zeros, p);
            }
            ch.force(true);
            SegmentFile.syncDirectory(dir);
        }
        hw.created = !exists;
        return hw;
    }

    /** True when {@link #open} found no file and made one. */
    boolean created() {
        return created;
    }

    /** The newer whole slot, or null when neither slot is whole (never written, or both damaged). */
    State read() throws IOException {
        State best = null;
        for (int slot = 0; slot < 2; slot++) {
            State s = readSlot(slot);
            if (s != null && (best == null || s.generation > best.generation)) {
                best = s;
            }
        }
        if (best != null) {
            generation = best.generation;
        }
        return best;
    }

    private State readSlot(int slot) throws IOException {
        buf.clear();
        long at = (long) slot * SLOT_BYTES;
        while (buf.hasRemaining()) {
            if (channel.read(buf, at + buf.position()) < 0) {
                return null;
            }
        }
        int end = buf.capacity() - 4;
        if (buf.getInt(0) != MAGIC || buf.get(20) != kinds) {
            return null;
        }
        crc.reset();
        crc.update(buf.duplicate().position(0).limit(end));
        if ((int) crc.getValue() != buf.getInt(end)) {
            return null;
        }
        long[] next = new long[kinds];
        long[] floor = new long[kinds];
        for (int k = 0; k < kinds; k++) {
            next[k] = buf.getLong(21 + 8 * k);
            floor[k] = buf.getLong(21 + 8 * kinds + 8 * k);
        }
        return new State(buf.getLong(4), buf.getLong(12), next, floor);
    }

    /**
     * Writes the next generation into the older slot, and forces it when {@code force}. The seq of
     * kind {@code kind} is taken as {@code nextSeqOfKind} instead of {@code nextSeq[kind]} (pass -1
     * for none), so an append can announce its seq without changing the outbox's counters first.
     */
    void write(long nextPosition, long[] nextSeq, int kind, long nextSeqOfKind, long[] floorSeq, boolean force)
            throws IOException {
        long gen = generation + 1;
        buf.clear();
        buf.putInt(MAGIC).putLong(gen).putLong(nextPosition).put((byte) kinds);
        for (int k = 0; k < kinds; k++) {
            buf.putLong(k == kind ? nextSeqOfKind : nextSeq[k]);
        }
        for (int k = 0; k < kinds; k++) {
            buf.putLong(floorSeq[k]);
        }
        crc.reset();
        crc.update(buf.duplicate().flip());
        buf.putInt((int) crc.getValue());
        buf.flip();
        long at = (gen & 1) * SLOT_BYTES;
        while (buf.hasRemaining()) {
            at += channel.write(buf, at);
        }
        if (force) {
            channel.force(false);
        }
        generation = gen;
    }

    /** Forces what was written to the device. */
    void force() throws IOException {
        channel.force(false);
    }

    Path path() {
        return path;
    }

    void close() {
        SegmentFile.closeQuietly(channel);
    }
}
