package hammerstep.mqtt;

import hammerstep.results.ResultMessages;
import hammerstep.results.StationId;
import hammerstep.station.StationClock;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.util.ArrayDeque;
import java.util.Map;
import java.util.UUID;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;

/**
 * The plant's commands: validates each ({@link CommandParser}), answers a status request at once,
 * hands the rest to {@link StationCommands} and publishes every answer as a response (QoS 1, the
 * request's correlation data, a 60 s expiry) on the response topic the request named. The station's
 * answers arrive on its own thread and are queued; {@link #answerWaiting} sends them from the
 * delivery thread.
 *
 * <p>Commands arrive on the client's thread into an inbox ({@link #offer}) and are taken up on the
 * delivery thread at the pace their answers go out: only while fewer than {@value #AHEAD} answers
 * wait for room to be published (the broker takes only so many unacknowledged publishes). An answer
 * waits, also across a reconnect, and is never dropped for want of room. The inbox is bounded: a
 * command that arrives with {@value #BUSY_AT} commands already in it is not acted on and is answered
 * {@code BUSY} in its turn; one that would take the inbox past {@value #INBOX_BYTES} bytes is
 * neither acted on nor answered, and is counted ({@code commands.dropped} in the status) and logged.
 * A client can send commands at will: refusals and dropped commands are logged at most ten times a
 * minute each, then counted.
 */
final class RemoteCommands {

    private static final Logger LOG = LoggerFactory.getLogger(ResultPublisher.class);
    private static final int MAX_COMMAND_BYTES = 4096;
    private static final long RESPONSE_EXPIRY_S = 60;

    /** Commands in the inbox at which a new one is answered {@code BUSY} and not acted on. */
    static final int BUSY_AT = 1000;
    /** The inbox's bound in bytes (payload, topics, correlation data, 64 bytes per command). */
    static final long INBOX_BYTES = 4L << 20;
    /** Answers queued for room, at which the delivery thread takes up no further command for now. */
    static final int AHEAD = 64;
    private static final int TAKE_PER_CYCLE = 256;

    private record Incoming(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation,
                            long bytes, boolean busy) { }

    private record Answer(String responseTopic, byte[] correlation, String command, StationCommands.Reply reply) { }

    private record Outgoing(String topic, byte[] payload, byte[] correlation) { }

    /** Counts since start; {@code waiting}: commands in the inbox and answers queued, now. */
    record Figures(long received, long answered, long refused, long busy, long dropped, int waiting) { }

    private final StationId station;
    private final Topics topics;
    private final StationCommands commands;
    private final StationClock clock;
    private final CommandParser parser;
    private final RateLimitedWarnings refusals = new RateLimitedWarnings(LOG, "refused commands", 10, 60_000_000_000L);
    private final RateLimitedWarnings unsentResponses = new RateLimitedWarnings(LOG, "unsent responses", 10,
            60_000_000_000L);
    private final RateLimitedWarnings droppedCommands = new RateLimitedWarnings(LOG, "dropped commands", 10,
            60_000_000_000L);
    private final ConcurrentLinkedQueue<Answer> answers = new ConcurrentLinkedQueue<>();
    private final ArrayDeque<Outgoing> waiting = new ArrayDeque<>();
    private final ConcurrentLinkedQueue<Incoming> inbox = new ConcurrentLinkedQueue<>();
    private final AtomicLong inboxBytes = new AtomicLong();
    private final AtomicInteger inboxCount = new AtomicInteger();
    private final AtomicLong receivedCount = new AtomicLong();
    private final AtomicLong droppedCount = new AtomicLong();
    private long droppedLogged;
    private long responseSeq;
    /** Answers the station owes for commands handed to it: they join the queue when they come. */
    private int owed;
    private volatile long answered;
    private volatile long refused;
    private volatile long busy;
    private volatile int waitingCount;

    RemoteCommands(StationId station, Topics topics, StationCommands commands, BrokerSettings settings,
                   StationClock clock) {
        this.station = station;
        this.topics = topics;
        this.commands = commands;
        this.clock = clock;
        this.parser = new CommandParser(MAX_COMMAND_BYTES, settings.commandMaxExpiryS());
    }

    /** Lets the rate-limited warnings report what they held back. */
    void poll(long nowNs) {
        long dropped = droppedCount.get();
        if (dropped > droppedLogged) {
            droppedCommands.warn(nowNs, "dropped {} commands unanswered: the command inbox is full ({} bytes; {}"
                    + " dropped since start)", dropped - droppedLogged, INBOX_BYTES, dropped);
            droppedLogged = dropped;
        }
        refusals.poll(nowNs);
        unsentResponses.poll(nowNs);
        droppedCommands.poll(nowNs);
    }

    /** Commands refused since start. */
    long refused() {
        return refused;
    }

    /** The command figures since start; read from any thread. */
    Figures figures() {
        return new Figures(receivedCount.get(), answered, refused, busy, droppedCount.get(),
                inboxCount.get() + waitingCount);
    }

