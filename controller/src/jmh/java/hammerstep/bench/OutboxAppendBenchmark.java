package hammerstep.bench;

import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Comparator;
import java.util.stream.Stream;

/**
 * What storing one result costs the station thread: a journal append forced to the device
 * ({@code FileChannel.force}), as the station waits for it before it shows the verdict lamp.
 * The journal lives in {@code -Dhammerstep.bench.dir} (default: the system temp folder), so run it
 * on the medium the station uses.
 *
 * <pre>
 * mvn -q -Pbench -DskipTests package -pl controller -am
 * java -jar controller/target/benchmarks.jar OutboxAppendBenchmark
 * </pre>
 */
@BenchmarkMode(Mode.SampleTime)
@OutputTimeUnit(java.util.concurrent.TimeUnit.MICROSECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 3)
@Fork(1)
@State(Scope.Thread)
public class OutboxAppendBenchmark {

    /** Bytes of a stored message; a joint message with 10 to 20 blows is about 700 to 900. */
    @Param({"900"})
    int payloadBytes;

    private FileOutbox outbox;
    private Path dir;
    private byte[] payload;

    @Setup(Level.Trial)
    public void open() throws Exception {
        Path base = Path.of(System.getProperty("hammerstep.bench.dir", System.getProperty("java.io.tmpdir")));
        dir = Files.createTempDirectory(base, "outbox-bench-");
        outbox = FileOutbox.open(new StorageSettings(dir, 4L << 20, 0, 1L << 40, 0, 0), () -> Long.MAX_VALUE);
        payload = new byte[payloadBytes];
        Arrays.fill(payload, (byte) 'x');
    }

    @TearDown(Level.Trial)
    public void close() throws IOException {
        outbox.close();
        try (Stream<Path> s = Files.walk(dir)) {
            s.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }

    /** Append, force, and mark delivered at once (so retention keeps the journal small). */
    @Benchmark
    public long appendForced() throws Exception {
        long seq = outbox.nextSeq(MessageKind.JOINT);
        long position = outbox.append(MessageKind.JOINT, seq, "bench-" + seq, payload);
        outbox.markDelivered(position);
        return position;
    }

    /** For comparison: the same record kept only in memory. */
    @State(Scope.Thread)
    public static class Memory {
        final Outbox box = new hammerstep.results.MemoryOutbox();
        final byte[] payload = new byte[900];
    }

    @Benchmark
    public long appendInMemory(Memory m) throws Exception {
        long seq = m.box.nextSeq(MessageKind.JOINT);
        long position = m.box.append(MessageKind.JOINT, seq, "bench-" + seq, m.payload);
        m.box.markDelivered(position);
        return position;
    }
}
