package hammerstep.results;

import hammerstep.results.journal.FileOutbox;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** The contract of {@link Outbox}, run against every implementation. */
class OutboxConformanceTest {

    @TempDir
    Path dir;

    private final List<Outbox> opened = new ArrayList<>();

    @AfterEach
    void close() {
        opened.forEach(Outbox::close);
    }

    /** An outbox whose storage reads LOW from about {@code lowBytes} and FULL from {@code maxBytes}. */
    private Outbox open(String kind, long maxBytes, long lowBytes) throws Exception {
        Outbox box = switch (kind) {
            case "memory" -> new MemoryOutbox(maxBytes, lowBytes);
            case "file" -> FileOutbox.open(new StorageSettings(dir, 4096, 0, maxBytes, 0, 0), () -> Long.MAX_VALUE);
            default -> throw new IllegalArgumentException(kind);
        };
        opened.add(box);
        return box;
    }

    private Outbox open(String kind) throws Exception {
        return open(kind, 1 << 30, 1 << 29);
    }

    private static long add(Outbox box, MessageKind kind, String text) throws ResultStoreException {
        long seq = box.nextSeq(kind);
        return box.append(kind, seq, kind.topic() + "-" + seq, text.getBytes(StandardCharsets.UTF_8));
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void sequencesCountPerKindFromOne(String kind) throws Exception {
        Outbox box = open(kind);
        add(box, MessageKind.JOINT, "j");
        add(box, MessageKind.JOINT, "j");
        add(box, MessageKind.PART, "p");
        assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(3);
        assertThat(box.nextSeq(MessageKind.PART)).isEqualTo(2);
        assertThat(box.nextSeq(MessageKind.EVENT)).isEqualTo(1);
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void refusesASeqOutOfOrder(String kind) throws Exception {
        Outbox box = open(kind);
        add(box, MessageKind.JOINT, "j");
        assertThatThrownBy(() -> box.append(MessageKind.JOINT, 3, "x", new byte[1]))
                .isInstanceOf(ResultStoreException.class).hasMessageContaining("expected 2");
        assertThat(box.backlog()).isEqualTo(1);
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void pendingReturnsRecordsInAppendOrderWithTheirPayload(String kind) throws Exception {
        Outbox box = open(kind);
        long a = add(box, MessageKind.JOINT, "first");
        long b = add(box, MessageKind.EVENT, "second");
        long c = add(box, MessageKind.JOINT, "third");
        List<Outbox.Entry> all = box.pending(0, 10);
        assertThat(all).extracting(Outbox.Entry::position).containsExactly(a, b, c);
        assertThat(new String(all.get(2).payload(), StandardCharsets.UTF_8)).isEqualTo("third");
        assertThat(all.get(2).seq()).isEqualTo(2);
        assertThat(all.get(1).id()).isEqualTo("event-1");
        assertThat(box.pending(a, 1)).extracting(Outbox.Entry::position).containsExactly(b);
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void deliveredRecordsLeaveThePendingList(String kind) throws Exception {
        Outbox box = open(kind);
        long a = add(box, MessageKind.JOINT, "a");
        long b = add(box, MessageKind.JOINT, "b");
        long c = add(box, MessageKind.JOINT, "c");
        box.markDelivered(b);
        box.markDelivered(b);
        box.markDelivered(999);
        assertThat(box.pending(0, 10)).extracting(Outbox.Entry::position).containsExactly(a, c);
        assertThat(box.backlog()).isEqualTo(2);
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void neverDropsAResultWhenFullAndRecoversRoomOnDelivery(String kind) throws Exception {
        Outbox box = open(kind, 64 * 1024, 48 * 1024);
        String big = "x".repeat(1000);
        List<Long> positions = new ArrayList<>();
        while (box.storage() != ResultSink.Storage.FULL) {
            positions.add(add(box, MessageKind.JOINT, big));
        }
        positions.add(add(box, MessageKind.JOINT, big));
        positions.add(add(box, MessageKind.JOINT, big));
        assertThat(box.storage()).isEqualTo(ResultSink.Storage.FULL);
        assertThat(box.backlog()).isEqualTo(positions.size());
        for (long p : positions) {
            box.markDelivered(p);
        }
        add(box, MessageKind.JOINT, big);
        assertThat(box.storage()).isEqualTo(ResultSink.Storage.OK);
        assertThat(box.backlog()).isEqualTo(1);
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void storageReadsLowBeforeFull(String kind) throws Exception {
        Outbox box = open(kind, 64 * 1024, 48 * 1024);
        List<ResultSink.Storage> seen = new ArrayList<>();
        while (box.storage() != ResultSink.Storage.FULL) {
            add(box, MessageKind.JOINT, "y".repeat(500));
            if (seen.isEmpty() || seen.get(seen.size() - 1) != box.storage()) {
                seen.add(box.storage());
            }
        }
        assertThat(seen).containsExactly(ResultSink.Storage.OK, ResultSink.Storage.LOW, ResultSink.Storage.FULL);
    }

    @ParameterizedTest
    @ValueSource(strings = {"memory", "file"})
    void aCrossCheckThatKnewHigherSeqsGivesThisRunsRecordsSeqsAboveThemInTheirOrder(String kind) throws Exception {
        Outbox box = open(kind);
        add(box, MessageKind.JOINT, "j");
        add(box, MessageKind.PART, "p");
        add(box, MessageKind.JOINT, "j");
        assertThat(box.raiseSeqs(new long[] {0, 0, 0}, (p, s) -> p)).isEmpty();
        List<Outbox.Loss> found = box.raiseSeqs(new long[] {5, 0, 0},
                (p, s) -> (new String(p, StandardCharsets.UTF_8) + s).getBytes(StandardCharsets.UTF_8));
        assertThat(found).containsExactly(new Outbox.Loss(MessageKind.JOINT, 1, 5));
        List<Outbox.Entry> all = box.pending(0, 10);
        assertThat(all).extracting(e -> new String(e.payload(), StandardCharsets.UTF_8))
                .containsExactly("j6", "p", "j7");
        assertThat(all).extracting(Outbox.Entry::id).containsExactly("joint-1", "part-1", "joint-2");
        assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(8);
        assertThat(box.losses()).containsExactly(new Outbox.Loss(MessageKind.JOINT, 1, 5));
        assertThat(box.unreportedLosses()).containsExactly(new Outbox.Loss(MessageKind.JOINT, 1, 5));
        box.lossesReported(box.unreportedLosses());
        assertThat(box.unreportedLosses()).isEmpty();
        assertThat(box.losses()).hasSize(1);
        assertThat(box.raiseSeqs(new long[] {5, 0, 0}, (p, s) -> p)).as("the same check again finds nothing").isEmpty();
        add(box, MessageKind.JOINT, "j");
        assertThat(box.pending(0, 10)).extracting(Outbox.Entry::seq).containsExactly(6L, 1L, 7L, 8L);
    }
}
