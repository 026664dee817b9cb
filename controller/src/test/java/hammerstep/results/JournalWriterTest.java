package hammerstep.results;

import hammerstep.results.journal.FileOutbox;
import hammerstep.station.VirtualClock;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicLong;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The journal writer's duty cycle driven by hand, over every outbox: a record is stored only when
 * the writer runs, answers come back in order, failures are answered (never dropped), and delivered
 * marks from the delivery view are written by the writer.
 */
class JournalWriterTest {

    @TempDir
    Path dir;

    private final List<Outbox> opened = new ArrayList<>();
    private final AtomicLong ids = new AtomicLong();

    @AfterEach
    void close() {
        opened.forEach(Outbox::close);
    }

    private Outbox open(String kind) throws Exception {
        Outbox box = switch (kind) {
            case "memory" -> new MemoryOutbox();
            case "file" -> FileOutbox.open(new StorageSettings(dir, 4096, 0, 1 << 30, 0, 0), () -> Long.MAX_VALUE);
            default -> throw new IllegalArgumentException(kind);
        };
        opened.add(box);
        return box;
    }

    private JournalWriter writer(Outbox box) {
        return new JournalWriter(new OutboxResultSink(box, new StationId("s", "l", "st"),
                () -> "id-" + ids.incrementAndGet(), new VirtualClock(Instant.EPOCH)), box, 4);
    }

    private static JournalWriter.Storable joint(int n) {
        JointOutcome j = Samples.joint(n, true);
        return sink -> sink.joint(j);
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void storesNothingUntilTheWriterRunsThenAnswersInOrderOneRecordACycle(String kind) throws Exception {
        Outbox box = open(kind);
        JournalWriter writer = writer(box);
        JournalWriter.Storable a = joint(1);
        JournalWriter.Storable b = joint(2);
        assertThat(writer.offer(a)).isTrue();
        assertThat(writer.offer(b)).isTrue();
        assertThat(box.backlog()).isZero();
        assertThat(writer.poll()).isNull();

        assertThat(writer.doWork()).isEqualTo(1);
        assertThat(box.backlog()).isEqualTo(1);
        assertThat(writer.doWork()).isEqualTo(1);
        assertThat(writer.doWork()).isZero();

        JournalWriter.Done first = writer.poll();
        JournalWriter.Done second = writer.poll();
        assertThat(first.record()).isSameAs(a);
        assertThat(first.stored()).isTrue();
        assertThat(first.receipt()).isEqualTo(new ResultSink.Receipt("id-1", 1));
        assertThat(second.record()).isSameAs(b);
        assertThat(second.receipt().seq()).isEqualTo(2);
        assertThat(writer.poll()).isNull();
        assertThat(box.pending(0, 10)).extracting(Outbox.Entry::seq).containsExactly(1L, 2L);
        assertThat(writer.stored()).isEqualTo(2);
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void deliveredMarksGoThroughTheWriter(String kind) throws Exception {
        Outbox box = open(kind);
        JournalWriter writer = writer(box);
        writer.offer(joint(1));
        writer.offer(joint(2));
        writer.doWork();
        writer.doWork();
        Outbox delivery = writer.forDelivery();
        List<Outbox.Entry> pending = delivery.pending(0, 10);
        assertThat(pending).hasSize(2);
        delivery.markDelivered(pending.get(0).position());
        assertThat(box.backlog()).as("not yet: the writer writes the mark").isEqualTo(2);
        assertThat(writer.doWork()).isEqualTo(1);
        assertThat(box.backlog()).isEqualTo(1);
        assertThat(delivery.pending(0, 10)).extracting(Outbox.Entry::position)
                .containsExactly(pending.get(1).position());
    }

    @Test
    void marksBeyondTheRingWaitOnTheDeliverySideAndNoneIsLost() throws Exception {
        Outbox box = open("memory");
        JournalWriter writer = writer(box); // a ring of 4 × 64 marks
        int n = 1000;
        for (int k = 0; k < n; k++) {
            box.append(MessageKind.EVENT, k + 1, "e" + k, new byte[] {1});
        }
        Outbox delivery = writer.forDelivery();
        for (int k = 1; k <= n; k++) {
            delivery.markDelivered(k);
        }
        int guard = 0;
        while (box.backlog() > 0 && guard++ < 100) {
            writer.doWork();
            delivery.pending(0, 1); // the delivery side's next cycle moves waiting marks on
        }
        assertThat(box.backlog()).isZero();
    }

    @Test
    void aRefusedRecordIsAnsweredWithItsReasonAndTheNextIsStillStored() throws Exception {
        Outbox box = open("memory");
        JournalWriter writer = writer(box);
        JournalWriter.Storable bad = sink -> {
            throw new ResultStoreException("disk gone");
        };
        writer.offer(bad);
        writer.offer(joint(1));
        writer.doWork();
        writer.doWork();
        JournalWriter.Done failed = writer.poll();
        assertThat(failed.stored()).isFalse();
        assertThat(failed.failure()).isEqualTo("disk gone");
        assertThat(failed.receipt()).isNull();
        assertThat(writer.poll().stored()).isTrue();
        assertThat(writer.failed()).isEqualTo(1);
    }

    @Test
    void theWriterStoresNoMoreThanTheStationHasRoomToHearOf() throws Exception {
        Outbox box = open("memory");
        JournalWriter writer = writer(box); // 4 answers
        for (int k = 0; k < 4; k++) {
            assertThat(writer.offer(joint(k))).isTrue();
        }
        assertThat(writer.offer(joint(9))).as("the request ring is full").isFalse();
        for (int k = 0; k < 4; k++) {
            writer.doWork();
        }
        assertThat(writer.offer(joint(5))).isTrue();
        assertThat(writer.doWork()).as("no room for a fifth answer").isZero();
        assertThat(box.backlog()).isEqualTo(4);
        writer.poll();
        assertThat(writer.doWork()).isEqualTo(1);
        assertThat(box.backlog()).isEqualTo(5);
    }

    @Test
    void aFullStoreIsSeenByTheStationSideAfterTheWrite() throws Exception {
        Outbox box = new MemoryOutbox(10, 5);
        JournalWriter writer = writer(box);
        assertThat(writer.storage()).isEqualTo(ResultSink.Storage.OK);
        writer.offer(joint(1));
        writer.doWork();
        assertThat(writer.storage()).isEqualTo(ResultSink.Storage.FULL);
    }
}
