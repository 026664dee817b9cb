package hammerstep.results.journal;

import hammerstep.results.MessageKind;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import java.util.zip.CRC32C;

/**
 * One segment file {@code seg-NNNNNNNNNN.hsj} of the journal: appending sealed records, reading a
 * payload back, and at opening the scan that hands every intact record to {@link Records}, skips
 * damage and cuts a torn tail. Knows the record layout of {@link JournalFormat}, nothing of what
 * the records mean. Not thread-safe: {@link FileOutbox} serialises all use.
 */
final class SegmentFile {

    /** What a scan finds, record by record, in file order. */
    interface Records {
        /** A START record: the counters as they stood when the segment was begun (one seq per kind). */
        void start(long nextPosition, long[] nextSeq);

        /** A RESULT record whose payload is {@code payloadLength} bytes at offset {@code payloadAt} of {@code segment}. */
        void result(SegmentFile segment, long position, MessageKind kind, long seq, String id, int payloadAt,
                    int payloadLength);

        /** A DELIVERED record. */
        void delivered(long position);

        /** A GONE record: seqs {@code firstSeq} to {@code lastSeq} of {@code kind} were found missing (and reported). */
        void gone(MessageKind kind, long firstSeq, long lastSeq, boolean reported);
    }

    final long number;
    final Path path;
    private final FileChannel channel;
    /** Bytes in the file. */
    long size;
    /** RESULT records in this segment not yet marked delivered (kept by the outbox). */
    int pending;
    /** The highest seq of each kind among this segment's RESULT records, 0 for none (kept by the outbox). */
    long[] lastSeq;

    private SegmentFile(long number, Path path, FileChannel channel, long size) {
        this.number = number;
        this.path = path;
        this.channel = channel;
        this.size = size;
        this.lastSeq = new long[MessageKind.values().length];
    }