    /**
     * A message on a command topic, on the client's thread: into the inbox, marked {@code BUSY} when
     * the inbox holds {@value #BUSY_AT} commands, or dropped and counted when it has no room.
     */
    void offer(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation) {
        receivedCount.incrementAndGet();
        long bytes = 64L + (payload == null ? 0 : payload.length) + topic.length()
                + (responseTopic == null ? 0 : responseTopic.length()) + (correlation == null ? 0 : correlation.length);
        if (inboxBytes.addAndGet(bytes) > INBOX_BYTES) {
            inboxBytes.addAndGet(-bytes);
            droppedCount.incrementAndGet();
            return;
        }
        boolean busyNow = inboxCount.getAndIncrement() >= BUSY_AT;
        inbox.add(new Incoming(topic, payload, expiryS, responseTopic, correlation, bytes, busyNow));
    }

    /**
     * Takes up commands from the inbox while fewer than {@value #AHEAD} answers wait for room, at
     * most {@value #TAKE_PER_CYCLE}; delivery thread. Returns how many.
     *
     * @param status the status message, for a status request
     */
    int takeUp(StatusMessage status, boolean connected) {
        int n = 0;
        Incoming in;
        while (n < TAKE_PER_CYCLE && waiting.size() + owed < AHEAD && (in = inbox.poll()) != null) {
            inboxBytes.addAndGet(-in.bytes);
            inboxCount.decrementAndGet();
            n++;
            if (in.busy) {
                String name = topics.commandName(in.topic);
                if (name != null) {
                    busy++;
                    respond(in.responseTopic, in.correlation, name, StationCommands.Reply.refused("BUSY",
                            "more than " + BUSY_AT + " commands were waiting; this one was not acted on"), null);
                }
            } else {
                onMessage(in.topic, in.payload, in.expiryS, in.responseTopic, in.correlation, status, connected);
            }
        }
        return n;
    }

    /**
     * One message on the command topics.
     *
     * @param status the status message, for a status request
     */
    private void onMessage(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation,
                   StatusMessage status, boolean connected) {
        String name = topics.commandName(topic);
        if (name == null) {
            return;
        }
        CommandParser.Result r = parser.parse(name, payload, expiryS);
        if (!r.ok()) {
            refused++;
            refusals.warn(clock.nanoTime(), "refused command {}: {} {}", name.length() > 64 ? name.substring(0, 64)
                    : name, r.errorCode(), r.message());
            respond(responseTopic, correlation, name, StationCommands.Reply.refused(r.errorCode(), r.message()), null);
            return;
        }
        Command c = r.command();
        if (c instanceof Command.Status) {
            respond(responseTopic, correlation, name, StationCommands.Reply.accepted("status follows"),
                    status.fields(connected ? "online" : "offline"));
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
            respond(responseTopic, correlation, name,
                    StationCommands.Reply.refused("INTERNAL", "the station could not take the command"), null);
            return;
        }
        if (answerable(responseTopic)) {
            owed++;
        }
        stage.whenComplete((reply, error) -> answers.add(new Answer(responseTopic, correlation, name,
                error != null || reply == null
                        ? StationCommands.Reply.refused("INTERNAL", "the station could not take the command")
                        : reply)));
    }

    /**
     * Queues the station's answers that arrived since the last call and publishes what the client
     * has room for on {@code link} (none while it is null); returns how many answers moved.
     */
    int answerWaiting(Link link) {
        int n = 0;
        Answer a;
        while ((a = answers.poll()) != null) {
            if (answerable(a.responseTopic)) {
                owed--;
            }
            respond(a.responseTopic, a.correlation, a.command, a.reply, null);
            n++;
        }
        return n + flush(link);
    }

    /** Publishes waiting answers in order until the client has no room; returns how many went. */
    private int flush(Link link) {
        int n = 0;
        Outgoing o;
        while (link != null && (o = waiting.peek()) != null) {
            try {
                if (!link.respond(o.topic, o.payload, o.correlation, RESPONSE_EXPIRY_S)) {
                    break; // no room in flight: again after the next acknowledgement
                }
            } catch (IOException e) {
                // the link failed: the answer stays queued for the next connection
                unsentResponses.warn(clock.nanoTime(), "could not send an answer yet ({} waiting): {}", waiting.size(),
                        e.getMessage());
                break;
            }
            waiting.poll();
            answered++;
            n++;
        }
        waitingCount = waiting.size();
        return n;
    }

    private static boolean answerable(String responseTopic) {
        return responseTopic != null && !responseTopic.isEmpty() && !responseTopic.contains("+")
                && !responseTopic.contains("#");
    }

    /** Builds the response and queues it; a request without a usable response topic gets none. */
    private void respond(String responseTopic, byte[] correlation, String command, StationCommands.Reply reply,
                         Map<String, Object> status) {
        if (!answerable(responseTopic)) {
            return;
        }
        Map<String, Object> m = ResultMessages.head("hammerstep.response.v1", UUID.randomUUID().toString(),
                ++responseSeq, station, clock.now());
        m.put("command", command.length() > 64 ? command.substring(0, 64) : command);
        m.put("ok", reply.ok());
        m.put("code", reply.code());
        m.put("message", reply.message());
        if (status != null) {
            m.put("status", status);
        }
        waiting.add(new Outgoing(responseTopic, ResultMessages.bytes(m), correlation));
        waitingCount = waiting.size();
    }
}
