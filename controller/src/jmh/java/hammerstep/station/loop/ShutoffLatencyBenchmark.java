package hammerstep.station.loop;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.results.JournalWriter;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StationId;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
import hammerstep.station.Lamps;
import hammerstep.station.OperatorInputs;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleRing;
import hammerstep.station.ToolEnable;
import hammerstep.station.TowerLamp;
import hammerstep.station.VirtualClock;
import hammerstep.web.LiveBoard;
import hammerstep.web.ResultLog;
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

import org.agrona.concurrent.AgentRunner;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;

/**
 * Processing part of the shut-off latency: one station duty cycle that receives the block holding
 * the shut-off crossing, from {@code doWork()} entry to the relay command (the cycle ends right after
 * it, lamps included). The rest of the latency is waiting for the block to fill: at most one block
 * period after the crossing sample ({@code blockLength / rateHz}).
 *
 * <p>{@code crossingToHandOver} times the whole rundown end on the station thread: from the
 * crossing block through the quiet blocks after it until the joint is judged and its record handed
 * to the journal. {@code journal=memory} stores inline on the station thread into a memory outbox
 * (the test wiring); {@code journal=file} is the service's wiring: a {@link FileOutbox} with a
 * forced append per record, written by the {@link JournalWriter} on its own thread, so the
 * station's figure must not carry the force. {@code journal=file-inline} is the former wiring, for
 * comparison: the same file journal stored inline, the forced append on the station thread.
 *
 * <p>{@code commands=burst} runs the same with the delivery side answering a flood of commands
 * on a thread of its own (see {@link CommandFlood}).
 *
 * <p>{@code webClients=50} wires the station as the service does with a {@code web:} section (its
 * {@link LiveBoard} as the station's listener) and serves the web view with 50 live pages reading
 * its event stream ({@link LiveClients}); {@code 0} leaves the view out.
 *
 * <p>Run: {@code mvn -q -Pbench -DskipTests package -pl controller && java -jar controller/target/benchmarks.jar ShutoffLatency}
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.SampleTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class ShutoffLatencyBenchmark {

    @Param({"20000"})
    double rateHz;

    @Param({"16", "64"})
    int blockLength;

    @Param({"memory", "file", "file-inline"})
    String journal;

    /**
     * {@code none}, or {@code burst}: meanwhile the delivery side answers a flood of plant commands
     * on its own thread, as under a command burst ({@link CommandFlood}).
     */
    @Param({"none"})
    String commands;

    /** Live pages open on the station's web view meanwhile; 0: no web view at all. */
    @Param({"0"})
    int webClients;

    private CommandFlood flood;
    private LiveBoard board;
    private LiveClients clients;

    private VirtualClock clock;
    private SampleRing ring;
    private StationAgent agent;
    private Relay relay;
    private final ArrayScanner scanner = new ArrayScanner();
    private float[] quiet;
    private float[] crossing;
    private long blockNs;
    private int serial;
    private Path journalDir;
    private FileOutbox fileOutbox;
    private AgentRunner writerRunner;

    static final class Relay implements ToolEnable {
        boolean on;
        long offCommands;

        @Override
        public void set(boolean enabled) {
            if (on && !enabled) {
                offCommands++;
            }
            on = enabled;
        }
    }

    static final class DarkLamps implements Lamps {
        int lit;

        @Override
        public int positionLamps() {
            return 4;
        }

        @Override
        public void position(int index, boolean on) {
            lit += on ? 1 : 0;
        }

        @Override
        public void tower(TowerLamp lamp, boolean on) {
            lit += on ? 1 : 0;
        }
    }

    static final class Idle implements OperatorInputs {
        public boolean acknowledge() { return false; }
        public boolean supervisorKey() { return false; }
        public boolean hasPartPresent() { return false; }
        public boolean partPresent() { return true; }
        public boolean hasConfirmSensors() { return false; }
        public int confirmedPosition() { return NO_POSITION; }
        public boolean hasTrigger() { return false; }
        public boolean trigger() { return false; }
    }

    static final class ArrayScanner implements hammerstep.station.PartIdentitySource {
        PartIdentity next;

        @Override
        public PartIdentity poll() {
            PartIdentity p = next;
            next = null;
            return p;
        }
    }

    @Setup(Level.Trial)
    public void build() throws IOException, ResultStoreException {
        JointProgram program = new JointProgram("final", "", new JointProgram.Torque(180, 200, 230),
                FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 1, 40, 7.5),
                new JointProgram.Rundown(10, 5, 4000), 200, 0);
        Pattern pattern = new Pattern("one", "", List.of("A"), List.of(
                new Pattern.Pass("final", program, Order.cross(1), 3, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
        clock = new VirtualClock(Instant.EPOCH);
        ring = new SampleRing(rateHz, blockLength, 8);
        relay = new Relay();
        long[] ids = {0};
        StationPorts ports = new StationPorts(ring, new DarkLamps(), relay, new Idle(), scanner);
        board = webClients > 0 ? new LiveBoard(rateHz, new ResultLog(ResultLog.DEFAULT_JOINTS)) : null;
        StationListener listener = board == null ? StationListener.NONE : board;
        Sequence sequence = new Sequence(new Sequence.Settings("TQ", null, 0), false);
        if (journal.startsWith("file")) {
            journalDir = Files.createTempDirectory("hammerstep-bench-journal-");
            fileOutbox = FileOutbox.open(StorageSettings.defaults(journalDir));
        }
        if (journal.equals("file-inline")) {
            agent = new StationAgent(clock, ports,
                    new OutboxResultSink(fileOutbox, new StationId("b", "b", "b"), () -> "id" + ids[0]++,
                            new VirtualClock(Instant.EPOCH)), sequence, Map.of("M", pattern),
                    JointMonitor.replayConditioning(program), 1_000_000_000L, listener,
                    Throwable::printStackTrace);
        } else if (journal.equals("file")) {
            JournalWriter writer = new JournalWriter(new OutboxResultSink(fileOutbox, new StationId("b", "b", "b"),
                    () -> "id" + ids[0]++, new VirtualClock(Instant.EPOCH)), fileOutbox,
                    JournalWriter.DEFAULT_CAPACITY);
            writerRunner = JournalWriter.start(writer, Throwable::printStackTrace);
            agent = new StationAgent(clock, ports, writer, sequence, Map.of("M", pattern),
                    JointMonitor.replayConditioning(program), 1_000_000_000L, listener,
                    Throwable::printStackTrace);
        } else {
            agent = new StationAgent(clock, ports,
                    new OutboxResultSink(new MemoryOutbox(), new StationId("b", "b", "b"), () -> "id" + ids[0]++,
                            new VirtualClock(Instant.EPOCH)), sequence, Map.of("M", pattern),
                    JointMonitor.replayConditioning(program), 1_000_000_000L, listener,
                    Throwable::printStackTrace);
        }
        quiet = new float[blockLength];
        crossing = new float[blockLength];
        // peak and fall inside the block: the conditioner's output runs delaySamples() (impulse look-ahead,
        // 6 samples at 20 kHz) behind its input, so a crossing in a block's last samples reaches the
        // monitor with the next block (docs/design.md, "Shut-off"); this block's crossing comes early enough
        int width = Math.max(4, Math.min((int) (0.002 * rateHz), blockLength));
        for (int i = 0; i < blockLength && i < width; i++) {
            crossing[i] = (float) (210 * Math.sin(Math.PI * i / width));
        }
        blockNs = (long) (blockLength * 1e9 / rateHz);
    }

    @Setup(Level.Trial)
    public void startFlood() throws Exception {
        if (commands.equals("burst")) {
            flood = CommandFlood.start();
        }
        if (board != null) {
            clients = LiveClients.start(board, webClients);
        }
    }

    @TearDown(Level.Trial)
    public void close() throws Exception {
        if (clients != null) {
            System.out.println("web view: " + clients.stop());
        }
        if (flood != null) {
            long answered = flood.stop();
            System.out.println("command flood: " + answered + " commands answered during the trial");
        }
        if (writerRunner != null) {
            writerRunner.close();
        }
        if (fileOutbox != null) {
            fileOutbox.close();
            try (var files = Files.walk(journalDir)) {
                files.sorted(java.util.Comparator.reverseOrder()).forEach(f -> f.toFile().delete());
            }
        }
    }

    /**
     * Brings the station back to a prompted position with the tool on (with the file journal, the
     * writer's thread stores the last part meanwhile: up to 10 s of wall time), then queues the
     * crossing block.
     */
    @Setup(Level.Invocation)
    public void arm() {
        long giveUpNs = System.nanoTime() + 10_000_000_000L;
        while (!(agent.sequence().phase() == Phase.PROMPT && relay.on) && System.nanoTime() - giveUpNs < 0) {
            if (agent.sequence().phase() == Phase.WAITING) {
                scanner.next = new PartIdentity("SN-" + serial++, "M");
            }
            ring.offer(quiet, 0, blockLength, clock.nanoTime());
            clock.advanceNs(blockNs);
            agent.doWork();
        }
        ring.offer(crossing, 0, blockLength, clock.nanoTime());
        clock.advanceNs(blockNs);
    }

    /**
     * From the crossing block to the joint's record handed to the journal: the crossing cycle, then
     * quiet blocks until the rundown has ended and the sequence stores (inline for the memory
     * journal, an offer to the writer's ring for the file journal).
     */
    @Benchmark
    public Phase crossingToHandOver() {
        agent.doWork();
        for (int k = 0; k < 10_000 && agent.sequence().phase() == Phase.RUNDOWN; k++) {
            ring.offer(quiet, 0, blockLength, clock.nanoTime());
            clock.advanceNs(blockNs);
            agent.doWork();
        }
        if (agent.sequence().phase() == Phase.RUNDOWN) {
            throw new IllegalStateException("the rundown did not end");
        }
        return agent.sequence().phase();
    }

    @Benchmark
    public boolean crossingBlockToRelay() {
        agent.doWork();
        if (relay.on) {
            throw new IllegalStateException("relay still on after the crossing block");
        }
        return relay.on;
    }
}
