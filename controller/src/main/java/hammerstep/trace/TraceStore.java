package hammerstep.trace;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Deque;
import java.util.List;
import java.util.Map;

/**
 * A directory of stored joint traces ({@link StoredTrace}) with bounded retention: after each
 * save, the oldest traces are deleted until at most {@code maxCount} files and {@code maxBytes}
 * bytes remain (the trace just written is always kept). Files are named
 * {@code NNNNNNNNNN-<joint id>.hst} with a counter that continues across restarts, so name
 * order is age order. A trace is written to a temporary file and moved into place, so a crash
 * leaves no half-written trace under a final name; traces are not forced to disk (they are
 * evidence beside the results, not results).
 *
 * <p>Used from the station thread only, once per judged joint.
 */
public final class TraceStore {

    private final Path dir;
    private final int maxCount;
    private final long maxBytes;
    private final StoredTrace.Encoding encoding;
    private final Deque<Entry> kept = new ArrayDeque<>();
    private long bytes;
    private long counter;
    private ByteBuffer scratch;
    private float[] export;

    private record Entry(Path path, long size) { }

    public TraceStore(Path dir, int maxCount, long maxBytes, StoredTrace.Encoding encoding) throws IOException {
        if (maxCount < 1 || maxBytes < 1) {
            throw new IllegalArgumentException("trace retention needs at least one file and one byte");
        }
        this.dir = dir;
        this.maxCount = maxCount;
        this.maxBytes = maxBytes;
        this.encoding = encoding;
        Files.createDirectories(dir);
        List<Path> found = new ArrayList<>();
        try (DirectoryStream<Path> s = Files.newDirectoryStream(dir)) {
            for (Path p : s) {
                String name = p.getFileName().toString();
                if (name.endsWith(".tmp")) {
                    Files.deleteIfExists(p);
                } else if (name.endsWith(StoredTrace.EXTENSION) && counterOf(name) >= 0) {
                    found.add(p);
                }
            }
        }
        found.sort(null);
        for (Path p : found) {
            long size = Files.size(p);
            kept.addLast(new Entry(p, size));
            bytes += size;
            counter = Math.max(counter, counterOf(p.getFileName().toString()) + 1);
        }
        prune(null);
    }

    /**
     * Stores samples {@code [0, length)} of {@code samples} as one joint's trace and applies the
     * retention limits. Returns the file's path.
     */
    public Path save(String jointId, Map<String, String> metadata, float[] samples, int length, double rateHz,
                     long firstSampleNs) throws IOException {
        String name = String.format("%010d-%s%s", counter++, safe(jointId), StoredTrace.EXTENSION);
        Path target = dir.resolve(name);
        Path tmp = dir.resolve(name + ".tmp");
        try (OutputStream out = Files.newOutputStream(tmp)) {
            scratch = StoredTrace.write(out, encoding, rateHz, firstSampleNs, metadata, samples, 0, length, scratch);
        }
        try {
            Files.move(tmp, target, StandardCopyOption.ATOMIC_MOVE);
        } catch (AtomicMoveNotSupportedException e) {
            Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING);
        }
        long size = Files.size(target);
        kept.addLast(new Entry(target, size));
        bytes += size;
        prune(target);
        return target;
    }

    /** Cuts the span {@code [fromNs, toNs]} out of {@code recorder} and stores it as one joint's trace. */
    public Path save(String jointId, Map<String, String> metadata, TraceRecorder recorder, long fromNs, long toNs)
            throws IOException {
        if (export == null || export.length < recorder.capacity()) {
            export = new float[recorder.capacity()];
        }
        TraceRecorder.Span span = recorder.copy(fromNs, toNs, export);
        return save(jointId, metadata, export, span.samples(), recorder.rateHz(), span.firstSampleNs());
    }

    /**
     * Stores the recorder's samples {@code [fromIndex, toIndexExclusive)} (counted as
     * {@link TraceRecorder#written()} counts) as one joint's trace.
     */
    public Path saveIndices(String jointId, Map<String, String> metadata, TraceRecorder recorder, long fromIndex,
                            long toIndexExclusive) throws IOException {
        if (export == null || export.length < recorder.capacity()) {
            export = new float[recorder.capacity()];
        }
        TraceRecorder.Span span = recorder.copyIndices(fromIndex, toIndexExclusive, export);
        return save(jointId, metadata, export, span.samples(), recorder.rateHz(), span.firstSampleNs());
    }

    public int count() {
        return kept.size();
    }

    public long bytes() {
        return bytes;
    }

    public Path directory() {
        return dir;
    }

    private void prune(Path keep) throws IOException {
        while (!kept.isEmpty() && (kept.size() > maxCount || bytes > maxBytes)) {
            Entry oldest = kept.peekFirst();
            if (oldest.path().equals(keep)) {
                break;
            }
            kept.removeFirst();
            bytes -= oldest.size();
            try {
                Files.deleteIfExists(oldest.path());
            } catch (NoSuchFileException e) {
                // already gone
            }
        }
    }

    private static long counterOf(String name) {
        int dash = name.indexOf('-');
        if (dash != 10) {
            return -1;
        }
        try {
            return Long.parseLong(name.substring(0, dash));
        } catch (NumberFormatException e) {
            return -1;
        }
    }

    private static String safe(String id) {
        StringBuilder sb = new StringBuilder(Math.min(64, id.length()));
        for (int i = 0; i < id.length() && sb.length() < 64; i++) {
            char c = id.charAt(i);
            sb.append(Character.isLetterOrDigit(c) || c == '-' || c == '_' || c == '.' ? c : '_');
        }
        return sb.length() == 0 ? "joint" : sb.toString();
    }
}
