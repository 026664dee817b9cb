package hammerstep.results.journal;

import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.ResultSink.Storage;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StorageSettings;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.zip.CRC32C;

/**
 * The outbox as an append-only journal of segment files {@code seg-NNNNNNNNNN.hsj} in one folder
 * (layout in {@link JournalFormat}). An append is written and forced to the device
 * ({@link FileChannel#force(boolean)}) before it returns; delivered marks are written without a
 * force of their own (a mark lost to a power cut only means that record is sent again). Opening
 * scans every segment: a torn record at the end of the newest segment is cut off, damage elsewhere
 * is skipped to the next intact record, and both are reported in {@link #recovery()}. A segment is
 * deleted only when it and every older segment are fully delivered and the delivered segments
 * exceed the retention limit, or storage runs LOW. A lock file keeps a second process out. This
 * class keeps the books (counters, the index of undelivered results, room); {@link SegmentFile} does the files.
 */
public final class FileOutbox implements Outbox {

    /** Free bytes on the journal's volume; replaceable so tests can run out of room. */
    @FunctionalInterface
    public interface FreeSpace {
        long bytes() throws IOException;
    }

    private record Loc(SegmentFile segment, long payloadAt, int length, MessageKind kind, long seq, String id) { }

    private final StorageSettings settings;
    private final FreeSpace free;
    private final FileChannel lockChannel;
    private final FileLock lock;
    private final List<SegmentFile> segments = new ArrayList<>();
    private final TreeMap<Long, Loc> pending = new TreeMap<>();
    private final TreeMap<Long, Loc> jointsAfterLastPart = new TreeMap<>();
    private List<Entry> unfinishedPartJoints = List.of();
    private final long[] nextSeq = new long[MessageKind.values().length];
    private final CRC32C crc = new CRC32C();
    private ByteBuffer out = ByteBuffer.allocate(64 * 1024);
    private long nextPosition = 1;
    private long totalBytes;
    private SegmentFile active;
    private Storage storage = Storage.OK;
    private Recovery recovery;
    private boolean closed;

    private FileOutbox(StorageSettings settings, FreeSpace free, FileChannel lockChannel, FileLock lock) {
        this.settings = settings;
        this.free = free;
        this.lockChannel = lockChannel;
        this.lock = lock;
        java.util.Arrays.fill(nextSeq, 1L);
    }

    /** Opens (or creates) the journal in {@code settings.dir()}, measuring free space on its volume. */
    public static FileOutbox open(StorageSettings settings) throws ResultStoreException {
        Path dir = settings.dir();
        return open(settings, () -> Files.getFileStore(dir).getUsableSpace());
    }

    public static FileOutbox open(StorageSettings settings, FreeSpace free) throws ResultStoreException {
        Path dir = settings.dir();
        FileChannel lockChannel = null;
        try {
            Files.createDirectories(dir);
            lockChannel = FileChannel.open(dir.resolve(".lock"), StandardOpenOption.CREATE, StandardOpenOption.WRITE);
            FileLock lock = lockChannel.tryLock();
            if (lock == null) {
                throw new ResultStoreException("outbox " + dir + " is in use by another process");
            }
            FileOutbox box = new FileOutbox(settings, free, lockChannel, lock);
            box.recover();
            return box;
        } catch (IOException | RuntimeException e) {
            SegmentFile.closeQuietly(lockChannel);
            throw new ResultStoreException("cannot open outbox " + dir + ": " + e.getMessage(), e);
        } catch (ResultStoreException e) {
            SegmentFile.closeQuietly(lockChannel);
            throw e;
        }
    }

    // ---- recovery --------------------------------------------------------------------------------

    private void recover() throws IOException, ResultStoreException {
        List<Long> numbers = SegmentFile.numbersIn(settings.dir());
        List<String> notes = new ArrayList<>();
        Index index = new Index();
        long records = 0;
        long torn = 0;
        for (int i = 0; i < numbers.size(); i++) {
            boolean newest = i == numbers.size() - 1;
            SegmentFile seg = SegmentFile.openExisting(settings.dir(), numbers.get(i));
            segments.add(seg);
            long[] counts = seg.scan(newest, notes, crc, nextSeq.length, index);
            records += counts[0];
            torn += counts[1];
        }
        for (SegmentFile s : segments) {
            totalBytes += s.size;
        }
        if (segments.isEmpty()) {
            startSegment(1);
        } else {
            active = segments.get(segments.size() - 1);
            if (active.size == 0) {
                writeStart(active);
            }
        }
        refreshStorage();
        recovery = new Recovery(numbers.size(), records, pending.size(), torn, notes);
        List<Entry> unfinished = new ArrayList<>(jointsAfterLastPart.size());
        for (Map.Entry<Long, Loc> e : jointsAfterLastPart.entrySet()) {
            unfinished.add(read(e.getKey(), e.getValue()));
        }
        unfinishedPartJoints = List.copyOf(unfinished);
        jointsAfterLastPart.clear();
    }

