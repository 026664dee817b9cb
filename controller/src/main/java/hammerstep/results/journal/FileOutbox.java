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
    /** Most joint and part results each kept for {@link #storedAtOpen}: the web view's ring of joints. */
    static final int READ_BACK = 10_000;
    /** The last joint and part results the journal held at opening (position, place), oldest first; handed over once. */
    private java.util.ArrayDeque<Map.Entry<Long, Loc>> readBackJoints = new java.util.ArrayDeque<>();
    private java.util.ArrayDeque<Map.Entry<Long, Loc>> readBackParts = new java.util.ArrayDeque<>();
    private final long[] nextSeq = new long[MessageKind.values().length];
    private final long[] floorSeq = new long[MessageKind.values().length];
    private final List<Loss> losses = new ArrayList<>();
    private final List<Loss> unreported = new ArrayList<>();
    private HighWater highWater;
    /** The counters as they stood when the store opened: what this run assigned lies at or above them. */
    private final long[] runStartSeq = new long[MessageKind.values().length];
    private long runStartPosition;
    private long highWaterFailures;
    /** The high-water file was written since it was last forced. */
    private boolean highWaterDirty;
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
        java.util.Arrays.fill(floorSeq, 1L);
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
        List<String> notes = new ArrayList<>();
        highWater = HighWater.open(settings.dir(), nextSeq.length);
        HighWater.State state = highWater.read();
        List<Long> numbers = SegmentFile.numbersIn(settings.dir());
        if (state == null && !(highWater.created() && numbers.isEmpty())) {
            notes.add(highWater.created()
                    ? HighWater.NAME + " was missing: seq continues above the highest found in the journal"
                    : HighWater.NAME + " was damaged: seq continues above the highest found in the journal");
        }
        Index index = new Index();
        long records = 0;
        long torn = 0;
        for (int i = 0; i < numbers.size(); i++) {
            boolean newest = i == numbers.size() - 1;
            if (i > 0 && numbers.get(i) != numbers.get(i - 1) + 1) {
                notes.add("segments " + SegmentFile.name(numbers.get(i - 1) + 1) + " to "
                        + SegmentFile.name(numbers.get(i) - 1) + " are missing");
            }
            SegmentFile seg = SegmentFile.openExisting(settings.dir(), numbers.get(i));
            if (seg.size == 0) {
                notes.add(SegmentFile.name(numbers.get(i)) + " is empty");
            }
            segments.add(seg);
            index.oldest = i == 0;
            long[] counts = seg.scan(newest, notes, crc, nextSeq.length, index);
            records += counts[0];
            torn += counts[1];
        }
        for (SegmentFile s : segments) {
            totalBytes += s.size;
        }
        List<Loss> found = reconcile(state, index);
        if (segments.isEmpty()) {
            startSegment(1);
        } else {
            active = segments.get(segments.size() - 1);
            if (active.size == 0) {
                writeStart(active);
            }
        }
        highWater.write(nextPosition, nextSeq, -1, -1, floorSeq, true);
        refreshStorage();
        losses.addAll(found);
        unreported.addAll(found);
        System.arraycopy(nextSeq, 0, runStartSeq, 0, nextSeq.length);
        runStartPosition = nextPosition;
        recovery = new Recovery(numbers.size(), records, pending.size(), torn, notes, found);
        List<Entry> unfinished = new ArrayList<>(jointsAfterLastPart.size());
        for (Map.Entry<Long, Loc> e : jointsAfterLastPart.entrySet()) {
            unfinished.add(read(e.getKey(), e.getValue()));
        }
        unfinishedPartJoints = List.copyOf(unfinished);
        jointsAfterLastPart.clear();
    }

    /**
     * Sets the counters to the highest of the journal and the high-water file, the floor (the first
     * seq retention still keeps) from the file or, without it, from the oldest segment; returns
     * the ranges between the floor and the high water that no record and no earlier report covers.
     */
    private List<Loss> reconcile(HighWater.State state, Index index) {
        if (state != null) {
            nextPosition = Math.max(nextPosition, state.nextPosition());
        }
        List<Loss> found = new ArrayList<>();
        for (MessageKind kind : MessageKind.values()) {
            int k = kind.ordinal();
            if (state != null) {
                nextSeq[k] = Math.max(nextSeq[k], state.nextSeq()[k]);
                floorSeq[k] = state.floorSeq()[k];
            } else if (index.oldestStart != null) {
                floorSeq[k] = index.oldestStart[k];
            } else {
                floorSeq[k] = Math.min(index.lowest[k], nextSeq[k]);
            }
            floorSeq[k] = Math.max(1, floorSeq[k]);
            long[][] covered = index.covered(k);
            long from = floorSeq[k];
            long top = nextSeq[k] - 1;
            for (long[] range : covered) {
                if (range[0] > from) {
                    found.add(new Loss(kind, from, Math.min(range[0] - 1, top)));
                }
                from = Math.max(from, range[1] + 1);
                if (from > top) {
                    break;
                }
            }
            if (from <= top) {
                found.add(new Loss(kind, from, top));
            }
        }
        found.addAll(index.foundEarlier);
        found.sort((a, b) -> a.kind() != b.kind() ? a.kind().compareTo(b.kind()) : Long.compare(a.firstSeq(), b.firstSeq()));
        return found;
    }

    /** Rebuilds the counters and the index of undelivered results from the records a scan finds. */
    private final class Index implements SegmentFile.Records {
        boolean oldest;
        /** The START counters of the oldest segment, when it has one. */
        long[] oldestStart;
        final long[] lowest = new long[nextSeq.length];
        private final long[][] seen = new long[nextSeq.length][];
        private final int[] seenCount = new int[nextSeq.length];
        private final List<long[]> gone = new ArrayList<>();
        /** Losses a cross check found in an earlier run and that were not reported yet. */
        final List<Loss> foundEarlier = new ArrayList<>();

        Index() {
            java.util.Arrays.fill(lowest, Long.MAX_VALUE);
            for (int k = 0; k < seen.length; k++) {
                seen[k] = new long[64];
            }
        }

        @Override
        public void start(long position, long[] seqs) {
            if (oldest && oldestStart == null) {
                oldestStart = seqs.clone();
            }
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
            java.util.ArrayDeque<Map.Entry<Long, Loc>> back = kind == MessageKind.JOINT ? readBackJoints
                    : kind == MessageKind.PART ? readBackParts : null;
            if (back != null) {
                back.addLast(Map.entry(position, loc));
                if (back.size() > READ_BACK) {
                    back.removeFirst();
                }
            }
            if (kind == MessageKind.PART) {
                jointsAfterLastPart.clear();
            } else if (kind == MessageKind.JOINT) {
                jointsAfterLastPart.put(position, loc);
            }
            seg.pending++;
            int k = kind.ordinal();
            seg.lastSeq[k] = Math.max(seg.lastSeq[k], seq);
            nextPosition = Math.max(nextPosition, position + 1);
            nextSeq[k] = Math.max(nextSeq[k], seq + 1);
            lowest[k] = Math.min(lowest[k], seq);
            if (seenCount[k] == seen[k].length) {
                seen[k] = java.util.Arrays.copyOf(seen[k], seen[k].length * 2);
            }
            seen[k][seenCount[k]++] = seq;
        }

        @Override
        public void delivered(long position) {
            Loc loc = pending.remove(position);
            if (loc != null) {
                loc.segment.pending--;
            }
        }

        @Override
        public void gone(MessageKind kind, long firstSeq, long lastSeq, boolean reported) {
            gone.add(new long[] {kind.ordinal(), firstSeq, lastSeq});
            Loss loss = new Loss(kind, firstSeq, lastSeq);
            if (reported) {
                foundEarlier.remove(loss);
            } else if (!foundEarlier.contains(loss)) {
                foundEarlier.add(loss);
            }
            nextSeq[kind.ordinal()] = Math.max(nextSeq[kind.ordinal()], lastSeq + 1);
        }

        /** The seq ranges of kind {@code k} that a record or a report covers, sorted by their start. */
        long[][] covered(int k) {
            List<long[]> ranges = new ArrayList<>(seenCount[k] + gone.size());
            for (int i = 0; i < seenCount[k]; i++) {
                ranges.add(new long[] {seen[k][i], seen[k][i]});
            }
            for (long[] g : gone) {
                if (g[0] == k) {
                    ranges.add(new long[] {g[1], g[2]});
                }
            }
            ranges.sort((a, b) -> Long.compare(a[0], b[0]));
            return ranges.toArray(new long[0][]);
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
            writeResult(position, kind, seq, idBytes, id, payload);
        } catch (IOException e) {
            throw new ResultStoreException("cannot store " + kind.topic() + " " + seq + ": " + e.getMessage(), e);
        }
        try {
            // after the record, before the caller shows it: a record lost once confirmed is seen as lost,
            // one that power cut short before it was confirmed (never shown, never sent) is not
            // not forced here (one forced write per result is the journal's): forced before it is sent
            highWater.write(position + 1, nextSeq, kind.ordinal(), seq + 1, floorSeq, false);
            highWaterDirty = true;
        } catch (IOException e) {
            // the record is stored and must not be stored again under its seq: the next write catches up
            highWaterFailures++;
        }
        nextPosition = position + 1;
        nextSeq[kind.ordinal()] = seq + 1;
        refreshStorage();
        return position;
    }

    /** Appends one RESULT record, forced, and indexes it as pending. */
    private void writeResult(long position, MessageKind kind, long seq, byte[] idBytes, String id, byte[] payload)
            throws IOException {
        int bodyLength = JournalFormat.RESULT_FIXED + idBytes.length + payload.length;
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
        active.lastSeq[kind.ordinal()] = Math.max(active.lastSeq[kind.ordinal()], seq);
    }

    // ---- losses ----------------------------------------------------------------------------------

    @Override
    public synchronized List<Loss> losses() {
        return List.copyOf(losses);
    }

    @Override
    public synchronized List<Loss> unreportedLosses() {
        return unreported.isEmpty() ? List.of() : List.copyOf(unreported);
    }

    /** Writes a GONE record, forced, for each of {@code reported} still unreported. */
    @Override
    public synchronized void lossesReported(List<Loss> reported) throws ResultStoreException {
        checkOpen();
        for (Loss l : reported) {
            if (!unreported.contains(l)) {
                continue;
            }
            try {
                writeGone(l, true);
            } catch (IOException e) {
                throw new ResultStoreException("cannot record that the loss of " + l.range() + " was reported: "
                        + e.getMessage(), e);
            }
            unreported.remove(l);
        }
    }

    private void writeGone(Loss l, boolean reported) throws IOException {
        rotateIfFull(JournalFormat.FRAME + JournalFormat.GONE_BODY);
        ByteBuffer rec = body(JournalFormat.FRAME + JournalFormat.GONE_BODY);
        rec.put(JournalFormat.GONE).put((byte) l.kind().ordinal()).put((byte) (reported ? 1 : 0))
                .putLong(l.firstSeq()).putLong(l.lastSeq());
        JournalFormat.seal(rec, crc);
        write(rec, true);
        int k = l.kind().ordinal();
        active.lastSeq[k] = Math.max(active.lastSeq[k], l.lastSeq());
    }

    /**
     * Gives the kinds whose seqs {@code lastSeqElsewhere} (indexed by kind; 0 for unknown) says were
     * assigned before this store knew them new seqs above those: the records of this run still
     * pending are written again, in their order, under new positions (the raised kinds with new seqs
     * through {@code restamp}), and the old records are marked done. Any thread.
     */
    @Override
    public synchronized List<Loss> raiseSeqs(long[] lastSeqElsewhere, Restamp restamp) throws ResultStoreException {
        checkOpen();
        long[] delta = new long[nextSeq.length];
        List<Loss> found = Outbox.raisedRanges(lastSeqElsewhere, runStartSeq, delta);
        if (found.isEmpty()) {
            return List.of();
        }
        List<Map.Entry<Long, Loc>> again = new ArrayList<>(pending.tailMap(runStartPosition, true).entrySet());
        long[] newNext = nextSeq.clone();
        for (int k = 0; k < newNext.length; k++) {
            newNext[k] += delta[k];
        }
        try {
            highWater.write(nextPosition + again.size(), newNext, -1, -1, floorSeq, true);
            for (Loss l : found) {
                writeGone(l, false);
            }
            for (Map.Entry<Long, Loc> e : again) {
                Loc loc = e.getValue();
                int k = loc.kind.ordinal();
                byte[] payload = read(e.getKey(), loc).payload();
                long seq = loc.seq + delta[k];
                if (delta[k] != 0) {
                    payload = restamp.apply(payload, seq);
                }
                writeResult(nextPosition, loc.kind, seq, loc.id.getBytes(StandardCharsets.UTF_8), loc.id, payload);
                nextPosition++;
                markDelivered(e.getKey());
            }
            active.force();
        } catch (IOException e) {
            throw new ResultStoreException("cannot give the results of this run new seqs: " + e.getMessage(), e);
        }
        System.arraycopy(newNext, 0, nextSeq, 0, nextSeq.length);
        for (int k = 0; k < runStartSeq.length; k++) {
            runStartSeq[k] += delta[k];
        }
        losses.addAll(found);
        unreported.addAll(found);
        refreshStorage();
        return found;
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

    private void forceHighWater() throws ResultStoreException {
        if (highWaterDirty) {
            try {
                highWater.force();
                highWaterDirty = false;
            } catch (IOException e) {
                throw new ResultStoreException("cannot force " + HighWater.NAME + ": " + e.getMessage(), e);
            }
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
            if (highWaterDirty) {
                highWater.force();
                highWaterDirty = false;
            }
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
            forceHighWater(); // no record leaves the station before its seq is on the device as given
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

    /**
     * The joint or part results the journal held when it was opened, delivered or not (the last
     * {@value #READ_BACK} of each kind, oldest first), read once: the places are forgotten after
     * this call, so a second call returns none. A result whose segment retention deleted since is
     * left out. For the web view, which shows the results stored before a restart.
     */
    @Override
    public synchronized List<Entry> storedAtOpen(MessageKind kind) {
        java.util.ArrayDeque<Map.Entry<Long, Loc>> back = kind == MessageKind.JOINT ? readBackJoints
                : kind == MessageKind.PART ? readBackParts : null;
        if (back == null || back.isEmpty()) {
            return List.of();
        }
        List<Entry> out = new ArrayList<>(back.size());
        for (Map.Entry<Long, Loc> e : back) {
            try {
                out.add(read(e.getKey(), e.getValue()));
            } catch (ResultStoreException ex) {
                // its segment is gone (retention) or unreadable: not shown
            }
        }
        if (kind == MessageKind.JOINT) {
            readBackJoints = new java.util.ArrayDeque<>();
        } else {
            readBackParts = new java.util.ArrayDeque<>();
        }
        return out;
    }

    @Override
    public synchronized List<Entry> unfinishedPartJoints() {
        return unfinishedPartJoints;
    }

    /** Bytes the journal's segment files take now. */
    public synchronized long journalBytes() {
        return totalBytes;
    }

    /**
     * High-water writes that failed after their record was stored (the record stands; the file is
     * one result behind until the next append writes it).
     */
    public synchronized long highWaterFailures() {
        return highWaterFailures;
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
                retire(oldest);
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

    /** Raises the floor past the seqs of {@code seg} and makes that durable before the segment goes. */
    private void retire(SegmentFile seg) throws IOException {
        for (int k = 0; k < floorSeq.length; k++) {
            floorSeq[k] = Math.max(floorSeq[k], seg.lastSeq[k] + 1);
        }
        highWater.write(nextPosition, nextSeq, -1, -1, floorSeq, true);
        highWaterDirty = false;
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
            if (highWaterDirty) {
                highWater.force();
            }
        } catch (IOException ignored) {
            // marks not forced are sent again: at least once
        }
        for (SegmentFile s : segments) {
            s.closeQuietly();
        }
        if (highWater != null) {
            highWater.close();
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
