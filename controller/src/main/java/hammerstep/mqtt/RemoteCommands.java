package hammerstep.mqtt;

import hammerstep.results.ResultMessages;
import hammerstep.results.StationId;
import org.agrona.concurrent.NanoClock;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.time.Clock;
import java.util.Map;
import java.util.UUID;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.ConcurrentLinkedQueue;

/**
 * The plant's commands: validates each ({@link CommandParser}), answers a status request at once,
 * hands the rest to {@link StationCommands} and publishes every answer as a response (QoS 1, the
 * request's correlation data, a 60 s expiry) on the response topic the request named. The station's
 * answers arrive on its own thread and are queued; {@link #answerWaiting} sends them from the
 * delivery thread. A client can send commands at will: refusals and unsent responses are logged at
 * most ten times a minute each, then counted.
 */
final class RemoteCommands {

    private static final Logger LOG = LoggerFactory.getLogger(ResultPublisher.class);
    private static final int MAX_COMMAND_BYTES = 4096;
    private static final long RESPONSE_EXPIRY_S = 60;

    private record Answer(String responseTopic, byte[] correlation, String command, StationCommands.Reply reply) { }

    private final StationId station;
    private final Topics topics;
    private final StationCommands commands;
    private final NanoClock clock;
    private final Clock wall;
    private final CommandParser parser;
    private final RateLimitedWarnings refusals = new RateLimitedWarnings(LOG, "refused commands", 10, 60_000_000_000L);
    private final RateLimitedWarnings unsentResponses = new RateLimitedWarnings(LOG, "unsent responses", 10,
            60_000_000_000L);
    private final ConcurrentLinkedQueue<Answer> answers = new ConcurrentLinkedQueue<>();
    private long responseSeq;
    private volatile long refused;

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
    }

    /** Commands refused since start. */
    long refused() {
        return refused;
    }

    /**
     * One message on the command topics.
     *
     * @param link   where responses go, or null while not connected
     * @param status the status message, for a status request
     */
    void onMessage(Link link, String topic, byte[] payload, Long expiryS, String responseTopic, byte[] correlation,
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
            respond(link, responseTopic, correlation, name, StationCommands.Reply.refused(r.errorCode(), r.message()),
                    null);
            return;
        }
        Command c = r.command();
        if (c instanceof Command.Status) {
            respond(link, responseTopic, correlation, name, StationCommands.Reply.accepted("status follows"),
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
            respond(link, responseTopic, correlation, name,
                    StationCommands.Reply.refused("INTERNAL", "the station could not take the command"), null);
            return;
        }
        stage.whenComplete((reply, error) -> answers.add(new Answer(responseTopic, correlation, name,
                error != null || reply == null
                        ? StationCommands.Reply.refused("INTERNAL", "the station could not take the command")
                        : reply)));
    }

    /** Sends the station's answers that arrived since the last call; returns how many. */
    int answerWaiting(Link link) {
        int n = 0;
        Answer a;
        while ((a = answers.poll()) != null) {
            respond(link, a.responseTopic, a.correlation, a.command, a.reply, null);
            n++;
        }
        return n;
    }

    private void respond(Link link, String responseTopic, byte[] correlation, String command,
                         StationCommands.Reply reply, Map<String, Object> status) {
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
