package hammerstep.mqtt;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageSchemas;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.Samples;
import hammerstep.station.FixedWallClock;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

class ResultPublisherTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    private long nowNs = 1_000_000_000L;
    private final List<FakeLink> links = new ArrayList<>();
    private final AtomicInteger ids = new AtomicInteger();
    private MemoryOutbox outbox;
    private OutboxResultSink sink;
    private ResultPublisher publisher;
    private final RecordingStation station = new RecordingStation();
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
    }

    private FakeLink link() {
        return links.get(links.size() - 1);
    }

    private void cycle() {
        for (int i = 0; i < 5; i++) {
            publisher.doWork();
        }
    }

    private static JsonNode json(byte[] b) throws Exception {
        return JSON.readTree(b);
    }

    @Test
    void connectsSubscribesToCommandsAndPublishesRetainedOnlineStatusWithAnOfflineWill() throws Exception {
        cycle();
        FakeLink l = link();
        assertThat(l.subscriptions).containsExactly("hammerstep/v1/plant-north/axle-2/hub-fit-1/cmd/+",
                "hammerstep/v1/plant-north/axle-2/hub-fit-1/status"); // its own status, read back as a seq cross check
        assertThat(l.will.topic()).isEqualTo("hammerstep/v1/plant-north/axle-2/hub-fit-1/status");
        assertThat(json(l.will.payload()).get("state").asText()).isEqualTo("offline");
        MessageSchemas.assertValid(l.will.payload());
        FakeLink.Sent status = l.on("/status").get(0);
        assertThat(status.retained()).isTrue();
        assertThat(json(status.payload()).get("state").asText()).isEqualTo("online");
        MessageSchemas.assertValid(status.payload());
    }

    @Test
    void publishesResultsInOrderAndMarksThemDeliveredOnlyOnAck() throws Exception {
        sink.joint(Samples.joint(1, true));
        sink.joint(Samples.joint(2, true));
        sink.part(Samples.part(List.of("id-1", "id-2")));
        cycle();
        FakeLink l = link();
        assertThat(l.results()).extracting(FakeLink.Sent::topic).containsExactly(
                "hammerstep/v1/plant-north/axle-2/hub-fit-1/joint", "hammerstep/v1/plant-north/axle-2/hub-fit-1/joint",
                "hammerstep/v1/plant-north/axle-2/hub-fit-1/part");
        assertThat(outbox.backlog()).isEqualTo(3);
        l.events.acknowledged(l.results().get(0).tag(), true, "");
        cycle();
        assertThat(outbox.backlog()).isEqualTo(2);
        assertThat(l.results()).hasSize(3);
        l.ackAll();
        cycle();
        assertThat(outbox.backlog()).isZero();
    }

    @Test
    void sendsAgainEveryUnacknowledgedResultWithItsSameIdAfterReconnect() throws Exception {
        for (int i = 1; i <= 4; i++) {
            sink.joint(Samples.joint(i, true));
        }
        cycle();
        FakeLink first = link();
        first.events.acknowledged(first.results().get(0).tag(), true, "");
        first.events.connectionLost("network down");
        cycle();
        assertThat(first.closed).isTrue();
        assertThat(links).hasSize(1);
        nowNs += 2_000_000_000L;
        cycle();
        FakeLink second = link();
        assertThat(second).isNotSameAs(first);
        List<String> resent = new ArrayList<>();
        for (FakeLink.Sent s : second.results()) {
            resent.add(json(s.payload()).get("id").asText());
        }
        assertThat(resent).containsExactly("id-2", "id-3", "id-4");
    }

    @Test
    void keepsWorkingOfflineAndDrainsTheBacklogOnReconnect() throws Exception {
        refuseNext = true;
        cycle();
        for (int i = 1; i <= 25; i++) {
            sink.joint(Samples.joint(1 + i % 5, i % 3 != 0));
        }
        assertThat(publisher.figures().connected()).isFalse();
        refuseNext = false;
        nowNs += 60_000_000_000L;
        cycle();
        FakeLink l = link();
        assertThat(l.results()).as("the broker's receive maximum less two places for status and responses")
                .hasSize(8);
        for (int round = 0; round < 5 && outbox.backlog() > 0; round++) {
            for (FakeLink.Sent s : l.results()) {
                l.events.acknowledged(s.tag(), true, "");
            }
            cycle();
        }
        assertThat(outbox.backlog()).isZero();
        List<Long> seqs = new ArrayList<>();
        for (FakeLink.Sent s : l.results()) {
            seqs.add(json(s.payload()).get("seq").asLong());
        }
        assertThat(seqs).hasSize(25).isSorted().doesNotHaveDuplicates();
    }

    @Test
    void backsOffExponentiallyWithJitterUpToTheMaximum() {
        refuseNext = true;
        List<Long> attemptsAt = new ArrayList<>();
        for (int i = 0; i < 400; i++) {
            int before = links.size();
            publisher.doWork();
            if (links.size() > before) {
                attemptsAt.add(nowNs);
            }
            nowNs += 250_000_000L;
        }
        List<Long> gapsMs = new ArrayList<>();
        for (int i = 1; i < attemptsAt.size(); i++) {
            gapsMs.add((attemptsAt.get(i) - attemptsAt.get(i - 1)) / 1_000_000);
        }
        assertThat(gapsMs.get(0)).isBetween(250L, 750L);
        assertThat(gapsMs.get(4)).isBetween(6000L, 10_250L);
        assertThat(gapsMs.get(gapsMs.size() - 1)).isBetween(24_000L, 36_250L);
    }

    @Test
    void aRefusedPublishIsNotMarkedDelivered() throws Exception {
        sink.joint(Samples.joint(1, true));
        cycle();
        FakeLink l = link();
        l.events.acknowledged(l.results().get(0).tag(), false, "reason code 135");
        cycle();
        assertThat(outbox.backlog()).isEqualTo(1);
        assertThat(publisher.figures().refused()).isEqualTo(1);
    }

    @Test
    void answersAPartCommandWithTheStationsReplyAndCorrelationData() throws Exception {
        cycle();
        FakeLink l = link();
        l.events.message(publisher.topics().prefix() + "cmd/part",
                "{\"serial\":\"WH-0002\",\"model\":\"hub-5\"}".getBytes(StandardCharsets.UTF_8), 30L, "qs/replies/1",
                new byte[] {1, 2, 3});
        cycle();
        assertThat(station.started).containsExactly("WH-0002/hub-5");
        FakeLink.Sent reply = l.on("qs/replies/1").get(0);
        assertThat(reply.correlation()).containsExactly(1, 2, 3);
        MessageSchemas.assertValid(reply.payload());
        assertThat(json(reply.payload()).get("ok").asBoolean()).isTrue();
    }

    @Test
    void refusesMalformedUnknownAndUnexpiringCommandsWithoutActing() throws Exception {
        cycle();
        FakeLink l = link();
        String cmd = publisher.topics().prefix() + "cmd/";
        l.events.message(cmd + "part", "{\"serial\":".getBytes(), 30L, "r/1", null);
        l.events.message(cmd + "self-destruct", "{}".getBytes(), 30L, "r/2", null);
        l.events.message(cmd + "part", "{\"serial\":\"A\",\"model\":\"B\"}".getBytes(), null, "r/3", null);
        l.events.message(cmd + "part", new byte[5000], 30L, "r/4", null);
        cycle();
        assertThat(station.started).isEmpty();
        assertThat(json(l.on("r/1").get(0).payload()).get("code").asText()).isEqualTo("MALFORMED");
        assertThat(json(l.on("r/2").get(0).payload()).get("code").asText()).isEqualTo("UNKNOWN_COMMAND");
        assertThat(json(l.on("r/3").get(0).payload()).get("code").asText()).isEqualTo("EXPIRY_REQUIRED");
        assertThat(json(l.on("r/4").get(0).payload()).get("code").asText()).isEqualTo("TOO_LARGE");
        for (String r : List.of("r/1", "r/2", "r/3", "r/4")) {
            MessageSchemas.assertValid(l.on(r).get(0).payload());
        }
    }

    @Test
    void answersStatusWithTheStationsActivityAndLastSeqs() throws Exception {
        sink.joint(Samples.joint(1, true));
        cycle();
        FakeLink l = link();
        l.events.message(publisher.topics().prefix() + "cmd/status", new byte[0], null, "r/s", new byte[] {9});
        cycle();
        byte[] reply = l.on("r/s").get(0).payload();
        MessageSchemas.assertValid(reply);
        JsonNode status = json(reply).get("status");
        assertThat(status.get("last_seq").get("joint").asLong()).isEqualTo(1);
        assertThat(status.get("activity").get("mode").asText()).isEqualTo("READY");
        assertThat(status.get("data_gaps").get("outside_rundowns").asLong()).isEqualTo(3);
        assertThat(status.get("data_gaps").get("during_rundowns").asLong()).isEqualTo(1);
    }

    @Test
    void publishesOfflineStatusAndDisconnectsCleanlyOnClose() throws Exception {
        cycle();
        publisher.onClose();
        FakeLink l = link();
        assertThat(l.disconnected).isTrue();
        byte[] last = l.on("/status").get(l.on("/status").size() - 1).payload();
        assertThat(json(last).get("state").asText()).isEqualTo("offline");
    }
}
