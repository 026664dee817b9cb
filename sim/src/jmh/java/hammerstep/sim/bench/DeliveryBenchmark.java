package hammerstep.sim.bench;

import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.JointOutcome;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultSink;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.sim.broker.EmbeddedBroker;
import hammerstep.station.SystemStationClock;
import org.agrona.concurrent.AgentRunner;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;

/**
 * From the station handing over a joint to the quality system's subscriber receiving it, on
 * loopback through the embedded broker, with the outbox forcing every record to disk; and the
 * rate at which a backlog drains after an outage.
 *
 * <pre>
 * mvn -q -Pbench -DskipTests package -pl sim -am
 * java -jar sim/target/benchmarks.jar DeliveryBenchmark
 * </pre>
 */
@Fork(value = 1, jvmArgsAppend = "-Xmx1g")
public class DeliveryBenchmark {

    private static final int BACKLOG = 5000;

    /** Broker, subscriber and one station's results side. */
    @State(Scope.Benchmark)
    public static class Wiring {
        EmbeddedBroker broker;
        QualityClient subscriber;
        FileOutbox outbox;
        OutboxResultSink sink;
        AgentRunner runner;
        BrokerSettings settings;
        final AtomicLong lastSeq = new AtomicLong();
        final AtomicLong received = new AtomicLong();
        final JointOutcome joint = BenchResults.joint();

        void open(boolean startDelivery) throws Exception {
            broker = EmbeddedBroker.start(0);
            subscriber = QualityClient.connect(broker.url(), "qs-bench", (topic, payload, retained, corr) -> {
                if (topic.endsWith("/joint")) {
                    received.incrementAndGet();
                    lastSeq.accumulateAndGet(BenchResults.seqOf(payload), Math::max);
                }
            });
            subscriber.subscribe("hammerstep/v1/+/+/+/joint");
            outbox = FileOutbox.open(new StorageSettings(Files.createTempDirectory("delivery-bench-"), 4L << 20, 0,
                    1L << 40, 0, 0), () -> Long.MAX_VALUE);
            sink = new OutboxResultSink(outbox, BenchResults.STATION);
            settings = BrokerSettings.plain(broker.url(), "hub-fit-1");
            if (startDelivery) {
                startDelivery();
            }
        }

        void startDelivery() {
            ResultPublisher p = new ResultPublisher(outbox, BenchResults.STATION, () -> new PahoLink(settings),
                    StationCommands.NONE, settings, new SystemStationClock(), 1, "bench");
            runner = ResultPublisher.start(p);
        }

        void close() {
            if (runner != null) {
                runner.close();
            }
            subscriber.close();
            outbox.close();
            broker.close();
        }
    }

    @State(Scope.Benchmark)
    public static class Live extends Wiring {
        @Setup(Level.Trial)
        public void setUp() throws Exception {
            open(true);
        }

        @TearDown(Level.Trial)
        public void tearDown() {
            close();
        }
    }

    /** Joint end to subscriber: store (forced), publish, broker, subscriber. */
    @Benchmark
    @BenchmarkMode(Mode.SampleTime)
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    @Warmup(iterations = 2, time = 3)
    @Measurement(iterations = 3, time = 5)
    public long jointToSubscriber(Live w) throws Exception {
        ResultSink.Receipt r = w.sink.joint(w.joint);
        while (w.lastSeq.get() < r.seq()) {
            Thread.onSpinWait();
        }
        return r.seq();
    }

    @State(Scope.Benchmark)
    public static class Backlog extends Wiring {
        @Setup(Level.Iteration)
        public void fill() throws Exception {
            open(false);
            for (int i = 0; i < BACKLOG; i++) {
                sink.joint(joint);
            }
        }

        @TearDown(Level.Iteration)
        public void tearDown() {
            close();
        }
    }

    /**
     * Time per result while a backlog of 5000 drains: from the publisher's start (connect included)
     * until the broker has acknowledged every one and the outbox is empty.
     */
    @Benchmark
    @BenchmarkMode(Mode.SingleShotTime)
    @OutputTimeUnit(TimeUnit.MICROSECONDS)
    @OperationsPerInvocation(BACKLOG)
    @Warmup(iterations = 1)
    @Measurement(iterations = 3)
    public long backlogDrain(Backlog w) {
        w.startDelivery();
        while (w.outbox.backlog() > 0) {
            Thread.onSpinWait();
        }
        return w.received.get();
    }
}
