package hammerstep.mqtt;

import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.ResultMessages;
import hammerstep.results.ResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StationId;
import org.agrona.concurrent.Agent;
import org.agrona.concurrent.AgentRunner;
import org.agrona.concurrent.NanoClock;
import org.agrona.concurrent.BackoffIdleStrategy;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.time.Clock;
import java.time.Instant;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.Set;
import java.util.UUID;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.function.Supplier;

/**
 * Delivers the outbox to the broker and answers commands: one duty cycle ({@link #doWork()}) on
 * its own thread. Publishes pending records at QoS 1 in append order, at most {@code inflight} at a
 * time, and marks a record delivered only when the broker acknowledges it. On a lost connection it
 * closes the link, waits (exponential backoff with jitter) and connects with a new link, then sends
 * again, with their same ids, every record not yet acknowledged. On connect it publishes a retained
 * online status; the Last Will is the retained offline status. Commands arrive on the link's
 * threads, are queued, validated ({@link CommandParser}) and handed to {@link StationCommands}.
 */
public final class ResultPublisher implements Agent {

    private static final Logger LOG = LoggerFactory.getLogger(ResultPublisher.class);
    private static final long MS = 1_000_000L;
    private static final int MAX_COMMAND_BYTES = 4096;
    private static final long RESPONSE_EXPIRY_S = 60;

    private sealed interface Signal { }

    private record Lost(long generation, String cause) implements Signal { }

    private record Ack(long tag, boolean ok, String detail) implements Signal { }

    private record Incoming(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation)
            implements Signal { }

    private record Answer(String responseTopic, byte[] correlation, String command, StationCommands.Reply reply)
            implements Signal { }

    /** Counts since start, for the status and for tests; read from any thread. */
    public record Figures(boolean connected, long published, long acknowledged, long refused, long connects,
                          long commandsRefused, long backlog) { }

    private final Outbox outbox;
    private final StationId station;
    private final Topics topics;
    private final Supplier<Link> links;
    private final StationCommands commands;
    private final BrokerSettings settings;
    private final NanoClock clock;
    private final Clock wall;
    private final Random jitter;
    private final String version;
    private final Instant started;
    private final CommandParser parser;
    // a client can send commands at will: at most 10 warnings a minute each, then a count
    private final RateLimitedWarnings refusals = new RateLimitedWarnings(LOG, "refused commands", 10, 60_000_000_000L);
    private final RateLimitedWarnings unsentResponses = new RateLimitedWarnings(LOG, "unsent responses", 10,
            60_000_000_000L);
    private final ConcurrentLinkedQueue<Signal> signals = new ConcurrentLinkedQueue<>();
    private final Set<Long> inflight = new HashSet<>();

    private Link link;
    private long generation;
    private long nextAttemptNs;
    private int failures;
    private long cursor;
    private int window;
    private long statusSeq;
    private long responseSeq;
    private long nextStatusNs;
    private ResultSink.Storage lastStorage;
    private volatile boolean connected;
    private volatile long published;
    private volatile long acknowledged;
    private volatile long refused;
    private volatile long connects;
    private volatile long commandsRefused;

    public ResultPublisher(Outbox outbox, StationId station, Supplier<Link> links, StationCommands commands,
                           BrokerSettings settings, NanoClock clock, Clock wall, long seed, String version) {
        this.outbox = outbox;
        this.station = station;
        this.topics = new Topics(station);
        this.links = links;
        this.commands = commands;
        this.settings = settings;
        this.clock = clock;
        this.wall = wall;
        this.jitter = new Random(seed);
        this.version = version;
        this.started = wall.instant();
        this.parser = new CommandParser(MAX_COMMAND_BYTES, settings.commandMaxExpiryS());
        this.nextAttemptNs = clock.nanoTime();
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
        refusals.poll(now);
        unsentResponses.poll(now);
        if (link == null) {
            if (now - nextAttemptNs >= 0) {
                work += connect(now);
            }
            return work;
        }
        work += send(now);
        if (link != null && (now - nextStatusNs >= 0 || outbox.storage() != lastStorage)) {
            publishStatus(now);
            work++;
        }
        return work;
    }

    @Override
    public void onClose() {
        Link l = link;
        link = null;
        connected = false;
        if (l != null) {
            try {
                l.publishAndWait(topics.status(), status("offline"), true, 2000);
            } catch (IOException e) {
                LOG.warn("could not publish the offline status: {}", e.getMessage());
            }
            l.disconnect();
        }
    }

