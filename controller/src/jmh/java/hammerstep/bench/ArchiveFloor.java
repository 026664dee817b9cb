package hammerstep.bench;

import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceException;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;

/**
 * The floor that {@code replay} over an archive is measured against: a fresh JVM that finds the
 * stored traces under a directory as replay does, reads each through {@link StoredTrace#read} (the
 * same reading code replay uses) and runs a bare hysteresis loop over its samples (a pulse from
 * 100 N·m, released below 50 N·m, its peak kept), on one thread, with nothing else. Time it as a
 * whole process, JVM start included:
 *
 * <pre>
 * time java -cp controller/target/benchmarks.jar hammerstep.bench.ArchiveFloor /tmp/archive/traces
 * </pre>
 */
public final class ArchiveFloor {

    private static final int BLOCK = 4096;

    private ArchiveFloor() {
    }

    public static void main(String[] args) throws IOException, TraceException {
        if (args.length != 1) {
            System.err.println("usage: ArchiveFloor DIR");
            System.exit(2);
        }
        long t0 = System.nanoTime();
        List<Path> traces;
        try (Stream<Path> s = Files.walk(Path.of(args[0]))) {
            traces = s.filter(f -> StoredTrace.isStored(f) && Files.isRegularFile(f)).sorted().toList();
        }
        FloorLoop loop = new FloorLoop();
        float[] block = new float[BLOCK];
        for (Path p : traces) {
            loop.inPulse = false;
            StoredTrace.read(p, block, loop);
        }
        System.out.printf("%d traces, %d pulses, %d samples, %.1f ms after main%n", traces.size(), loop.pulses,
                loop.samples, (System.nanoTime() - t0) / 1e6);
    }
}