    /** Rebuilds the counters and the index of undelivered results from the records a scan finds. */
    private final class Index implements SegmentFile.Records {
        @Override
        public void start(long position, long[] seqs) {
            nextPosition = Math.max(nextPosition, position);
            for (int k = 0; k < nextSeq.length; k++) {
                nextSeq[k] = Math.max(nextSeq[k], seqs[k]);
            }
        }

        @Override
        public void result(SegmentFile seg, long position, MessageKind kind, long seq, String id, int payloadAt,
                           int payloadLength) {
            Loc loc = new Loc(seg, payloadAt, payloadLength, kind, seq, id);
            pending.put(position, loc);
            if (kind == MessageKind.PART) {
                jointsAfterLastPart.clear();
            } else if (kind == MessageKind.JOINT) {
                jointsAfterLastPart.put(position, loc);
            }
            seg.pending++;
            nextPosition = Math.max(nextPosition, position + 1);
            nextSeq[kind.ordinal()] = Math.max(nextSeq[kind.ordinal()], seq + 1);
        }

        @Override
        public void delivered(long position) {
            Loc loc = pending.remove(position);
            if (loc != null) {
                loc.segment.pending--;
            }
        }
    }

    // ---- writing ---------------------------------------------------------------------------------

    @Override
    public synchronized long nextSeq(MessageKind kind) {
        return nextSeq[kind.ordinal()];
    }

    @Override
    public synchronized long append(MessageKind kind, long seq, String id, byte[] payload) throws ResultStoreException {
        checkOpen();
        long expected = nextSeq[kind.ordinal()];
        if (seq != expected) {
            throw new ResultStoreException(kind.topic() + " seq " + seq + " out of order: expected " + expected);
        }
        byte[] idBytes = id.getBytes(StandardCharsets.UTF_8);
        int bodyLength = JournalFormat.RESULT_FIXED + idBytes.length + payload.length;
        if (idBytes.length > 0xFFFF || bodyLength > JournalFormat.MAX_BODY) {
            throw new ResultStoreException("a result of " + payload.length + " bytes is too large to store");
        }
        long position = nextPosition;
        try {
            rotateIfFull(JournalFormat.FRAME + bodyLength);
            ByteBuffer rec = body(JournalFormat.FRAME + bodyLength);
            rec.put(JournalFormat.RESULT).putLong(position).put((byte) kind.ordinal()).putLong(seq)
                    .putShort((short) idBytes.length).put(idBytes).put(payload);
            JournalFormat.seal(rec, crc);
            long at = active.size;
            write(rec, true);
            pending.put(position, new Loc(active, at + JournalFormat.FRAME + JournalFormat.RESULT_FIXED + idBytes.length,
                    payload.length, kind, seq, id));
            active.pending++;
        } catch (IOException e) {
            throw new ResultStoreException("cannot store " + kind.topic() + " " + seq + ": " + e.getMessage(), e);
        }
        nextPosition = position + 1;
        nextSeq[kind.ordinal()] = seq + 1;
        refreshStorage();
        return position;
    }

    @Override
    public synchronized void markDelivered(long position) throws ResultStoreException {
        checkOpen();
        Loc loc = pending.get(position);
        if (loc == null) {
            return;
        }
        try {
            rotateIfFull(JournalFormat.FRAME + JournalFormat.DELIVERED_BODY);
            ByteBuffer rec = body(JournalFormat.FRAME + JournalFormat.DELIVERED_BODY);
            rec.put(JournalFormat.DELIVERED).putLong(position);
            JournalFormat.seal(rec, crc);
            write(rec, false);
            pending.remove(position);
            loc.segment.pending--;
            if (loc.segment.pending == 0 && loc.segment != active) {
                refreshStorage();
            }
        } catch (IOException e) {
            throw new ResultStoreException("cannot mark " + loc.kind.topic() + " " + loc.seq + " delivered: "
                    + e.getMessage(), e);
        }
    }

    private ByteBuffer body(int size) {
        if (out.capacity() < size) {
            out = ByteBuffer.allocate(Math.max(size, out.capacity() * 2));
        }
        out.clear().position(JournalFormat.FRAME);
        return out;
    }

    /** Writes a sealed record at the end of the active segment; on failure cuts any partial write. */
    private void write(ByteBuffer rec, boolean force) throws IOException {
        totalBytes += active.append(rec, force);
    }

    private void rotateIfFull(int recordLength) throws IOException {
        if (active.size + recordLength > settings.segmentBytes() && active.size > startLength()) {
            active.force();
            startSegment(active.number + 1);
            applyRetention();
        }
    }

    private int startLength() {
        return JournalFormat.FRAME + 17 + 8 * nextSeq.length;
    }