    public Figures figures() {
        return new Figures(connected, published, acknowledged, refused, connects, commandsRefused, outbox.backlog());
    }

    public Topics topics() {
        return topics;
    }

    // ---- connection ------------------------------------------------------------------------------

    private int connect(long now) {
        Link l = links.get();
        long gen = ++generation;
        try {
            int receiveMax = l.connect(new Link.Will(topics.status(), status("offline")), events(gen));
            // two places of the broker's receive maximum stay free for status and command responses
            window = Math.max(1, Math.min(settings.inflight(), receiveMax - 2));
            link = l;
            l.subscribe(topics.commands());
            inflight.clear();
            cursor = 0;
            failures = 0;
            connected = true;
            connects++;
            publishStatus(now);
            LOG.info("connected to {}; {} results to send", settings.url(), outbox.backlog());
        } catch (IOException | RuntimeException e) {
            l.close();
            link = null;
            connected = false;
            failures++;
            long delayMs = backoffMs();
            nextAttemptNs = now + delayMs * MS;
            if (failures == 1 || failures % 10 == 0) {
                LOG.warn("cannot reach broker {} ({}); trying again in {} ms", settings.url(), e.getMessage(), delayMs);
            }
        }
        return 1;
    }

    private void drop(long now, String cause) {
        if (link != null) {
            link.close();
            link = null;
        }
        connected = false;
        inflight.clear();
        cursor = 0;
        failures++;
        long delayMs = backoffMs();
        nextAttemptNs = now + delayMs * MS;
        LOG.warn("connection to {} lost ({}); {} results kept; reconnecting in {} ms", settings.url(), cause,
                outbox.backlog(), delayMs);
    }

