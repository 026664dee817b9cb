package hammerstep.mqtt;

import hammerstep.results.ResultMessages;
import hammerstep.results.StationId;
import org.agrona.concurrent.NanoClock;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.time.Clock;
import java.util.ArrayDeque;
import java.util.Map;
import java.util.UUID;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.ConcurrentLinkedQueue;

/**
 * The plant's commands: validates each ({@link CommandParser}), answers a status request at once,
 * hands the rest to {@link StationCommands} and publishes every answer as a response (QoS 1, the
 * request's correlation data, a 60 s expiry) on the response topic the request named. The station's
 * answers arrive on its own thread and are queued; {@link #answerWaiting} sends them from the
 * delivery thread.
 *
 * <p>Every answer waits in one queue until the client has room to publish it (the broker takes
 * only so many unacknowledged publishes), also across a reconnect; none is dropped for want of room.
 * The queue is bounded: with {@value #BUSY_AT} answers waiting, a new command is not acted on and is
 * answered {@code BUSY}; with {@value #CAPACITY} waiting, a new command is neither acted on nor
 * answered, and is counted ({@code commands.dropped} in the status) and logged. Answers of commands
 * already accepted by the station always join the queue (at most the station's own command queue).
 * A client can send commands at will: refusals and dropped commands are logged at most ten times a
 * minute each, then counted.
 */
final class RemoteCommands {

    private static final Logger LOG = LoggerFactory.getLogger(ResultPublisher.class);
    private static final int MAX_COMMAND_BYTES = 4096;
    private static final long RESPONSE_EXPIRY_S = 60;

    /** Answers waiting to be published, beyond which a new command is answered {@code BUSY}. */
    static final int BUSY_AT = 1000;
    /** Answers waiting, beyond which a new command is dropped unanswered and counted. */
    static final int CAPACITY = 2000;

    private record Answer(String responseTopic, byte[] correlation, String command, StationCommands.Reply reply) { }

    private record Outgoing(String topic, byte[] payload, byte[] correlation) { }

    /** Counts since start; {@code waiting} is the queue's length now. */
    record Figures(long received, long answered, long refused, long busy, long dropped, int waiting) { }

    private final StationId station;
    private final Topics topics;
    private final StationCommands commands;
    private final NanoClock clock;
    private final Clock wall;
    private final CommandParser parser;
    private final RateLimitedWarnings refusals = new RateLimitedWarnings(LOG, "refused commands", 10, 60_000_000_000L);
    private final RateLimitedWarnings unsentResponses = new RateLimitedWarnings(LOG, "unsent responses", 10,
            60_000_000_000L);
    private final RateLimitedWarnings droppedCommands = new RateLimitedWarnings(LOG, "dropped commands", 10,
            60_000_000_000L);
    private final ConcurrentLinkedQueue<Answer> answers = new ConcurrentLinkedQueue<>();
    private final ArrayDeque<Outgoing> waiting = new ArrayDeque<>();
    private long responseSeq;
    /** Answers the station owes for commands handed to it: they join the queue when they come. */
    private int owed;
    private volatile long received;
    private volatile long answered;
    private volatile long refused;
    private volatile long busy;
    private volatile long dropped;
    private volatile int waitingCount;

    RemoteCommands(StationId station, Topics topics, StationCommands commands, BrokerSettings settings,
                   NanoClock clock, Clock wall) {
        this.station = station;
        this.topics = topics;
        this.commands = commands;
        this.clock = clock;
        this.wall = wall;
        this.parser = new CommandParser(MAX_COMMAND_BYTES, settings.commandMaxExpiryS());
    }

    /** Lets the rate-limited warnings report what they held back. */
    void poll(long nowNs) {
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
        return new Figures(received, answered, refused, busy, dropped, waitingCount);
    }

    /**
     * One message on the command topics.
     *
     * @param status the status message, for a status request
     */
    void onMessage(String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation,
                   StatusMessage status, boolean connected) {
        String name = topics.commandName(topic);
        if (name == null) {
            return;
        }
        received++;
        int queued = waiting.size() + owed;
        if (answerable(responseTopic) && queued >= BUSY_AT) {
            String shown = name.length() > 64 ? name.substring(0, 64) : name;
            if (queued >= CAPACITY) {
                dropped++;
                droppedCommands.warn(clock.nanoTime(), "dropped command {} unanswered: {} answers are waiting to be"
                        + " sent ({} dropped since start)", shown, queued, dropped);
                return;
            }
            busy++;
            respond(responseTopic, correlation, name, StationCommands.Reply.refused("BUSY", queued
                    + " answers are waiting to be sent; the command was not acted on"), null);
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
                ++responseSeq, station, wall.instant());
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
