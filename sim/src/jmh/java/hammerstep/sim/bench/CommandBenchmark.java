package hammerstep.sim.bench;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.sim.broker.EmbeddedBroker;
import hammerstep.station.Lamps;
import hammerstep.station.OperatorInputs;
import hammerstep.station.SampleRing;
import hammerstep.station.SystemStationClock;
import hammerstep.station.TowerLamp;
import hammerstep.station.loop.CommandDesk;
import hammerstep.station.loop.StationAgent;
import hammerstep.station.loop.StationListener;
import hammerstep.station.loop.StationPorts;
import hammerstep.station.loop.StationRunner;
import org.agrona.concurrent.AgentRunner;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;

/**
 * A plant command's round trip as the quality system sees it, on loopback through the embedded
 * broker: publish {@code cmd/end-part} (QoS 1, response topic, correlation data), the publisher
 * hands it to the station's desk, the station loop (on its own thread, as in {@code hammerstep run})
 * acts on it in its next cycle ({@code NO_PART}: nothing in work), and the answer comes back.
 *
 * <pre>
 * mvn -q -Pbench -DskipTests package -pl sim -am
 * java -jar sim/target/benchmarks.jar CommandBenchmark
 * </pre>
 */
@Fork(value = 1, jvmArgsAppend = "-Xmx1g")
public class CommandBenchmark {

    @State(Scope.Benchmark)
    public static class Wiring {
        EmbeddedBroker broker;
        QualityClient plant;
        StationRunner station;
        AgentRunner delivery;
        final AtomicLong answers = new AtomicLong();
        final byte[] body = "{\"reason\":\"bench\"}".getBytes(StandardCharsets.UTF_8);
        String topic;
        String statusTopic;

        @Setup(Level.Trial)
        public void open() throws Exception {
            broker = EmbeddedBroker.start(0);
            JointProgram program = new JointProgram("hub-final", "r1", new JointProgram.Torque(180, 200, 230),
                    FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 30, 4, 30, 7.5),
                    new JointProgram.Rundown(10, 200, 5000), 205, 2);
            Pattern pattern = new Pattern("wheel-5", "", List.of("P1", "P2"), List.of(new Pattern.Pass("final",
                    program, Order.cross(2), 2, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
            SystemStationClock clock = new SystemStationClock();
            MemoryOutbox outbox = new MemoryOutbox();
            StationAgent agent = new StationAgent(clock, new StationPorts(new SampleRing(20_000, 64, 16), new NoLamps(),
                    on -> { }, new NoInputs(), () -> null), new OutboxResultSink(outbox, BenchResults.STATION),
                    new Sequence(new Sequence.Settings("TQ-1", null, 300), false), Map.of("hub-5", pattern),
                    JointMonitor.replayConditioning(program), 1_000_000_000L, StationListener.NONE, Throwable::printStackTrace);
            CommandDesk desk = new CommandDesk(null);
            agent.takeCommands(desk);
            station = new StationRunner(agent).start();
            BrokerSettings settings = BrokerSettings.plain(broker.url(), "hub-fit-1");
            ResultPublisher publisher = new ResultPublisher(outbox, BenchResults.STATION, () -> new PahoLink(settings),
                    desk, settings, new SystemStationClock(), 1, "bench");
            delivery = ResultPublisher.start(publisher);
            topic = publisher.topics().prefix() + "cmd/end-part";
            statusTopic = publisher.topics().prefix() + "cmd/status";
            plant = QualityClient.connect(broker.url(), "qs-bench-cmd", (t, payload, retained, corr) -> {
                if (t.startsWith("qs/bench/")) {
                    answers.incrementAndGet();
                }
            });
            plant.subscribe("qs/bench/#");
            while (!publisher.figures().connected()) {
                Thread.onSpinWait();
            }
        }

        @TearDown(Level.Trial)
        public void close() {
            plant.close();
            delivery.close();
            station.close();
            broker.close();
        }
    }

    @Benchmark
    @BenchmarkMode(Mode.SampleTime)
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    @Warmup(iterations = 2, time = 3)
    @Measurement(iterations = 3, time = 5)
    public long commandToAnswer(Wiring w) throws Exception {
        long before = w.answers.get();
        w.plant.publish(w.topic, w.body, 30L, "qs/bench/answer", w.body);
        return awaitAnswer(w, before);
    }

    /** Control: {@code cmd/status} is answered by the publisher itself, without the station loop. */
    @Benchmark
    @BenchmarkMode(Mode.SampleTime)
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    @Warmup(iterations = 2, time = 3)
    @Measurement(iterations = 3, time = 5)
    public long statusToAnswer(Wiring w) throws Exception {
        long before = w.answers.get();
        w.plant.publish(w.statusTopic, new byte[0], null, "qs/bench/status", w.body);
        return awaitAnswer(w, before);
    }

    /** Control: only the plant's publish, until the broker's PUBACK (no answer awaited). */
    @Benchmark
    @BenchmarkMode(Mode.SampleTime)
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    @Warmup(iterations = 2, time = 3)
    @Measurement(iterations = 3, time = 5)
    public void publishOnly(Wiring w) throws Exception {
        w.plant.publish(w.statusTopic.replace("/cmd/status", "/probe"), w.body, 30L, null, null);
    }

    /** Control: the plant's client to itself through the broker (QoS 1, expiry and correlation data). */
    @Benchmark
    @BenchmarkMode(Mode.SampleTime)
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    @Warmup(iterations = 2, time = 3)
    @Measurement(iterations = 3, time = 5)
    public long brokerEcho(Wiring w) throws Exception {
        long before = w.answers.get();
        w.plant.publish("qs/bench/echo", w.body, 30L, null, w.body);
        return awaitAnswer(w, before);
    }

    /** Spins until an answer beyond {@code before} has arrived; returns the new count. */
    private static long awaitAnswer(Wiring w, long before) {
        while (w.answers.get() == before) {
            Thread.onSpinWait();
        }
        return w.answers.get();
    }

    static final class NoLamps implements Lamps {
        @Override
        public int positionLamps() {
            return 8;
        }

        @Override
        public void position(int index, boolean lit) {
        }

        @Override
        public void tower(TowerLamp lamp, boolean lit) {
        }
    }

    static final class NoInputs implements OperatorInputs {
        @Override
        public boolean acknowledge() {
            return false;
        }

        @Override
        public boolean supervisorKey() {
            return false;
        }

        @Override
        public boolean hasPartPresent() {
            return false;
        }

        @Override
        public boolean partPresent() {
            return false;
        }

        @Override
        public boolean hasConfirmSensors() {
            return false;
        }

        @Override
        public int confirmedPosition() {
            return NO_POSITION;
        }

        @Override
        public boolean hasTrigger() {
            return false;
        }

        @Override
        public boolean trigger() {
            return false;
        }
    }
}