    /** min · 2^(failures−1), capped at max, then ±20 % jitter so stations do not reconnect in step. */
    long backoffMs() {
        int shift = Math.min(Math.max(failures - 1, 0), 30);
        long base = Math.min(settings.reconnectMaxMs(), settings.reconnectMinMs() << shift);
        if (base < 0) {
            base = settings.reconnectMaxMs();
        }
        double factor = 0.8 + 0.4 * jitter.nextDouble();
        return Math.max(1, Math.round(base * factor));
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
                signals.add(new Incoming(topic, payload, expiryS, responseTopic, correlation));
            }
        };
    }

    // ---- results ---------------------------------------------------------------------------------

    private int drain(long now) {
        int work = 0;
        Signal s;
        while ((s = signals.poll()) != null) {
            work++;
            if (s instanceof Lost lost) {
                if (lost.generation == generation && link != null) {
                    drop(now, lost.cause);
                }
            } else if (s instanceof Ack ack) {
                onAck(now, ack);
            } else if (s instanceof Incoming in) {
                onCommand(in);
            } else if (s instanceof Answer a) {
                respond(a.responseTopic, a.correlation, a.command, a.reply, null);
            }
        }
        return work;
    }

    private void onAck(long now, Ack ack) {
        if (ack.tag <= 0) {
            return;
        }
        inflight.remove(ack.tag);
        if (!ack.ok) {
            refused++;
            if (link != null) {
                drop(now, "broker refused a result: " + ack.detail);
            }
            return;
        }
        try {
            outbox.markDelivered(ack.tag);
            acknowledged++;
        } catch (ResultStoreException e) {
            LOG.error("cannot mark a result delivered; it will be sent again: {}", e.getMessage());
        }
    }

    private int send(long now) {
        int sent = 0;
        try {
            while (link != null && inflight.size() < window) {
                List<Outbox.Entry> batch = outbox.pending(cursor, window - inflight.size());
                if (batch.isEmpty()) {
                    break;
                }
                for (Outbox.Entry e : batch) {
                    if (!link.publish(topics.result(e.kind()), e.payload(), false, e.position())) {
                        return sent;
                    }
                    inflight.add(e.position());
                    cursor = e.position();
                    published++;
                    sent++;
                }
            }
        } catch (IOException e) {
            drop(now, e.getMessage());
        } catch (ResultStoreException e) {
            LOG.error("cannot read the outbox: {}", e.getMessage());
        }
        return sent;
    }

    // ---- status ----------------------------------------------------------------------------------

    private void publishStatus(long now) {
        lastStorage = outbox.storage();
        nextStatusNs = now + settings.statusIntervalS() * 1000 * MS;
        try {
            if (!link.publish(topics.status(), status("online"), true, 0)) {
                nextStatusNs = now;
            }
        } catch (IOException e) {
            drop(now, e.getMessage());
        }
    }

    private byte[] status(String state) {
        return ResultMessages.bytes(statusFields(state));
    }

    private Map<String, Object> statusFields(String state) {
        Map<String, Object> m = ResultMessages.head("hammerstep.status.v1", UUID.randomUUID().toString(), ++statusSeq,
                station, wall.instant());
        m.put("state", state);
        m.put("started", ResultMessages.time(started));
        m.put("version", version);
        m.put("storage", outbox.storage().name());
        m.put("backlog", outbox.backlog());
        Map<String, Object> last = new LinkedHashMap<>();
        for (MessageKind k : MessageKind.values()) {
            last.put(k.topic(), outbox.nextSeq(k) - 1);
        }
        m.put("last_seq", last);
        StationCommands.Activity a = activity();
        Map<String, Object> act = new LinkedHashMap<>();
        act.put("mode", a.mode());
        act.put("part_serial", a.partSerial());
        act.put("part_model", a.partModel());
        act.put("pattern", a.pattern());
        m.put("activity", act);
        StationCommands.DataGaps gaps = dataGaps();
        if (gaps != null) {
            Map<String, Object> g = new LinkedHashMap<>();
            g.put("outside_rundowns", gaps.outsideRundowns());
            g.put("during_rundowns", gaps.duringRundowns());
            m.put("data_gaps", g);
        }
        return m;
    }

    private StationCommands.DataGaps dataGaps() {
        try {
            return commands.dataGaps();
        } catch (RuntimeException e) {
            return null;
        }
    }

    private StationCommands.Activity activity() {
        try {
            StationCommands.Activity a = commands.activity();
            return a == null ? StationCommands.Activity.UNKNOWN : a;
        } catch (RuntimeException e) {
            return StationCommands.Activity.UNKNOWN;
        }
    }

    // ---- commands --------------------------------------------------------------------------------

    private void onCommand(Incoming in) {
        String name = topics.commandName(in.topic);
        if (name == null) {
            return;
        }
        CommandParser.Result r = parser.parse(name, in.payload, in.expiryS);
        if (!r.ok()) {
            commandsRefused++;
            refusals.warn(clock.nanoTime(), "refused command {}: {} {}", name.length() > 64 ? name.substring(0, 64)
                    : name, r.errorCode(), r.message());
            respond(in.responseTopic, in.correlation, name, StationCommands.Reply.refused(r.errorCode(), r.message()),
                    null);
            return;
        }
        Command c = r.command();
        if (c instanceof Command.Status) {
            respond(in.responseTopic, in.correlation, name, StationCommands.Reply.accepted("status follows"),
                    statusFields(connected ? "online" : "offline"));
            return;
        }
        CompletionStage<StationCommands.Reply> stage;
        try {
            if (c instanceof Command.StartPart p) {
                stage = commands.startPart(p.serial(), p.model());
            } else if (c instanceof Command.EndPart e) {
                stage = commands.endPart(e.reason());
            } else {
                stage = commands.reloadPrograms();
            }
        } catch (RuntimeException e) {
            respond(in.responseTopic, in.correlation, name,
                    StationCommands.Reply.refused("INTERNAL", "the station could not take the command"), null);
            return;
        }
        stage.whenComplete((reply, error) -> signals.add(new Answer(in.responseTopic, in.correlation, name,
                error != null || reply == null
                        ? StationCommands.Reply.refused("INTERNAL", "the station could not take the command")
                        : reply)));
    }

    private void respond(String responseTopic, byte[] correlation, String command, StationCommands.Reply reply,
                         Map<String, Object> status) {
        if (link == null || responseTopic == null || responseTopic.isEmpty() || responseTopic.contains("+")
                || responseTopic.contains("#")) {
            return;
        }
        Map<String, Object> m = ResultMessages.head("hammerstep.response.v1", UUID.randomUUID().toString(),
                ++responseSeq, station, wall.instant());
        m.put("command", command.length() > 64 ? command.substring(0, 64) : command);
        m.put("ok", reply.ok());
        m.put("code", reply.code());
        m.put("message", reply.message());
        if (status != null) {
            m.put("status", status);
        }
        try {
            link.respond(responseTopic, ResultMessages.bytes(m), correlation, RESPONSE_EXPIRY_S);
        } catch (IOException e) {
            unsentResponses.warn(clock.nanoTime(), "could not send the response to {}: {}", command, e.getMessage());
        }
    }
}
