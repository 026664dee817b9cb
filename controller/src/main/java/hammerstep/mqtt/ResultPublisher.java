package hammerstep.mqtt;

import hammerstep.results.Outbox;
import hammerstep.results.StationId;
import hammerstep.station.StationClock;
import org.agrona.concurrent.Agent;
import org.agrona.concurrent.AgentRunner;
import org.agrona.concurrent.BackoffIdleStrategy;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.function.Supplier;

/**
 * Delivers the outbox to the broker and answers commands: one duty cycle ({@link #doWork()}) on its
 * own thread, composed of its four jobs. {@link Connection} connects, and after a loss closes the
 * link and waits (exponential backoff with jitter) before connecting with a new one;
 * {@link DeliveryWindow} publishes pending records at QoS 1 in append order, at most
 * {@code inflight} at a time, marks a record delivered only when the broker acknowledges it, and
 * after a reconnect sends again, with their same ids, every record not yet acknowledged;
 * {@link StatusMessage} publishes the retained online status on connect (the Last Will is the
 * retained offline status); {@link RemoteCommands} validates the plant's commands and hands them to
 * {@link StationCommands}. The link reports on its own threads; its reports are queued and acted on
 * here.
 *
 * <p>With a {@code JournalWriter} owning the journal, give this publisher the writer's delivery
 * view ({@code JournalWriter.forDelivery()}): reads go to the outbox, delivered marks to the writer.
 */
public final class ResultPublisher implements Agent {

    private static final Logger LOG = LoggerFactory.getLogger(ResultPublisher.class);
    private static final long SEQ_CHECK_WAIT_NS = 3_000_000_000L;
    private static final int SIGNALS_PER_CYCLE = 256;

    private sealed interface Signal { }

    private record Lost(long generation, String cause) implements Signal { }

    private record Ack(long tag, boolean ok, String detail) implements Signal { }

    private record Incoming(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation)
            implements Signal { }

    /** Counts since start, for the status and for tests; read from any thread. */
    public record Figures(boolean connected, long published, long acknowledged, long refused, long connects,
                          long commandsRefused, long backlog) { }

    private final Outbox outbox;
    private final Topics topics;
    private final BrokerSettings settings;
    private final StationClock clock;
    private final Connection connection;
    private final DeliveryWindow delivery;
    private final StatusMessage status;
    private final RemoteCommands commands;
    private final SeqCrossCheck seqCheck;
    private final ConcurrentLinkedQueue<Signal> signals = new ConcurrentLinkedQueue<>();

    public ResultPublisher(Outbox outbox, StationId station, Supplier<Link> links, StationCommands commands,
                           BrokerSettings settings, StationClock clock, long seed, String version) {
        this.outbox = outbox;
        this.topics = new Topics(station);
        this.settings = settings;
        this.clock = clock;
        this.connection = new Connection(links, settings, seed, clock.nanoTime());
        this.delivery = new DeliveryWindow(outbox, topics);
        this.status = new StatusMessage(outbox, station, commands, settings, clock, version);
        this.commands = new RemoteCommands(station, topics, commands, settings, clock);
        this.status.reportCommands(this.commands);
        this.seqCheck = new SeqCrossCheck(outbox, topics.status(), status.startedText(), SEQ_CHECK_WAIT_NS);
    }

    /**
     * Runs the publisher on a thread of its own (named {@code results-delivery}). Between empty
     * cycles it spins briefly, yields, then parks for up to 1 ms, so an acknowledgement is acted on
     * within microseconds while results flow and the idle thread costs next to nothing.
     */
    public static AgentRunner start(ResultPublisher publisher) {
        AgentRunner runner = new AgentRunner(new BackoffIdleStrategy(20, 10, 1_000, 1_000_000),
                t -> LOG.error("result delivery failed; going on", t), null, publisher);
        AgentRunner.startOnThread(runner);
        return runner;
    }

    @Override
    public String roleName() {
        return "results-delivery";
    }

