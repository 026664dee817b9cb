package hammerstep.trace;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.FloatBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * A raw float32 trace (little-endian N·m) mapped into memory, read from any position by any
 * number of threads at once. The file is mapped in pieces of {@value #CHUNK_SAMPLES} samples, a
 * multiple of every block length the chain uses, so a block never needs more than two copies.
 */
public final class F32Trace {

    static final int CHUNK_SAMPLES = 1 << 26;

    private final FloatBuffer[] chunks;
    private final long samples;
    private final int chunkSamples;

    private F32Trace(FloatBuffer[] chunks, long samples, int chunkSamples) {
        this.chunks = chunks;
        this.samples = samples;
        this.chunkSamples = chunkSamples;
    }

    public static F32Trace open(Path path) throws TraceException {
        return open(path, CHUNK_SAMPLES);
    }

    static F32Trace open(Path path, int chunkSamples) throws TraceException {
        try (FileChannel ch = FileChannel.open(path, StandardOpenOption.READ)) {
            long size = ch.size();
            if (size % 4 != 0) {
                throw new TraceException(path + ": size " + size + " bytes is not a whole number of float32 samples");
            }
            long samples = size / 4;
            FloatBuffer[] chunks = new FloatBuffer[(int) ((samples + chunkSamples - 1) / chunkSamples)];
            for (int c = 0; c < chunks.length; c++) {
                long from = (long) c * chunkSamples;
                long n = Math.min(chunkSamples, samples - from);
                chunks[c] = ch.map(FileChannel.MapMode.READ_ONLY, from * 4, n * 4)
                        .order(ByteOrder.LITTLE_ENDIAN).asFloatBuffer();
            }
            return new F32Trace(chunks, samples, chunkSamples);
        } catch (NoSuchFileException e) {
            throw new TraceException(path + ": no such file");
        } catch (IOException e) {
            throw new TraceException(path + ": cannot read: " + e.getMessage());
        }
    }

    /**
     * A trace held in memory, read through the same kind of buffer as a mapped file (so code warmed
     * on it is compiled for the real thing).
     */
    public static F32Trace of(float[] samples) {
        FloatBuffer b = ByteBuffer.allocateDirect(samples.length * 4).order(ByteOrder.LITTLE_ENDIAN).asFloatBuffer();
        b.put(samples).flip();
        return new F32Trace(new FloatBuffer[] {b}, samples.length, Math.max(1, samples.length));
    }

    /** Number of samples in the file. */
    public long samples() {
        return samples;
    }

    /** Copies samples {@code [from, from+length)} into {@code into[0, length)}. */
    public void read(long from, float[] into, int length) {
        if (from < 0 || length < 0 || from + length > samples) {
            throw new IndexOutOfBoundsException("samples [" + from + ", " + (from + length) + ") of " + samples);
        }
        int done = 0;
        while (done < length) {
            long s = from + done;
            FloatBuffer chunk = chunks[(int) (s / chunkSamples)];
            int at = (int) (s % chunkSamples);
            int k = Math.min(length - done, chunk.limit() - at);
            chunk.get(at, into, done, k);
            done += k;
        }
    }
}
