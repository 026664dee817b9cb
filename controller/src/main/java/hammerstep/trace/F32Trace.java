package hammerstep.trace;

import hammerstep.config.InputFiles;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.FloatBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Path;

/**
 * A raw float32 trace (little-endian N·m), read from any position by any number of threads at
 * once. Each reading thread gets a window of its own ({@value #WINDOW_SAMPLES} samples) that it
 * fills with positional reads of the file; a thread walking the trace forward in blocks thus
 * costs one read call per window.
 *
 * <p>The file is read rather than mapped: mapping pays a page fault for every page touched, and
 * on the machines measured (a virtual machine among them) that costs about four times what
 * copying the same bytes through {@code read} does (see docs/design.md, "Replay speed").
 */
public final class F32Trace implements AutoCloseable {

    static final int WINDOW_SAMPLES = 1 << 18;

    private final String name;
    /** The file, or null for a trace held in memory ({@link #memory}). */
    private final FileChannel channel;
    private final ByteBuffer memory;
    private final long samples;
    private final int windowSamples;
    private final ThreadLocal<Window> windows = new ThreadLocal<>() {
        @Override
        protected Window initialValue() {
            return new Window();
        }
    };

    private F32Trace(String name, FileChannel channel, ByteBuffer memory, long samples, int windowSamples) {
        this.name = name;
        this.channel = channel;
        this.memory = memory;
        this.samples = samples;
        this.windowSamples = windowSamples;
    }

    public static F32Trace open(Path path) throws TraceException {
        return open(path, WINDOW_SAMPLES);
    }

    static F32Trace open(Path path, int windowSamples) throws TraceException {
        FileChannel ch = null;
        try {
            ch = InputFiles.open(path, 0);
            long size = ch.size();
            if (size % 4 != 0) {
                throw new TraceException(path + ": size " + size + " bytes is not a whole number of float32 samples");
            }
            F32Trace trace = new F32Trace(path.toString(), ch, null, size / 4, windowSamples);
            ch = null;
            return trace;
        } catch (IOException e) {
            throw new TraceException(InputFiles.describe(path, e));
        } finally {
            closeQuietly(ch);
        }
    }

    /**
     * A trace held in memory, read through windows like a file (so code warmed on it is compiled
     * for the real thing); each reading thread copies what it reads into a window of its own.
     */
    public static F32Trace of(float[] samples) {
        ByteBuffer b = ByteBuffer.allocateDirect(samples.length * 4).order(ByteOrder.LITTLE_ENDIAN);
        b.asFloatBuffer().put(samples);
        return new F32Trace("memory", null, b, samples.length, Math.max(1, Math.min(samples.length, WINDOW_SAMPLES)));
    }

    /** Number of samples in the trace. */
    public long samples() {
        return samples;
    }

    /**
     * Copies samples {@code [from, from+length)} into {@code into[0, length)}.
     *
     * @throws UncheckedIOException when the file cannot be read or has shrunk since it was opened
     */
    public void read(long from, float[] into, int length) {
        if (from < 0 || length < 0 || from + length > samples) {
            throw new IndexOutOfBoundsException("samples [" + from + ", " + (from + length) + ") of " + samples);
        }
        Window w = windows.get();
        int done = 0;
        while (done < length) {
            long s = from + done;
            if (s < w.first || s >= w.first + w.length) {
                w.fill(s);
            }
            int k = (int) Math.min(length - done, w.first + w.length - s);
            w.floats.get((int) (s - w.first), into, done, k);
            done += k;
        }
    }

    /** Closes the file; reads after this fail. */
    @Override
    public void close() {
        closeQuietly(channel);
    }

    private static void closeQuietly(FileChannel ch) {
        if (ch != null) {
            try {
                ch.close();
            } catch (IOException e) {
                // read-only: nothing was left unwritten
            }
        }
    }

    /** One thread's copy of a stretch of the file. */
    private final class Window {
        final ByteBuffer bytes = ByteBuffer.allocateDirect(windowSamples * 4).order(ByteOrder.LITTLE_ENDIAN);
        final FloatBuffer floats = bytes.asFloatBuffer();
        long first;
        int length;

        /** Reads up to a window's worth of samples from sample {@code from} on. */
        void fill(long from) {
            int want = (int) Math.min(windowSamples, samples - from);
            length = 0; // a failed read leaves the window empty, not holding part of two stretches
            bytes.clear().limit(want * 4);
            if (channel == null) {
                bytes.put(0, memory, (int) (from * 4), want * 4);
            } else {
                readFile(from * 4);
            }
            first = from;
            length = want;
        }

        private void readFile(long position) {
            try {
                while (bytes.hasRemaining()) {
                    if (channel.read(bytes, position + bytes.position()) < 0) {
                        String m = name + ": the file ended at byte " + (position + bytes.position())
                                + ", shorter than when it was opened";
                        throw new UncheckedIOException(m, new IOException(m));
                    }
                }
            } catch (IOException e) {
                throw new UncheckedIOException(name + ": cannot read: " + e.getMessage(), e);
            }
        }
    }
}
