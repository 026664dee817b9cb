package hammerstep.config;

import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.Reader;
import java.nio.channels.FileChannel;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.nio.file.attribute.BasicFileAttributes;

/**
 * The one way every command opens a file it was given to read (trace, program, pattern, station
 * file, results, audit file): only a regular file is opened, so a FIFO, a device or a directory is
 * refused at once instead of blocking the command; a file larger than its kind may be is refused
 * before it is read; text is read in lines of bounded length, so one endless line cannot exhaust the
 * heap. Refusals are {@link Refused} with a short reason, without the path; {@link #describe}
 * gives the one line a command prints.
 */
public final class InputFiles {

    /** A configuration file (program, pattern, station file, preset): a few KB in practice. */
    public static final long MAX_CONFIG_BYTES = 1L << 20;
    /** A line of a trace CSV or audit CSV: rows are tens of characters, metadata lines a few hundred. */
    public static final int MAX_TEXT_LINE_CHARS = 4096;
    /** A line of a results file (one JSON message): a joint message with 1024 peaks is about 40 KB. */
    public static final int MAX_MESSAGE_LINE_CHARS = 1 << 20;
    /** Longest piece of an input quoted back in an error line. */
    public static final int QUOTE_CHARS = 40;
    /** Longest error line a command prints; longer ones are cut with an ellipsis. */
    public static final int MAX_ERROR_CHARS = 300;

    private InputFiles() {
    }

    /** A file refused before or while it was read; the message is the reason, without the path. */
    public static final class Refused extends IOException {
        public Refused(String reason) {
            super(reason, null);
        }
    }

    /**
     * Checks that {@code path} is a regular file of at most {@code maxBytes} (0: no bound) and returns
     * its size, without opening it.
     */
    public static long check(Path path, long maxBytes) throws IOException {
        BasicFileAttributes a = Files.readAttributes(path, BasicFileAttributes.class);
        if (a.isDirectory()) {
            throw new Refused("is a directory, not a file");
        }
        if (!a.isRegularFile()) {
            throw new Refused("is not a regular file (a FIFO, socket or device): refused, it could block or never end");
        }
        if (maxBytes > 0 && a.size() > maxBytes) {
            throw new Refused("is " + size(a.size()) + ", more than the " + size(maxBytes) + " this kind of file may be");
        }
        return a.size();
    }

    /** Opens a regular file for reading (see {@link #check}). */
    public static FileChannel open(Path path, long maxBytes) throws IOException {
        check(path, maxBytes);
        return FileChannel.open(path, StandardOpenOption.READ);
    }

    /** The bytes of a regular file of at most {@code maxBytes}. */
    public static byte[] readAll(Path path, long maxBytes) throws IOException {
        check(path, maxBytes);
        try (InputStream in = Files.newInputStream(path)) {
            byte[] b = in.readNBytes((int) Math.min(Integer.MAX_VALUE - 8, maxBytes + 1));
            if (b.length > maxBytes) {
                throw new Refused("grew past " + size(maxBytes) + " while it was read");
            }
            return b;
        }
    }

    /** A regular file's lines as strict UTF-8, none longer than {@code maxLineChars}. */
    public static Lines lines(Path path, int maxLineChars) throws IOException {
        check(path, 0);
        InputStream in = Files.newInputStream(path);
        Reader r = new InputStreamReader(in, StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT));
        return new Lines(r, maxLineChars);
    }

    /**
     * Lines of text ending in {@code \n} or {@code \r\n}, read without holding more than one line.
     * A line longer than the bound is {@link Refused} (naming its number), so a 50 MB "number" costs
     * a few KB. {@link #lastLineEnded()} tells whether the file's last line had its line break: a
     * file cut short ends inside a line.
     */
    public static final class Lines implements AutoCloseable {
        private final Reader in;
        private final int maxLineChars;
        private final char[] buf = new char[8192];
        private int pos;
        private int end;
        private final StringBuilder line = new StringBuilder(64);
        private int lineNo;
        private boolean lastEnded = true;

        private Lines(Reader in, int maxLineChars) {
            this.in = in;
            this.maxLineChars = maxLineChars;
        }

        /** The next line without its line break, or null at the end. */
        public String next() throws IOException {
            line.setLength(0);
            boolean any = false;
            while (true) {
                if (pos == end) {
                    end = in.read(buf, 0, buf.length);
                    pos = 0;
                    if (end <= 0) {
                        end = 0;
                        if (!any) {
                            return null;
                        }
                        lineNo++;
                        lastEnded = false;
                        return line.toString();
                    }
                }
                any = true;
                int start = pos;
                while (pos < end && buf[pos] != '\n') {
                    pos++;
                }
                if (line.length() + (pos - start) > maxLineChars) {
                    throw new Refused("line " + (lineNo + 1) + " is longer than " + maxLineChars + " characters");
                }
                line.append(buf, start, pos - start);
                if (pos < end) {
                    pos++;
                    lineNo++;
                    int n = line.length();
                    if (n > 0 && line.charAt(n - 1) == '\r') {
                        line.setLength(n - 1);
                    }
                    return line.toString();
                }
            }
        }

        /** The number of the line {@link #next()} returned last (1-based). */
        public int lineNo() {
            return lineNo;
        }

        /** False when the file ended inside its last line (no line break after it). */
        public boolean lastLineEnded() {
            return lastEnded;
        }

        @Override
        public void close() throws IOException {
            in.close();
        }
    }

    /** The one line a command prints for a file that could not be read: {@code path: reason}. */
    public static String describe(Path path, IOException e) {
        if (e instanceof NoSuchFileException) {
            return path + ": no such file";
        }
        if (e instanceof AccessDeniedException) {
            return path + ": cannot read: permission denied";
        }
        if (e instanceof CharacterCodingException) {
            return path + ": not a text file (invalid UTF-8)";
        }
        if (e instanceof Refused) {
            return path + ": " + e.getMessage();
        }
        return path + ": cannot read: " + e.getMessage();
    }

    /** {@code text} quoted back in an error: at most {@link #QUOTE_CHARS} characters, then "...". */
    public static String quote(String text) {
        return text.length() <= QUOTE_CHARS ? text : text.substring(0, QUOTE_CHARS) + "...";
    }

    /** An error line cut to {@link #MAX_ERROR_CHARS} with an ellipsis, and kept on one line. */
    public static String errorLine(String message) {
        String s = message.replace('\n', ' ').replace('\r', ' ');
        return s.length() <= MAX_ERROR_CHARS ? s : s.substring(0, MAX_ERROR_CHARS - 3) + "...";
    }

    private static String size(long bytes) {
        if (bytes >= 1L << 20) {
            return String.format(java.util.Locale.ROOT, "%.1f MB", bytes / (double) (1L << 20));
        }
        if (bytes >= 1L << 10) {
            return String.format(java.util.Locale.ROOT, "%.1f KB", bytes / (double) (1L << 10));
        }
        return bytes + " bytes";
    }
}