    /** The segment numbers in {@code dir}, oldest first; files that only look like segments are left alone. */
    static List<Long> numbersIn(Path dir) throws IOException {
        List<Long> numbers = new ArrayList<>();
        try (DirectoryStream<Path> files = Files.newDirectoryStream(dir, "seg-*.hsj")) {
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
        return numbers;
    }

    static SegmentFile openExisting(Path dir, long number) throws IOException {
        Path path = path(dir, number);
        FileChannel ch = FileChannel.open(path, StandardOpenOption.READ, StandardOpenOption.WRITE);
        return new SegmentFile(number, path, ch, ch.size());
    }

    /** Creates the file, empty; fails when it exists. */
    static SegmentFile create(Path dir, long number) throws IOException {
        Path path = path(dir, number);
        FileChannel ch = FileChannel.open(path, StandardOpenOption.CREATE_NEW, StandardOpenOption.READ,
                StandardOpenOption.WRITE);
        return new SegmentFile(number, path, ch, 0);
    }

    private static Path path(Path dir, long number) {
        return dir.resolve(name(number));
    }

    /** The file name of segment {@code number}. */
    static String name(long number) {
        return String.format("seg-%010d.hsj", number);
    }

    /**
     * Reads the whole file and hands each intact record to {@code records}. Damage is skipped to the
     * next intact record; a torn tail is cut off the file when this is the {@code newest} segment
     * (only the newest can have been written when power went), else left and noted. Each repair is
     * one line in {@code notes}. Returns {records read, torn bytes cut}.
     */
    long[] scan(boolean newest, List<String> notes, CRC32C crc, int kinds, Records records) throws IOException {
        if (size > Integer.MAX_VALUE - 16) {
            throw new IOException(path + " is too large to be a journal segment");
        }
        int end = (int) size;
        ByteBuffer buf = ByteBuffer.allocate(end);
        while (buf.hasRemaining() && channel.read(buf, buf.position()) >= 0) {
            // read the whole file
        }
        long count = 0;
        int at = 0;
        while (at < end) {
            int length = JournalFormat.validAt(buf, at, end, crc);
            if (length < 0) {
                int next = JournalFormat.nextValid(buf, at + 1, end, crc);
                if (next < 0) {
                    break;
                }
                notes.add(path.getFileName() + ": skipped " + (next - at) + " damaged bytes at offset " + at);
                at = next;
                continue;
            }
            dispatch(buf, at + JournalFormat.FRAME, length, kinds, records);
            count++;
            at += JournalFormat.FRAME + length;
        }
        long torn = 0;
        if (at < end) {
            if (newest) {
                torn = end - at;
                notes.add(path.getFileName() + ": cut a torn tail of " + torn + " bytes at offset " + at);
                channel.truncate(at);
                channel.force(true);
                size = at;
            } else {
                notes.add(path.getFileName() + ": " + (end - at) + " damaged bytes at the end, offset " + at);
            }
        }
        return new long[] {count, torn};
    }

    private void dispatch(ByteBuffer buf, int body, int length, int kinds, Records records) {
        byte type = buf.get(body);
        if (type == JournalFormat.START && length >= 17 + 8 * kinds) {
            long[] nextSeq = new long[kinds];
            for (int k = 0; k < kinds; k++) {
                nextSeq[k] = buf.getLong(body + 17 + 8 * k);
            }
            records.start(buf.getLong(body + 9), nextSeq);
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
            records.result(this, position, kind, seq, new String(id, StandardCharsets.UTF_8), payloadAt,
                    body + length - payloadAt);
        } else if (type == JournalFormat.DELIVERED && length >= JournalFormat.DELIVERED_BODY) {
            records.delivered(buf.getLong(body + 1));
        } else if (type == JournalFormat.GONE && length >= JournalFormat.GONE_BODY) {
            MessageKind kind = MessageKind.ofCode(buf.get(body + 1));
            boolean reported = buf.get(body + 2) != 0;
            long first = buf.getLong(body + 3);
            long last = buf.getLong(body + 11);
            if (kind != null && first >= 1 && last >= first) {
                records.gone(kind, first, last, reported);
            }
        }
    }

    /**
     * Writes a sealed record at the end of the file, forced to the device when {@code force}; on
     * failure cuts any partial write and throws. Returns the bytes written.
     */
    int append(ByteBuffer rec, boolean force) throws IOException {
        long at = size;
        int length = rec.remaining();
        try {
            long p = at;
            while (rec.hasRemaining()) {
                p += channel.write(rec, p);
            }
            if (force) {
                channel.force(false);
            }
        } catch (IOException e) {
            try {
                channel.truncate(at);
            } catch (IOException ignored) {
                // the torn record is cut at the next start
            }
            throw e;
        }
        size += length;
        return length;
    }

    /** Fills {@code dst} from offset {@code at} of the file. */
    void read(long at, ByteBuffer dst) throws IOException {
        while (dst.hasRemaining()) {
            if (channel.read(dst, at + dst.position()) < 0) {
                throw new IOException("unexpected end of " + path);
            }
        }
    }

    /** Forces what was written to the device (data, not necessarily metadata). */
    void force() throws IOException {
        channel.force(false);
    }

    /** Closes the file and deletes it. */
    void delete() throws IOException {
        channel.close();
        Files.deleteIfExists(path);
    }

    void closeQuietly() {
        closeQuietly(channel);
    }

    /** Makes a new file's name in {@code dir} durable; a file system that cannot sync a folder is let be. */
    static void syncDirectory(Path dir) {
        try (FileChannel ch = FileChannel.open(dir, StandardOpenOption.READ)) {
            ch.force(true);
        } catch (IOException ignored) {
            // some file systems cannot sync a directory; the segment's own data is forced
        }
    }

    static void closeQuietly(FileChannel ch) {
        if (ch != null) {
            try {
                ch.close();
            } catch (IOException ignored) {
                // closing
            }
        }
    }
}