    private void startSegment(long number) throws IOException {
        SegmentFile seg = SegmentFile.create(settings.dir(), number);
        segments.add(seg);
        active = seg;
        writeStart(seg);
        SegmentFile.syncDirectory(settings.dir());
    }

    /** The first record of a segment: the counters, so they survive the deletion of older segments. */
    private void writeStart(SegmentFile seg) throws IOException {
        ByteBuffer rec = body(startLength());
        rec.put(JournalFormat.START).putLong(seg.number).putLong(nextPosition);
        for (long s : nextSeq) {
            rec.putLong(s);
        }
        JournalFormat.seal(rec, crc);
        write(rec, true);
    }

    // ---- reading ---------------------------------------------------------------------------------

    /**
     * Picks the records from the index under the lock, then reads their payloads without it: a
     * positional read neither waits for the writer's forced append nor holds it up. (A record is
     * read only while undelivered; its segment is deleted only once delivered, by the writer.)
     */
    @Override
    public List<Entry> pending(long afterPosition, int max) throws ResultStoreException {
        long[] positions;
        Loc[] locs;
        int n = 0;
        synchronized (this) {
            checkOpen();
            int size = Math.min(max, pending.size());
            positions = new long[size];
            locs = new Loc[size];
            for (Map.Entry<Long, Loc> e : pending.tailMap(afterPosition, false).entrySet()) {
                if (n == size) {
                    break;
                }
                positions[n] = e.getKey();
                locs[n++] = e.getValue();
            }
        }
        List<Entry> list = new ArrayList<>(n);
        for (int k = 0; k < n; k++) {
            list.add(read(positions[k], locs[k]));
        }
        return list;
    }

    private static Entry read(long position, Loc loc) throws ResultStoreException {
        byte[] payload = new byte[loc.length];
        try {
            loc.segment.read(loc.payloadAt, ByteBuffer.wrap(payload));
        } catch (IOException ex) {
            throw new ResultStoreException("cannot read " + loc.kind.topic() + " " + loc.seq + ": "
                    + ex.getMessage(), ex);
        }
        return new Entry(position, loc.kind, loc.seq, loc.id, payload);
    }

    @Override
    public synchronized long backlog() {
        return pending.size();
    }

    @Override
    public synchronized Storage storage() {
        return storage;
    }

    @Override
    public synchronized Recovery recovery() {
        return recovery;
    }

    @Override
    public synchronized List<Entry> unfinishedPartJoints() {
        return unfinishedPartJoints;
    }

    /** Bytes the journal's segment files take now. */
    public synchronized long journalBytes() {
        return totalBytes;
    }

    /** Number of segment files now. */
    public synchronized int segmentCount() {
        return segments.size();
    }

    // ---- room ------------------------------------------------------------------------------------

    private void refreshStorage() {
        storage = judge();
        if (storage != Storage.OK || deliveredBytes() > settings.retainBytes()) {
            if (applyRetention()) {
                storage = judge();
            }
        }
    }

    private Storage judge() {
        long freeBytes;
        try {
            freeBytes = free.bytes();
        } catch (IOException e) {
            freeBytes = 0;
        }
        if (freeBytes < settings.minFreeBytes() || totalBytes >= settings.maxBytes()) {
            return Storage.FULL;
        }
        if (freeBytes < settings.lowFreeBytes() || totalBytes >= settings.lowBytes()) {
            return Storage.LOW;
        }
        return Storage.OK;
    }

    private long deliveredBytes() {
        long sum = 0;
        for (SegmentFile s : segments) {
            if (s != active && s.pending == 0) {
                sum += s.size;
            }
        }
        return sum;
    }

    /** Deletes fully delivered segments from the oldest on; returns true when any went. */
    private boolean applyRetention() {
        boolean pressure = storage != Storage.OK;
        long delivered = deliveredBytes();
        boolean deleted = false;
        while (segments.size() > 1) {
            SegmentFile oldest = segments.get(0);
            if (oldest == active || oldest.pending != 0 || (!pressure && delivered <= settings.retainBytes())) {
                break;
            }
            try {
                oldest.delete();
            } catch (IOException e) {
                break;
            }
            segments.remove(0);
            delivered -= oldest.size;
            totalBytes -= oldest.size;
            deleted = true;
        }
        return deleted;
    }

    // ---- lifecycle -------------------------------------------------------------------------------

    @Override
    public synchronized void close() {
        if (closed) {
            return;
        }
        closed = true;
        try {
            active.force();
        } catch (IOException ignored) {
            // marks not forced are sent again: at least once
        }
        for (SegmentFile s : segments) {
            s.closeQuietly();
        }
        try {
            lock.release();
        } catch (IOException ignored) {
            // the channel's close below releases it too
        }
        SegmentFile.closeQuietly(lockChannel);
    }

    private void checkOpen() throws ResultStoreException {
        if (closed) {
            throw new ResultStoreException("outbox " + settings.dir() + " is closed");
        }
    }
}
