package hammerstep.bench;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.FloatBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * The floor that a whole-process {@code replay} is measured against: a fresh JVM that reads a
 * raw float32 trace and runs a bare hysteresis loop over it (count a pulse at 100 N·m, release
 * below 50 N·m, keep its peak), on one thread, with nothing else. Time it as a whole process:
 *
 * <pre>
 * time java -cp controller/target/benchmarks.jar hammerstep.bench.ReplayFloor /tmp/shift.f32 read
 * time java -cp controller/target/benchmarks.jar hammerstep.bench.ReplayFloor /tmp/shift.f32 mapped
 * time java -cp controller/target/benchmarks.jar hammerstep.bench.ReplayFloor none
 * </pre>
 *
 * {@code read} copies the file through positional reads into a 1 MiB buffer, as {@code F32Trace}
 * does; {@code mapped} maps the whole file and copies blocks out of the mapping, as it did before;
 * {@code none} only starts and stops the JVM.
 */
public final class ReplayFloor {

    private static final int BLOCK = 4096;

    private ReplayFloor() {
    }

    public static void main(String[] args) throws IOException {
        if (args.length == 1 && args[0].equals("none")) {
            return;
        }
        if (args.length != 2 || !(args[1].equals("read") || args[1].equals("mapped"))) {
            System.err.println("usage: ReplayFloor TRACE.f32 read|mapped, or ReplayFloor none");
            System.exit(2);
        }
        long t0 = System.nanoTime();
        FloorLoop loop = new FloorLoop();
        try (FileChannel ch = FileChannel.open(Path.of(args[0]), StandardOpenOption.READ)) {
            if (args[1].equals("read")) {
                read(ch, loop);
            } else {
                mapped(ch, loop);
            }
        }
        System.out.printf("%d pulses, %d samples, %.1f ms after main%n", loop.pulses, loop.samples,
                (System.nanoTime() - t0) / 1e6);
    }

    private static void read(FileChannel ch, FloorLoop loop) throws IOException {
        ByteBuffer bytes = ByteBuffer.allocateDirect(1 << 20).order(ByteOrder.LITTLE_ENDIAN);
        FloatBuffer floats = bytes.asFloatBuffer();
        float[] block = new float[BLOCK];
        long position = 0;
        while (true) {
            bytes.clear();
            int n = ch.read(bytes, position);
            if (n <= 0) {
                return;
            }
            position += n;
            blocks(floats, n / 4, block, loop);
        }
    }

    private static void mapped(FileChannel ch, FloorLoop loop) throws IOException {
        FloatBuffer floats = ch.map(FileChannel.MapMode.READ_ONLY, 0, ch.size())
                .order(ByteOrder.LITTLE_ENDIAN).asFloatBuffer();
        blocks(floats, floats.limit(), new float[BLOCK], loop);
    }

    /** Runs {@code loop} over {@code floats[0, samples)}, copied out a block at a time. */
    private static void blocks(FloatBuffer floats, int samples, float[] block, FloorLoop loop) {
        for (int s = 0; s < samples; s += BLOCK) {
            int k = Math.min(BLOCK, samples - s);
            floats.get(s, block, 0, k);
            loop.onSamples(block, 0, k, 0);
        }
    }
}