    @Override
    public int doWork() {
        long now = clock.nanoTime();
        int work = drain(now);
        work += commands.answerWaiting(connection.link());
        commands.poll(now);
        if (connection.link() == null) {
            if (connection.attemptDue(now)) {
                connect(now);
                work++;
            }
            return work;
        }
        try {
            if (seqCheck.readyToSend(now)) {
                work += delivery.send(connection.link());
            }
        } catch (IOException e) {
            drop(now, e.getMessage());
            return work;
        }
        if (connection.link() != null && status.due(now)) {
            publishStatus(now);
            work++;
        }
        return work;
    }

    @Override
    public void onClose() {
        Link l = connection.release();
        if (l != null) {
            try {
                l.publishAndWait(topics.status(), status.bytes("offline"), true, 2000);
            } catch (IOException e) {
                LOG.warn("could not publish the offline status: {}", e.getMessage());
            }
            l.disconnect();
        }
    }

    public Figures figures() {
        return new Figures(connection.connected(), delivery.published(), delivery.acknowledgedCount(),
                delivery.refused(), connection.connects(), commands.refused(), outbox.backlog());
    }

    /** The plant's commands since start: received, answered, refused, answered BUSY, dropped, answers waiting. */
    public CommandFigures commandFigures() {
        RemoteCommands.Figures f = commands.figures();
        return new CommandFigures(f.received(), f.answered(), f.refused(), f.busy(), f.dropped(), f.waiting());
    }

    /** See {@link #commandFigures()}; {@code waiting} is the number of answers queued now. */
    public record CommandFigures(long received, long answered, long refused, long busy, long dropped, int waiting) { }

    public Topics topics() {
        return topics;
    }

    // ---- the jobs, on this thread ----------------------------------------------------------------

    private void connect(long now) {
        int receiveMax = connection.connect(now, new Link.Will(topics.status(), status.willBytes()),
                this::events, topics.commands(), outbox.backlog());
        if (receiveMax < 0) {
            return;
        }
        // two places of the broker's receive maximum stay free for status and command responses
        delivery.restart(Math.max(1, Math.min(settings.inflight(), receiveMax - 2)));
        seqCheck.subscribe(connection.link(), now);
        publishStatus(now);
        if (connection.connects() > 1) {
            // the loss was a warning: its end is told at the same level, so a reader of warnings sees both
            LOG.warn("connection to {} is back; {} results to send", settings.url(), outbox.backlog());
        } else {
            LOG.info("connected to {}; {} results to send", settings.url(), outbox.backlog());
        }
    }

    private void drop(long now, String cause) {
        if (connection.link() == null) {
            return;
        }
        long delayMs = connection.drop(now);
        seqCheck.connectionLost();
        LOG.warn("connection to {} lost ({}); {} results kept; reconnecting in {} ms", settings.url(), cause,
                outbox.backlog(), delayMs);
    }

    private void publishStatus(long now) {
        try {
            status.publish(connection.link(), topics.status(), now);
        } catch (IOException e) {
            drop(now, e.getMessage());
        }
    }

    private Link.Events events(long gen) {
        return new Link.Events() {
            @Override
            public void connectionLost(String cause) {
                signals.add(new Lost(gen, cause));
            }

            @Override
            public void acknowledged(long tag, boolean ok, String detail) {
                signals.add(new Ack(tag, ok, detail));
            }

            @Override
            public void message(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation) {
                if (topics.commandName(topic) != null) {
                    commands.offer(topic, payload, expiryS, responseTopic, correlation);
                    return;
                }
                signals.add(new Incoming(topic, payload, expiryS, responseTopic, correlation));
            }
        };
    }

    /** Acts on up to {@value #SIGNALS_PER_CYCLE} reports, then takes up commands as answers go out. */
    private int drain(long now) {
        int work = 0;
        Signal s;
        while (work < SIGNALS_PER_CYCLE && (s = signals.poll()) != null) {
            work++;
            if (s instanceof Lost lost) {
                if (lost.generation == connection.generation()) {
                    drop(now, lost.cause);
                }
            } else if (s instanceof Ack ack) {
                if (ack.tag > 0 && !delivery.acknowledged(ack.tag, ack.ok)) {
                    drop(now, "broker refused a result: " + ack.detail);
                }
            } else if (s instanceof Incoming in) {
                seqCheck.onMessage(in.topic, in.payload);
            }
        }
        return work + commands.takeUp(status, connection.connected());
    }
}
