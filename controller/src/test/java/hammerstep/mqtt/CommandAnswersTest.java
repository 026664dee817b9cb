package hammerstep.mqtt;

import ch.qos.logback.classic.Logger;
import ch.qos.logback.classic.spi.ILoggingEvent;
import ch.qos.logback.core.read.ListAppender;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageSchemas;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.Samples;
import hammerstep.station.FixedWallClock;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.slf4j.LoggerFactory;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Every accepted command gets its answer: answers wait for room in flight instead of being dropped,
 * a full queue answers BUSY, beyond its bound a command is dropped and counted in the status; the
 * Last Will carries no figures of the moment; an unreachable broker is logged once per backoff
 * period. Virtual time, a fake link, the delivery duty cycle called by hand.
 */
class CommandAnswersTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    private long nowNs = 1_000_000_000L;
    private final List<FakeLink> links = new ArrayList<>();
    private final AtomicInteger ids = new AtomicInteger();
    private final RecordingStation station = new RecordingStation();
    private final ListAppender<ILoggingEvent> logged = new ListAppender<>();
    private final Logger log = (Logger) LoggerFactory.getLogger(ResultPublisher.class);
    private MemoryOutbox outbox;
    private OutboxResultSink sink;
    private ResultPublisher publisher;
    private boolean refuseNext;

    @BeforeEach
    void setUp() {
        outbox = new MemoryOutbox();
        FixedWallClock clock = new FixedWallClock(() -> nowNs, Samples.T0);
        sink = new OutboxResultSink(outbox, Samples.STATION, () -> "id-" + ids.incrementAndGet(), clock);
        BrokerSettings settings = BrokerSettings.plain("tcp://127.0.0.1:1883", "hub-fit-1");
        publisher = new ResultPublisher(outbox, Samples.STATION, () -> {
            FakeLink l = new FakeLink();
            l.refuseConnect = refuseNext;
            links.add(l);
            return l;
        }, station, settings, clock, 7, "test");
        logged.start();
        log.addAppender(logged);
    }

    @AfterEach
    void detach() {
        log.detachAppender(logged);
    }

    private FakeLink link() {
        return links.get(links.size() - 1);
    }

    private void cycles(int n) {
        for (int i = 0; i < n; i++) {
            publisher.doWork();
        }
    }

    private void command(FakeLink l, int i) {
        l.events.message(publisher.topics().prefix() + "cmd/status", new byte[0], null, "qs/replies/qs/hub-fit-1",
                ("c" + i).getBytes(StandardCharsets.UTF_8));
    }

    private Map<String, String> codesByCorrelation(FakeLink l) throws Exception {
        Map<String, String> codes = new HashMap<>();
        for (FakeLink.Sent s : l.on("qs/replies/qs/hub-fit-1")) {
            codes.put(new String(s.correlation(), StandardCharsets.UTF_8), JSON.readTree(s.payload()).get("code").asText());
        }
        return codes;
    }

    @Test
    void answersWaitForRoomInFlightAndAllGoOutInOrder() throws Exception {
        cycles(3);
        FakeLink l = link();
        l.roomForResponses = 0; // the client's window is full
        for (int i = 0; i < 500; i++) {
            command(l, i);
        }
        cycles(10);
        assertThat(l.on("qs/replies/")).isEmpty();
        assertThat(publisher.commandFigures().waiting()).isEqualTo(500);
        for (int round = 0; round < 50; round++) {
            l.roomForResponses = 20; // twenty acknowledgements came back
            cycles(1);
        }
        List<FakeLink.Sent> replies = l.on("qs/replies/qs/hub-fit-1");
        assertThat(replies).hasSize(500);
        for (int i = 0; i < 500; i++) {
            assertThat(new String(replies.get(i).correlation(), StandardCharsets.UTF_8)).isEqualTo("c" + i);
        }
        ResultPublisher.CommandFigures f = publisher.commandFigures();
        assertThat(f.received()).isEqualTo(500);
        assertThat(f.answered()).isEqualTo(500);
        assertThat(f.busy()).isZero();
        assertThat(f.dropped()).isZero();
        assertThat(f.waiting()).isZero();
    }

    private void part(FakeLink l, int i, String serial) {
        l.events.message(publisher.topics().prefix() + "cmd/part",
                ("{\"serial\":\"" + serial + "\",\"model\":\"hub-5\"}").getBytes(StandardCharsets.UTF_8), 30L,
                "qs/replies/qs/hub-fit-1", ("c" + i).getBytes(StandardCharsets.UTF_8));
    }

    @Test
    void commandsAreTakenUpAtThePaceTheirAnswersGoOutAndAFullInboxAnswersBusy() throws Exception {
        cycles(3);
        FakeLink l = link();
        l.roomForResponses = 0;
        int sent = RemoteCommands.BUSY_AT + 300;
        for (int i = 0; i < sent; i++) {
            part(l, i, "P" + i);
        }
        cycles(20);
        assertThat(station.started).as("taken up only while few answers wait").hasSize(RemoteCommands.AHEAD);
        assertThat(publisher.commandFigures().waiting()).isEqualTo(sent);

        for (int round = 0; round < 400; round++) {
            l.roomForResponses = 20;
            cycles(1);
        }
        ResultPublisher.CommandFigures f = publisher.commandFigures();
        assertThat(f.received()).isEqualTo(sent);
        assertThat(f.answered()).isEqualTo(sent);
        assertThat(f.busy()).isEqualTo(300);
        assertThat(f.dropped()).isZero();
        assertThat(f.waiting()).isZero();
        assertThat(station.started).as("every command but the BUSY ones acted on").hasSize(RemoteCommands.BUSY_AT);
        Map<String, String> codes = codesByCorrelation(l);
        assertThat(codes).hasSize(sent);
        assertThat(codes.get("c0")).isEqualTo("OK");
        assertThat(codes.get("c" + (RemoteCommands.BUSY_AT - 1))).isEqualTo("OK");
        assertThat(codes.get("c" + RemoteCommands.BUSY_AT)).isEqualTo("BUSY");
    }

    @Test
    void beyondTheInboxBoundACommandIsDroppedLoggedAndCountedInTheStatus() throws Exception {
        cycles(3);
        FakeLink l = link();
        l.roomForResponses = 0;
        String big = "x".repeat(4000); // within the 4096-byte command limit
        int sent = 1100;
        for (int i = 0; i < sent; i++) {
            part(l, i, big);
        }
        ResultPublisher.CommandFigures f = publisher.commandFigures();
        long kept = sent - f.dropped();
        assertThat(f.dropped()).as("4 MiB of inbox hold about a thousand such commands").isBetween(50L, 150L);
        cycles(3);
        assertThat(logged.list).anySatisfy(e -> assertThat(e.getFormattedMessage())
                .contains("commands unanswered: the command inbox is full"));

        l.roomForResponses = Integer.MAX_VALUE;
        for (int k = 0; k < 100; k++) {
            cycles(1);
        }
        nowNs += 61_000_000_000L; // the status interval: a status with the figures
        cycles(3);
        assertThat(codesByCorrelation(l)).hasSize((int) kept);
        List<FakeLink.Sent> statuses = l.on("/status");
        byte[] last = statuses.get(statuses.size() - 1).payload();
        MessageSchemas.assertValid(last);
        JsonNode commands = JSON.readTree(last).get("commands");
        assertThat(commands.get("received").asLong()).isEqualTo(sent);
        assertThat(commands.get("dropped").asLong()).isEqualTo(sent - kept);
        assertThat(commands.get("answered").asLong()).isEqualTo(kept);
        assertThat(commands.get("refused").asLong() + commands.get("busy").asLong())
                .as("a 4000-character serial is invalid; those beyond the first thousand BUSY").isEqualTo(kept);
        assertThat(commands.get("waiting").asLong()).isZero();
    }

    @Test
    void answersWaitingWhenTheConnectionDropsGoOutOnTheNextOne() throws Exception {
        cycles(3);
        FakeLink first = link();
        first.roomForResponses = 0;
        for (int i = 0; i < 10; i++) {
            command(first, i);
        }
        cycles(2);
        first.events.connectionLost("network gone");
        cycles(1);
        nowNs += 60_000_000_000L;
        cycles(3);
        FakeLink second = link();
        assertThat(second).isNotSameAs(first);
        assertThat(second.on("qs/replies/qs/hub-fit-1")).hasSize(10);
        assertThat(publisher.commandFigures().answered()).isEqualTo(10);
    }

    @Test
    void theLastWillSaysOfflineWithoutTheFiguresOfTheMoment() throws Exception {
        sink.joint(Samples.joint(1, true));
        sink.joint(Samples.joint(2, true));
        cycles(3);
        JsonNode will = JSON.readTree(link().will.payload());
        MessageSchemas.assertValid(link().will.payload());
        assertThat(will.get("state").asText()).isEqualTo("offline");
        assertThat(will.has("last_seq")).as("no last_seq a subscriber would compare").isFalse();
        assertThat(will.has("backlog")).isFalse();
        assertThat(will.has("storage")).isFalse();
        assertThat(will.has("commands")).isFalse();
        assertThat(will.get("last_seq_at_connect").get("joint").asLong()).isEqualTo(2);
        assertThat(will.get("started").asText()).isNotEmpty();
    }

    @Test
    void anUnreachableBrokerIsLoggedOncePerBackoffPeriodNotPerAttempt() throws Exception {
        refuseNext = true;
        sink.joint(Samples.joint(1, true));
        long start = nowNs;
        while (nowNs - start < 300_000_000_000L) { // five minutes, in steps of 100 ms
            publisher.doWork();
            nowNs += 100_000_000L;
        }
        List<String> lines = logged.list.stream().map(ILoggingEvent::getFormattedMessage)
                .filter(m -> m.contains("reach broker")).toList();
        int attempts = links.size();
        assertThat(attempts).as("connection attempts in five minutes").isGreaterThanOrEqualTo(14);
        // reconnect.max_ms is 30 s: the first failure, then at most one line per 30 s (at the first
        // attempt after the period, which the ±20 % jitter can push to 36 s)
        assertThat(lines).hasSizeBetween(6, 11).hasSizeLessThan(attempts);
        assertThat(lines.get(0)).startsWith("cannot reach broker").contains("1 results kept, measuring and storing go on");
        assertThat(lines.get(lines.size() - 1)).startsWith("still cannot reach broker").contains("failed attempts");
        assertThat(outbox.backlog()).isEqualTo(1);
        refuseNext = false;
        nowNs += 60_000_000_000L;
        publisher.doWork();
        assertThat(publisher.figures().connected()).isTrue();
    }
}
