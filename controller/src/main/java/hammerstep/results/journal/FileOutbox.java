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
import java.nio.file.DirectoryStream;
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
 * exceed the retention limit, or storage runs LOW. A lock file keeps a second process out.
 */
public final class FileOutbox implements Outbox {

    /** Free bytes on the journal's volume; replaceable so tests can run out of room. */
    @FunctionalInterface
    public interface FreeSpace {
        long bytes() throws IOException;
    }

    private static final class Segment {
        final long number;
        final Path path;
        final FileChannel channel;
        long size;
        int pending;

        Segment(long number, Path path, FileChannel channel, long size) {
            this.number = number;
            this.path = path;
            this.channel = channel;
            this.size = size;
        }
    }

    private record Loc(Segment segment, long payloadAt, int length, MessageKind kind, long seq, String id) { }

    private final StorageSettings settings;
    private final FreeSpace free;
    private final FileChannel lockChannel;
    private final FileLock lock;
    private final List<Segment> segments = new ArrayList<>();
    private final TreeMap<Long, Loc> pending = new TreeMap<>();
    private final List<Entry> unfinishedPartJoints = new ArrayList<>();
    private final long[] nextSeq = new long[MessageKind.values().length];
    private final CRC32C crc = new CRC32C();
    private ByteBuffer out = ByteBuffer.allocate(64 * 1024);
    private long nextPosition = 1;
    private long totalBytes;
    private Segment active;
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
            closeQuietly(lockChannel);
            throw new ResultStoreException("cannot open outbox " + dir + ": " + e.getMessage(), e);
        } catch (ResultStoreException e) {
            closeQuietly(lockChannel);
            throw e;
        }
    }

    // ---- recovery --------------------------------------------------------------------------------

    private void recover() throws IOException {
        List<Long> numbers = new ArrayList<>();
        try (DirectoryStream<Path> files = Files.newDirectoryStream(settings.dir(), "seg-*.hsj")) {
            for (Path p : files) {
                String name = p.getFileName().toString();
                try {
                    numbers.add(Long.parseLong(name.substring(4, name.length() - 4)));
                } catch (NumberFormatException e) {
                    // not one of ours; leave it alone
                }
            }
        }
        numbers.sort(null);
        List<String> notes = new ArrayList<>();
        long records = 0;
        long torn = 0;
        for (int i = 0; i < numbers.size(); i++) {
            boolean newest = i == numbers.size() - 1;
            Path path = segmentPath(numbers.get(i));
            FileChannel ch = FileChannel.open(path, StandardOpenOption.READ, StandardOpenOption.WRITE);
            Segment seg = new Segment(numbers.get(i), path, ch, ch.size());
            segments.add(seg);
            long[] counts = scan(seg, newest, notes);
            records += counts[0];
            torn += counts[1];
        }
        for (Segment s : segments) {
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
    }

    /** Reads one segment into the index; returns {records, torn bytes cut}. */
    private long[] scan(Segment seg, boolean newest, List<String> notes) throws IOException {
        if (seg.size > Integer.MAX_VALUE - 16) {
            throw new IOException(seg.path + " is too large to be a journal segment");
        }
        int end = (int) seg.size;
        ByteBuffer buf = ByteBuffer.allocate(end);
        while (buf.hasRemaining() && seg.channel.read(buf, buf.position()) >= 0) {
            // read the whole file
        }
        long records = 0;
        int at = 0;
        while (at < end) {
            int length = JournalFormat.validAt(buf, at, end, crc);
            if (length < 0) {
                int next = JournalFormat.nextValid(buf, at + 1, end, crc);
                if (next < 0) {
                    break;
                }
                notes.add(seg.path.getFileName() + ": skipped " + (next - at) + " damaged bytes at offset " + at);
                at = next;
                continue;
            }
            apply(seg, buf, at + JournalFormat.FRAME, length);
            records++;
            at += JournalFormat.FRAME + length;
        }
        long torn = 0;
        if (at < end) {
            if (newest) {
                torn = end - at;
                notes.add(seg.path.getFileName() + ": cut a torn tail of " + torn + " bytes at offset " + at);
                seg.channel.truncate(at);
                seg.channel.force(true);
                seg.size = at;
            } else {
                notes.add(seg.path.getFileName() + ": " + (end - at) + " damaged bytes at the end, offset " + at);
            }
        }
        return new long[] {records, torn};
    }

    private void apply(Segment seg, ByteBuffer buf, int body, int length) {
        byte type = buf.get(body);
        if (type == JournalFormat.START && length >= 17 + 8 * nextSeq.length) {
            nextPosition = Math.max(nextPosition, buf.getLong(body + 9));
            for (int k = 0; k < nextSeq.length; k++) {
                nextSeq[k] = Math.max(nextSeq[k], buf.getLong(body + 17 + 8 * k));
            }
        } else if (type == JournalFormat.RESULT && length >= JournalFormat.RESULT_FIXED) {
            long position = buf.getLong(body + 1);
            MessageKind kind = MessageKind.ofCode(buf.get(body + 9));
            long seq = buf.getLong(body + 10);
            int idLength = Short.toUnsignedInt(buf.getShort(body + 18));
            int payloadAt = body + JournalFormat.RESULT_FIXED + idLength;
            if (kind == null || payloadAt > body + length) {
                return;
            }
            byte[] id = new byte[idLength];
            buf.get(body + JournalFormat.RESULT_FIXED, id);
            String idText = new String(id, StandardCharsets.UTF_8);
            pending.put(position, new Loc(seg, payloadAt, body + length - payloadAt, kind, seq, idText));
            if (kind == MessageKind.PART) {
                unfinishedPartJoints.clear();
            } else if (kind == MessageKind.JOINT) {
                byte[] payload = new byte[body + length - payloadAt];
                buf.get(payloadAt, payload);
                unfinishedPartJoints.add(new Entry(position, kind, seq, idText, payload));
            }
            seg.pending++;
            nextPosition = Math.max(nextPosition, position + 1);
            nextSeq[kind.ordinal()] = Math.max(nextSeq[kind.ordinal()], seq + 1);
        } else if (type == JournalFormat.DELIVERED && length >= JournalFormat.DELIVERED_BODY) {
            Loc loc = pending.remove(buf.getLong(body + 1));
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
        long at = active.size;
        int length = rec.remaining();
        try {
            long p = at;
            while (rec.hasRemaining()) {
                p += active.channel.write(rec, p);
            }
            if (force) {
                active.channel.force(false);
            }
        } catch (IOException e) {
            try {
                active.channel.truncate(at);
            } catch (IOException ignored) {
                // the torn record is cut at the next start
            }
            throw e;
        }
        active.size += length;
        totalBytes += length;
    }

    private void rotateIfFull(int recordLength) throws IOException {
        if (active.size + recordLength > settings.segmentBytes() && active.size > startLength()) {
            active.channel.force(false);
            startSegment(active.number + 1);
            applyRetention();
        }
    }

    private int startLength() {
        return JournalFormat.FRAME + 17 + 8 * nextSeq.length;
    }

    private void startSegment(long number) throws IOException {
        Path path = segmentPath(number);
        FileChannel ch = FileChannel.open(path, StandardOpenOption.CREATE_NEW, StandardOpenOption.READ,
                StandardOpenOption.WRITE);
        Segment seg = new Segment(number, path, ch, 0);
        segments.add(seg);
        active = seg;
        writeStart(seg);
        syncDirectory(settings.dir());
    }

    /** The first record of a segment: the counters, so they survive the deletion of older segments. */
    private void writeStart(Segment seg) throws IOException {
        ByteBuffer rec = body(startLength());
        rec.put(JournalFormat.START).putLong(seg.number).putLong(nextPosition);
        for (long s : nextSeq) {
            rec.putLong(s);
        }
        JournalFormat.seal(rec, crc);
        write(rec, true);
    }

    // ---- reading ---------------------------------------------------------------------------------

    @Override
    public synchronized List<Entry> pending(long afterPosition, int max) throws ResultStoreException {
        checkOpen();
        List<Entry> list = new ArrayList<>(Math.min(max, pending.size()));
        for (Map.Entry<Long, Loc> e : pending.tailMap(afterPosition, false).entrySet()) {
            if (list.size() == max) {
                break;
            }
            Loc loc = e.getValue();
            byte[] payload = new byte[loc.length];
            ByteBuffer dst = ByteBuffer.wrap(payload);
            try {
                while (dst.hasRemaining()) {
                    if (loc.segment.channel.read(dst, loc.payloadAt + dst.position()) < 0) {
                        throw new IOException("unexpected end of " + loc.segment.path);
                    }
                }
            } catch (IOException ex) {
                throw new ResultStoreException("cannot read " + loc.kind.topic() + " " + loc.seq + ": "
                        + ex.getMessage(), ex);
            }
            list.add(new Entry(e.getKey(), loc.kind, loc.seq, loc.id, payload));
        }
        return list;
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
        return List.copyOf(unfinishedPartJoints);
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
        for (Segment s : segments) {
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
            Segment oldest = segments.get(0);
            if (oldest == active || oldest.pending != 0 || (!pressure && delivered <= settings.retainBytes())) {
                break;
            }
            try {
                oldest.channel.close();
                Files.deleteIfExists(oldest.path);
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
            active.channel.force(false);
        } catch (IOException ignored) {
            // marks not forced are sent again: at least once
        }
        for (Segment s : segments) {
            closeQuietly(s.channel);
        }
        try {
            lock.release();
        } catch (IOException ignored) {
            // the channel's close below releases it too
        }
        closeQuietly(lockChannel);
    }

    private void checkOpen() throws ResultStoreException {
        if (closed) {
            throw new ResultStoreException("outbox " + settings.dir() + " is closed");
        }
    }

    private Path segmentPath(long number) {
        return settings.dir().resolve(String.format("seg-%010d.hsj", number));
    }

    private static void syncDirectory(Path dir) {
        try (FileChannel ch = FileChannel.open(dir, StandardOpenOption.READ)) {
            ch.force(true);
        } catch (IOException ignored) {
            // some file systems cannot sync a directory; the segment's own data is forced
        }
    }

    private static void closeQuietly(FileChannel ch) {
        if (ch != null) {
            try {
                ch.close();
            } catch (IOException ignored) {
                // closing
            }
        }
    }
}
