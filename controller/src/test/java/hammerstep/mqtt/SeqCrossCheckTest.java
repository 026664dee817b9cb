package hammerstep.mqtt;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageKind;
import hammerstep.results.MessageSchemas;
import hammerstep.results.Outbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.Samples;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.station.FixedWallClock;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * The station reads its own retained status back at the first connect of a run: when the broker
 * knew higher seqs than the journal (journal and high-water file both gone), no result goes out
 * under a seq seen before, and the seqs in between are reported as lost.
 */
class SeqCrossCheckTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String STATUS = "hammerstep/v1/plant-north/axle-2/hub-fit-1/status";

    @TempDir
    Path dir;

    private long nowNs = 1_000_000_000L;
    private final List<FakeLink> links = new ArrayList<>();
    private final AtomicInteger ids = new AtomicInteger();
    private final List<Outbox> opened = new ArrayList<>();
    private OutboxResultSink sink;
    private ResultPublisher publisher;
    private byte[] retained;
    private boolean echo = true;
    private String refuse;

    @AfterEach
    void close() {
        opened.forEach(Outbox::close);
    }

    private void wire(Outbox outbox) {
        opened.add(outbox);
        FixedWallClock clock = new FixedWallClock(() -> nowNs, Samples.T0);
        sink = new OutboxResultSink(outbox, Samples.STATION, () -> "id-" + ids.incrementAndGet(), clock);
        publisher = new ResultPublisher(outbox, Samples.STATION, () -> {
            FakeLink l = new FakeLink();
            if (retained != null) {
                l.retained.put(STATUS, retained);
            }
            l.echo = echo;
            l.refuseSubscription = refuse;
            links.add(l);
            return l;
        }, new RecordingStation(), BrokerSettings.plain("tcp://127.0.0.1:1883", "hub-fit-1"), clock, 7,
                "test");
    }

    /** The retained status an earlier run of the station left on the broker. */
    private static byte[] earlierStatus(String state, long joint, long part, long event) {
        return ("{\"schema\":\"hammerstep.status.v1\",\"id\":\"s-1\",\"seq\":9,\"site\":\"plant-north\","
                + "\"line\":\"axle-2\",\"station\":\"hub-fit-1\",\"time\":\"2026-03-03T22:00:00.000Z\",\"state\":\""
                + state + "\",\"started\":\"2026-03-03T06:00:00.000Z\",\"last_seq\":{\"joint\":" + joint
                + ",\"part\":" + part + ",\"event\":" + event + "}}").getBytes(StandardCharsets.UTF_8);
    }

    private void cycle() {
        for (int i = 0; i < 5; i++) {
            publisher.doWork();
        }
    }

    private FakeLink link() {
        return links.get(links.size() - 1);
    }

    private static JsonNode json(byte[] b) throws Exception {
        return JSON.readTree(b);
    }

    private List<String> sentSeqs() throws Exception {
        List<String> out = new ArrayList<>();
        for (FakeLink.Sent s : link().results()) {
            JsonNode n = json(s.payload());
            out.add(s.topic().substring(s.topic().lastIndexOf('/') + 1) + " " + n.get("seq").asLong() + " "
                    + n.get("id").asText() + (n.has("code") ? " " + n.get("code").asText() : ""));
        }
        return out;
    }

    @Test
    void aStationThatLostJournalAndHighWaterFileSendsNoSeqTheBrokerHasSeenAndReportsTheGap() throws Exception {
        retained = earlierStatus("offline", 16, 3, 0);
        wire(new MemoryOutbox()); // all storage gone: the store starts from nothing
        sink.joint(Samples.joint(1, true)); // stored before the network is there, as seq 1
        cycle();
        assertThat(sentSeqs()).containsExactly("joint 17 id-1");
        MessageSchemas.assertValid(link().results().get(0).payload());
        nowNs += 61_000_000_000L; // the next status
        cycle();
        JsonNode status = json(link().on("/status").get(link().on("/status").size() - 1).payload());
        assertThat(status.get("last_seq").get("joint").asLong()).isEqualTo(17);
        assertThat(status.get("lost").toString()).isEqualTo(
                "[{\"kind\":\"joint\",\"first_seq\":1,\"last_seq\":16},{\"kind\":\"part\",\"first_seq\":1,\"last_seq\":3}]");
        MessageSchemas.assertValid(link().on("/status").get(link().on("/status").size() - 1).payload());

        sink.joint(Samples.joint(2, true)); // the next result brings the alarms with it
        cycle();
        assertThat(sentSeqs()).containsExactly("joint 17 id-1", "event 1 id-2 RESULTS_LOST",
                "event 2 id-3 RESULTS_LOST", "joint 18 id-4");
        String alarm = json(link().results().get(1).payload()).get("message").asText();
        assertThat(alarm).contains("joint seq 1 to 16").contains("16 stored joint results");
        assertThat(json(link().results().get(1).payload()).get("severity").asText()).isEqualTo("ALARM");
        for (FakeLink.Sent s : link().results()) {
            MessageSchemas.assertValid(s.payload());
        }
    }

    @Test
    void withTheFileJournalTheRaisedSeqsSurviveARestart() throws Exception {
        retained = earlierStatus("online", 16, 0, 0);
        FileOutbox box = FileOutbox.open(new StorageSettings(dir, 1 << 20, 1 << 20, 1L << 30, 1000, 100),
                () -> Long.MAX_VALUE);
        wire(box);
        sink.joint(Samples.joint(1, true));
        cycle();
        assertThat(sentSeqs()).containsExactly("joint 17 id-1");
        publisher.onClose();
        box.close();
        try (FileOutbox again = FileOutbox.open(new StorageSettings(dir, 1 << 20, 1 << 20, 1L << 30, 1000, 100),
                () -> Long.MAX_VALUE)) {
            assertThat(again.nextSeq(MessageKind.JOINT)).isEqualTo(18);
            assertThat(again.pending(0, 10)).extracting(Outbox.Entry::seq).containsExactly(17L);
            assertThat(again.recovery().losses()).as("not yet reported: found again")
                    .containsExactly(new Outbox.Loss(MessageKind.JOINT, 1, 16));
        }
    }

    @Test
    void aRetainedStatusTheJournalAlreadyCoversChangesNothing() throws Exception {
        retained = earlierStatus("online", 0, 0, 0);
        wire(new MemoryOutbox());
        sink.joint(Samples.joint(1, true));
        cycle();
        assertThat(sentSeqs()).containsExactly("joint 1 id-1");
        assertThat(json(link().on("/status").get(0).payload()).has("lost")).isFalse();
    }

    @Test
    void withoutAnEarlierStatusTheStationsOwnStatusComingBackEndsTheCheck() throws Exception {
        wire(new MemoryOutbox());
        sink.joint(Samples.joint(1, true));
        cycle();
        assertThat(sentSeqs()).containsExactly("joint 1 id-1");
    }

    @Test
    void resultsWaitForTheRetainedStatusUpToTheTimeLimit() throws Exception {
        echo = false; // nothing comes back
        wire(new MemoryOutbox());
        sink.joint(Samples.joint(1, true));
        cycle();
        assertThat(link().results()).as("held until the check is done").isEmpty();
        nowNs += 2_900_000_000L;
        cycle();
        assertThat(link().results()).isEmpty();
        nowNs += 200_000_000L;
        cycle();
        assertThat(sentSeqs()).containsExactly("joint 1 id-1");
    }

    @Test
    void aRefusedSubscriptionDoesNotHoldResults() throws Exception {
        refuse = STATUS;
        wire(new MemoryOutbox());
        sink.joint(Samples.joint(1, true));
        cycle();
        assertThat(publisher.figures().connected()).isTrue();
        assertThat(sentSeqs()).containsExactly("joint 1 id-1");
    }

    @Test
    void restampRewritesOnlyTheSeqField() throws Exception {
        byte[] in = "{\"schema\":\"s\",\"id\":\"a\",\"seq\":7,\"message\":\"\\\"seq\\\":3\"}".getBytes(StandardCharsets.UTF_8);
        assertThat(new String(SeqCrossCheck.restamp(in, 1234), StandardCharsets.UTF_8))
                .isEqualTo("{\"schema\":\"s\",\"id\":\"a\",\"seq\":1234,\"message\":\"\\\"seq\\\":3\"}");
        assertThatThrownBy(() -> SeqCrossCheck.restamp("{}".getBytes(StandardCharsets.UTF_8), 1))
                .isInstanceOf(ResultStoreException.class);
    }
}
