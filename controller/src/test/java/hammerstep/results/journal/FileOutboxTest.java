package hammerstep.results.journal;

import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.ResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StorageSettings;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;
import java.util.concurrent.atomic.AtomicLong;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class FileOutboxTest {

    @TempDir
    Path dir;

    private final AtomicLong freeBytes = new AtomicLong(Long.MAX_VALUE);

    private FileOutbox open(long segmentBytes, long retainBytes) throws ResultStoreException {
        return FileOutbox.open(new StorageSettings(dir, segmentBytes, retainBytes, 1L << 30, 1000, 100),
                freeBytes::get);
    }

    private FileOutbox open() throws ResultStoreException {
        return open(1 << 20, 1 << 20);
    }

    private static long add(Outbox box, String text) throws ResultStoreException {
        long seq = box.nextSeq(MessageKind.JOINT);
        return box.append(MessageKind.JOINT, seq, "id-" + seq, text.getBytes(StandardCharsets.UTF_8));
    }

    private List<Path> segments() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.filter(p -> p.getFileName().toString().endsWith(".hsj")).sorted().toList();
        }
    }

    private static String text(Outbox.Entry e) {
        return new String(e.payload(), StandardCharsets.UTF_8);
    }

    @Test
    void restartResumesSequencesAndPendingRecords() throws Exception {
        try (FileOutbox box = open()) {
            long a = add(box, "a");
            add(box, "b");
            box.append(MessageKind.PART, 1, "p1", "p".getBytes());
            box.markDelivered(a);
        }
        try (FileOutbox box = open()) {
            assertThat(box.recovery().clean()).isTrue();
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(3);
            assertThat(box.nextSeq(MessageKind.PART)).isEqualTo(2);
            assertThat(box.pending(0, 10)).extracting(FileOutboxTest::text).containsExactly("b", "p");
            assertThat(box.pending(0, 10).get(0).id()).isEqualTo("id-2");
            long c = add(box, "c");
            assertThat(c).isEqualTo(4);
        }
    }

    @Test
    void cutsATornTailAndReportsIt() throws Exception {
        try (FileOutbox box = open()) {
            add(box, "kept");
            add(box, "torn-away");
        }
        Path seg = segments().get(0);
        long size = Files.size(seg);
        try (FileChannel ch = FileChannel.open(seg, StandardOpenOption.WRITE)) {
            ch.truncate(size - 5);
        }
        try (FileOutbox box = open()) {
            Outbox.Recovery r = box.recovery();
            assertThat(r.clean()).isFalse();
            assertThat(r.tornBytes()).isGreaterThan(0);
            assertThat(r.notes()).anyMatch(n -> n.contains("torn tail"));
            assertThat(box.pending(0, 10)).extracting(FileOutboxTest::text).containsExactly("kept");
            assertThat(box.nextSeq(MessageKind.JOINT)).as("the torn record's seq is gone, not given again").isEqualTo(3);
            box.lossesReported(box.unreportedLosses()); // as the station's sink does with its alarm
            add(box, "after");
        }
        try (FileOutbox box = open()) {
            assertThat(box.recovery().clean()).isTrue();
            assertThat(box.pending(0, 10)).extracting(FileOutboxTest::text).containsExactly("kept", "after");
        }
    }

    @Test
    void skipsARecordWhoseChecksumFailsAndKeepsTheOnesAfterIt() throws Exception {
        try (FileOutbox box = open()) {
            add(box, "one");
            add(box, "two-damaged");
            add(box, "three");
        }
        Path seg = segments().get(0);
        byte[] bytes = Files.readAllBytes(seg);
        int at = new String(bytes, StandardCharsets.ISO_8859_1).indexOf("two-damaged");
        bytes[at + 2] ^= 0x20;
        Files.write(seg, bytes);
        try (FileOutbox box = open()) {
            assertThat(box.recovery().notes()).anyMatch(n -> n.contains("damaged bytes"));
            assertThat(box.pending(0, 10)).extracting(FileOutboxTest::text).containsExactly("one", "three");
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(4);
        }
    }

    @Test
    void rotatesSegmentsAndReadsAcrossThem() throws Exception {
        try (FileOutbox box = open(4096, 1 << 20)) {
            for (int i = 0; i < 20; i++) {
                add(box, i + ":" + "z".repeat(500));
            }
            assertThat(box.segmentCount()).isGreaterThan(2);
            assertThat(box.pending(0, 100)).hasSize(20);
        }
        assertThat(segments().size()).isGreaterThan(2);
        try (FileOutbox box = open(4096, 1 << 20)) {
            List<Outbox.Entry> all = box.pending(0, 100);
            assertThat(all).hasSize(20);
            assertThat(text(all.get(19))).startsWith("19:");
        }
    }

    @Test
    void retentionDeletesOnlyDeliveredSegmentsOldestFirst() throws Exception {
        try (FileOutbox box = open(4096, 0)) {
            List<Long> positions = new java.util.ArrayList<>();
            for (int i = 0; i < 30; i++) {
                positions.add(add(box, "r".repeat(500)));
            }
            int before = box.segmentCount();
            for (int i = 10; i < 30; i++) {
                box.markDelivered(positions.get(i));
            }
            assertThat(box.segmentCount()).as("record 0..9 pending in the oldest segments").isEqualTo(before);
            for (int i = 0; i < 10; i++) {
                box.markDelivered(positions.get(i));
            }
            add(box, "next");
            assertThat(box.segmentCount()).isLessThanOrEqualTo(2);
            assertThat(box.pending(0, 100)).extracting(FileOutboxTest::text).containsExactly("next");
        }
        try (FileOutbox box = open(4096, 0)) {
            assertThat(box.nextSeq(MessageKind.JOINT)).as("counters survive deleted segments").isEqualTo(32);
            assertThat(box.backlog()).isEqualTo(1);
        }
    }

    @Test
    void keepsDeliveredSegmentsUpToTheRetentionLimit() throws Exception {
        try (FileOutbox box = open(4096, 16 * 1024)) {
            for (int i = 0; i < 60; i++) {
                box.markDelivered(add(box, "k".repeat(500)));
            }
            long delivered = box.journalBytes();
            assertThat(delivered).isBetween(16L * 1024, 16L * 1024 + 2 * 4096);
        }
    }

    @Test
    void readsLowThenFullAsTheVolumeFillsButStillStores() throws Exception {
        try (FileOutbox box = open()) {
            add(box, "a");
            assertThat(box.storage()).isEqualTo(ResultSink.Storage.OK);
            freeBytes.set(500);
            add(box, "b");
            assertThat(box.storage()).isEqualTo(ResultSink.Storage.LOW);
            freeBytes.set(50);
            add(box, "c");
            assertThat(box.storage()).isEqualTo(ResultSink.Storage.FULL);
            assertThat(box.backlog()).isEqualTo(3);
        }
    }

    @Test
    void aSecondProcessCannotOpenTheSameOutbox() throws Exception {
        try (FileOutbox box = open()) {
            add(box, "a");
            assertThatThrownBy(this::open).isInstanceOf(ResultStoreException.class);
        }
    }

    @Test
    void aTornSegmentStartIsRewritten() throws Exception {
        try (FileOutbox box = open(4096, 1 << 20)) {
            for (int i = 0; i < 9; i++) {
                add(box, "s".repeat(500));
            }
        }
        List<Path> segs = segments();
        Path last = segs.get(segs.size() - 1);
        try (FileChannel ch = FileChannel.open(last, StandardOpenOption.WRITE)) {
            ch.truncate(3);
        }
        try (FileOutbox box = open(4096, 1 << 20)) {
            assertThat(box.recovery().tornBytes()).isEqualTo(3);
            long seqAfter = box.nextSeq(MessageKind.JOINT);
            add(box, "t");
            assertThat(box.pending(0, 100).get(box.pending(0, 100).size() - 1).seq()).isEqualTo(seqAfter);
        }
        ByteBuffer head = ByteBuffer.wrap(Files.readAllBytes(last));
        assertThat(head.getInt(0)).isEqualTo(JournalFormat.MAGIC);
        assertThat(head.get(JournalFormat.FRAME)).isEqualTo(JournalFormat.START);
    }
}
