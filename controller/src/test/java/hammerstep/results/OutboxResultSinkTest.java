package hammerstep.results;

import hammerstep.station.VirtualClock;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

class OutboxResultSinkTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private final AtomicInteger next = new AtomicInteger();
    private final VirtualClock clock = new VirtualClock(Samples.T0);

    private OutboxResultSink sink(Outbox box) {
        return new OutboxResultSink(box, Samples.STATION, () -> "id-" + next.incrementAndGet(), clock);
    }

    private static JsonNode json(Outbox.Entry e) throws Exception {
        return JSON.readTree(e.payload());
    }

    @Test
    void storesEachResultWithItsIdAndTheNextSeqOfItsKind() throws Exception {
        MemoryOutbox box = new MemoryOutbox();
        OutboxResultSink sink = sink(box);
        ResultSink.Receipt j1 = sink.joint(Samples.joint(1, true));
        ResultSink.Receipt j2 = sink.joint(Samples.joint(2, true));
        ResultSink.Receipt p = sink.part(Samples.part(List.of(j1.id(), j2.id())));
        ResultSink.Receipt e = sink.event(Samples.event());
        assertThat(List.of(j1.seq(), j2.seq(), p.seq(), e.seq())).containsExactly(1L, 2L, 1L, 1L);
        List<Outbox.Entry> stored = box.pending(0, 10);
        assertThat(stored).hasSize(4);
        for (Outbox.Entry entry : stored) {
            MessageSchemas.assertValid(entry.payload());
            assertThat(json(entry).get("id").asText()).isEqualTo(entry.id());
            assertThat(json(entry).get("seq").asLong()).isEqualTo(entry.seq());
        }
        assertThat(json(stored.get(2)).get("joints").toString()).isEqualTo("[\"id-1\",\"id-2\"]");
    }

    @Test
    void recordsAStorageEventWhenRoomChanges() throws Exception {
        MemoryOutbox box = new MemoryOutbox(4000, 2000);
        OutboxResultSink sink = sink(box);
        while (sink.storage() != ResultSink.Storage.FULL) {
            sink.joint(Samples.joint(1, true));
        }
        List<String> codes = new java.util.ArrayList<>();
        for (Outbox.Entry entry : box.pending(0, 100)) {
            MessageSchemas.assertValid(entry.payload());
            if (entry.kind() == MessageKind.EVENT) {
                codes.add(json(entry).get("code").asText());
            }
        }
        assertThat(codes).containsExactly("STORAGE_LOW", "STORAGE_FULL");
        for (Outbox.Entry entry : box.pending(0, 100)) {
            box.markDelivered(entry.position());
        }
        sink.joint(Samples.joint(1, true));
        assertThat(box.pending(0, 100)).extracting(Outbox.Entry::kind)
                .containsExactly(MessageKind.JOINT, MessageKind.EVENT);
    }

    @Test
    void reportsARepairedStoreOnce() throws Exception {
        MemoryOutbox inner = new MemoryOutbox();
        Outbox damaged = new DelegatingOutbox(inner,
                new Outbox.Recovery(1, 3, 1, 17, List.of("seg-0000000001.hsj: cut a torn tail of 17 bytes")));
        OutboxResultSink sink = sink(damaged);
        sink.joint(Samples.joint(1, true));
        sink.joint(Samples.joint(2, true));
        List<Outbox.Entry> stored = inner.pending(0, 10);
        assertThat(stored).extracting(Outbox.Entry::kind)
                .containsExactly(MessageKind.EVENT, MessageKind.JOINT, MessageKind.JOINT);
        assertThat(json(stored.get(0)).get("code").asText()).isEqualTo("OUTBOX_RECOVERED");
        assertThat(json(stored.get(0)).get("message").asText()).contains("torn tail");
    }

    /** An outbox that reports a given recovery. */
    private static final class DelegatingOutbox extends ForwardingOutbox {
        private final Recovery recovery;

        DelegatingOutbox(Outbox inner, Recovery recovery) {
            super(inner);
            this.recovery = recovery;
        }

        @Override
        public Recovery recovery() {
            return recovery;
        }
    }
}
