package hammerstep.results.journal;

import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.Outbox.Loss;
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
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The journal loses its tail, a record, a segment or everything, with and without its high-water
 * file: no seq is ever given twice, every range of results that is gone is named once (kind and
 * seq range), and every record still there is still delivered.
 */
class JournalLossTest {

    @TempDir
    Path dir;

    private FileOutbox open() throws ResultStoreException {
        return FileOutbox.open(new StorageSettings(dir, 4096, 1 << 20, 1L << 30, 1000, 100), () -> Long.MAX_VALUE);
    }

    private static long add(Outbox box, MessageKind kind, String text) throws ResultStoreException {
        long seq = box.nextSeq(kind);
        return box.append(kind, seq, kind.topic() + "-" + seq, text.getBytes(StandardCharsets.UTF_8));
    }

    private static List<Long> seqs(Outbox box, MessageKind kind) throws ResultStoreException {
        return box.pending(0, 10_000).stream().filter(e -> e.kind() == kind).map(Outbox.Entry::seq).toList();
    }

    private List<Path> segments() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.filter(p -> p.getFileName().toString().endsWith(".hsj")).sorted().toList();
        }
    }

    /** Offsets at which the records of a segment start, in file order. */
    private static List<Integer> recordStarts(Path seg) throws IOException {
        ByteBuffer b = ByteBuffer.wrap(Files.readAllBytes(seg));
        List<Integer> starts = new ArrayList<>();
        int at = 0;
        while (at + JournalFormat.FRAME <= b.limit() && b.getInt(at) == JournalFormat.MAGIC) {
            starts.add(at);
            at += JournalFormat.FRAME + b.getInt(at + 4);
        }
        return starts;
    }

    /** Flips {@code mask} in the byte {@code past} bytes after {@code marker} in the first segment. */
    private void flip(String marker, int past, int mask) throws IOException {
        Path seg = segments().get(0);
        byte[] bytes = Files.readAllBytes(seg);
        bytes[new String(bytes, StandardCharsets.ISO_8859_1).indexOf(marker) + past] ^= (byte) mask;
        Files.write(seg, bytes);
    }

    private static void truncate(Path file, long size) throws IOException {
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.WRITE)) {
            ch.truncate(size);
        }
    }

    @Test
    void aTornTailOfAnAppendThePowerCutShortIsCutAndItsSeqGivenToTheNextResult() throws Exception {
        byte[] highWaterBefore;
        try (FileOutbox box = open()) {
            add(box, MessageKind.JOINT, "one");
            highWaterBefore = Files.readAllBytes(dir.resolve(HighWater.NAME));
            add(box, MessageKind.JOINT, "two");
        }
        // the power went while "two" was written: its record torn, the high-water file not yet written
        Path seg = segments().get(0);
        truncate(seg, Files.size(seg) - 5);
        Files.write(dir.resolve(HighWater.NAME), highWaterBefore);
        try (FileOutbox box = open()) {
            assertThat(box.recovery().tornBytes()).isPositive();
            assertThat(box.recovery().losses()).as("never confirmed: never shown, never sent").isEmpty();
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(2);
        }
    }

    @Test
    void aConfirmedRecordTornLaterNamesTheResultItTookAndItsSeqIsNotGivenAgain() throws Exception {
        try (FileOutbox box = open()) {
            add(box, MessageKind.JOINT, "one");
            add(box, MessageKind.JOINT, "two");
        }
        Path seg = segments().get(0);
        truncate(seg, Files.size(seg) - 5);
        try (FileOutbox box = open()) {
            assertThat(box.recovery().tornBytes()).isPositive();
            assertThat(box.recovery().losses()).containsExactly(new Loss(MessageKind.JOINT, 2, 2));
            assertThat(seqs(box, MessageKind.JOINT)).containsExactly(1L);
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(3);
            add(box, MessageKind.JOINT, "three");
            assertThat(seqs(box, MessageKind.JOINT)).containsExactly(1L, 3L);
        }
    }

    @Test
    void aFlippedByteNamesTheDamagedResultAndKeepsTheOnesAfterIt() throws Exception {
        try (FileOutbox box = open()) {
            add(box, MessageKind.PART, "first");
            add(box, MessageKind.PART, "second-damaged");
            add(box, MessageKind.PART, "third");
            add(box, MessageKind.EVENT, "an event");
        }
        flip("second-damaged", 3, 0x01);
        try (FileOutbox box = open()) {
            assertThat(box.recovery().losses()).containsExactly(new Loss(MessageKind.PART, 2, 2));
            assertThat(seqs(box, MessageKind.PART)).containsExactly(1L, 3L);
            assertThat(seqs(box, MessageKind.EVENT)).containsExactly(1L);
            assertThat(box.nextSeq(MessageKind.PART)).isEqualTo(4);
        }
    }

    @Test
    void aFlippedByteInTheLastRecordIsALossNotATornTailToForget() throws Exception {
        try (FileOutbox box = open()) {
            add(box, MessageKind.JOINT, "one");
            add(box, MessageKind.JOINT, "two-flipped");
        }
        flip("two-flipped", 1, 0x40);
        try (FileOutbox box = open()) {
            assertThat(box.recovery().losses()).containsExactly(new Loss(MessageKind.JOINT, 2, 2));
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(3);
        }
    }

    @Test
    void aZeroLengthNewestSegmentNamesItsResultsAndTheJournalGoesOn() throws Exception {
        try (FileOutbox box = open()) {
            for (int i = 0; i < 20; i++) {
                add(box, MessageKind.JOINT, i + ":" + "z".repeat(500));
            }
        }
        List<Path> segs = segments();
        Path newest = segs.get(segs.size() - 1);
        List<Long> inNewest;
        try (FileOutbox box = open()) {
            inNewest = box.pending(0, 100).stream().filter(e -> e.payload().length > 0)
                    .map(Outbox.Entry::seq).toList().subList(20 - (recordStarts(newest).size() - 1), 20);
        }
        truncate(newest, 0); // a card that acknowledged the writes and kept nothing
        try (FileOutbox box = open()) {
            assertThat(box.recovery().notes()).contains(newest.getFileName() + " is empty");
            assertThat(box.recovery().losses()).containsExactly(
                    new Loss(MessageKind.JOINT, inNewest.get(0), 20));
            assertThat(seqs(box, MessageKind.JOINT)).hasSize(20 - inNewest.size());
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(21);
            add(box, MessageKind.JOINT, "after");
        }
        try (FileOutbox box = open()) {
            assertThat(seqs(box, MessageKind.JOINT)).endsWith(21L);
        }
    }

    @Test
    void aMissingSegmentNamesItsResultsAndEverythingAfterItIsStillDelivered() throws Exception {
        try (FileOutbox box = open()) {
            for (int i = 0; i < 30; i++) {
                add(box, i % 3 == 0 ? MessageKind.EVENT : MessageKind.JOINT, i + ":" + "m".repeat(500));
            }
        }
        List<Path> segs = segments();
        assertThat(segs.size()).isGreaterThan(3);
        List<Outbox.Entry> before;
        try (FileOutbox box = open()) {
            before = box.pending(0, 100);
        }
        Path gone = segs.get(1);
        String goneText = new String(Files.readAllBytes(gone), StandardCharsets.ISO_8859_1);
        List<Outbox.Entry> inGone = before.stream() // the id and the payload follow each other in a record
                .filter(e -> goneText.contains(e.id() + new String(e.payload(), StandardCharsets.ISO_8859_1))).toList();
        Files.delete(gone);
        try (FileOutbox box = open()) {
            Outbox.Recovery r = box.recovery();
            assertThat(r.notes()).anyMatch(n -> n.contains("missing") && n.contains(gone.getFileName().toString()));
            List<Loss> expected = new ArrayList<>();
            for (MessageKind k : List.of(MessageKind.JOINT, MessageKind.EVENT)) {
                List<Long> s = inGone.stream().filter(e -> e.kind() == k).map(Outbox.Entry::seq).toList();
                if (!s.isEmpty()) {
                    expected.add(new Loss(k, s.get(0), s.get(s.size() - 1)));
                }
            }
            assertThat(r.losses()).containsExactlyInAnyOrderElementsOf(expected);
            List<Outbox.Entry> after = box.pending(0, 100);
            assertThat(after).hasSize(before.size() - inGone.size());
            assertThat(after.get(after.size() - 1).payload()).isEqualTo(before.get(before.size() - 1).payload());
        }
    }

    @Test
    void theLastRecordCutAtARecordBoundaryAfterDeliveryKeepsItsSeqFromComingBack() throws Exception {
        try (FileOutbox box = open()) {
            box.markDelivered(add(box, MessageKind.PART, "seq 1 GO"));
            box.markDelivered(add(box, MessageKind.PART, "seq 2 GO"));
            box.markDelivered(add(box, MessageKind.PART, "seq 3 GO COMPLETE"));
        }
        Path seg = segments().get(0);
        List<Integer> starts = recordStarts(seg);
        String text = new String(Files.readAllBytes(seg), StandardCharsets.ISO_8859_1);
        int third = text.indexOf("seq 3 GO COMPLETE");
        int cut = starts.stream().filter(s -> s < third).reduce((a, b) -> b).orElseThrow();
        truncate(seg, cut); // the record and its mark gone, cleanly, as if never written
        try (FileOutbox box = open()) {
            assertThat(box.recovery().tornBytes()).isZero();
            assertThat(box.recovery().losses()).containsExactly(new Loss(MessageKind.PART, 3, 3));
            assertThat(box.nextSeq(MessageKind.PART)).as("part seq 3 is never given to another result").isEqualTo(4);
        }
    }

    @Test
    void theOnlySegmentLostNamesEverySeqAndCountingGoesOnAboveThem() throws Exception {
        try (FileOutbox box = open()) {
            for (int i = 0; i < 16; i++) {
                add(box, MessageKind.JOINT, "j" + i);
            }
            add(box, MessageKind.PART, "p");
            add(box, MessageKind.EVENT, "e");
        }
        for (Path p : segments()) {
            Files.delete(p);
        }
        try (FileOutbox box = open()) {
            assertThat(box.recovery().losses()).containsExactly(new Loss(MessageKind.JOINT, 1, 16),
                    new Loss(MessageKind.PART, 1, 1), new Loss(MessageKind.EVENT, 1, 1));
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(17);
            assertThat(add(box, MessageKind.JOINT, "new")).as("positions are not given twice either").isGreaterThan(18);
        }
    }

    @Test
    void aLossReportedIsNotReportedAgainAndOneNotYetReportedIs() throws Exception {
        try (FileOutbox box = open()) {
            for (int i = 0; i < 3; i++) {
                add(box, MessageKind.JOINT, "j" + i);
            }
        }
        for (Path p : segments()) {
            Files.delete(p);
        }
        try (FileOutbox box = open()) {
            assertThat(box.unreportedLosses()).containsExactly(new Loss(MessageKind.JOINT, 1, 3));
            // the station stops before the alarm is stored: the next start finds the loss again
        }
        try (FileOutbox box = open()) {
            assertThat(box.unreportedLosses()).containsExactly(new Loss(MessageKind.JOINT, 1, 3));
            box.lossesReported(box.unreportedLosses());
            assertThat(box.unreportedLosses()).isEmpty();
            assertThat(box.losses()).containsExactly(new Loss(MessageKind.JOINT, 1, 3));
        }
        try (FileOutbox box = open()) {
            assertThat(box.recovery().losses()).isEmpty();
            assertThat(box.recovery().clean()).isTrue();
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(4);
        }
    }

    @Test
    void segmentsRetiredByRetentionAreNotLosses() throws Exception {
        try (FileOutbox box = FileOutbox.open(new StorageSettings(dir, 4096, 0, 1L << 30, 1000, 100),
                () -> Long.MAX_VALUE)) {
            for (int i = 0; i < 40; i++) {
                box.markDelivered(add(box, MessageKind.JOINT, "r".repeat(500)));
            }
            assertThat(segments().get(0).getFileName().toString()).isNotEqualTo("seg-0000000001.hsj");
        }
        try (FileOutbox box = open()) {
            assertThat(box.recovery().clean()).isTrue();
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(41);
        }
        Files.delete(dir.resolve(HighWater.NAME));
        try (FileOutbox box = open()) {
            assertThat(box.recovery().losses()).as("without the file, the oldest segment's start is the floor")
                    .isEmpty();
            assertThat(box.recovery().notes()).anyMatch(n -> n.contains("missing"));
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(41);
        }
    }

    @Test
    void aHighWaterFileLostWithAnIntactJournalLosesNothing() throws Exception {
        try (FileOutbox box = open()) {
            add(box, MessageKind.JOINT, "a");
            add(box, MessageKind.JOINT, "b");
        }
        Files.delete(dir.resolve(HighWater.NAME));
        try (FileOutbox box = open()) {
            assertThat(box.recovery().losses()).isEmpty();
            assertThat(box.recovery().notes()).anyMatch(n -> n.contains(HighWater.NAME) && n.contains("missing"));
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(3);
        }
        try (FileOutbox box = open()) {
            assertThat(box.recovery().clean()).as("the file is written again at opening").isTrue();
        }
    }

    @Test
    void aHighWaterSlotTornMidWriteLeavesTheOtherSlot() throws Exception {
        try (FileOutbox box = open()) {
            add(box, MessageKind.JOINT, "a");
            add(box, MessageKind.JOINT, "b");
            add(box, MessageKind.JOINT, "c");
        }
        // the newer slot torn: the other is one result behind, the journal holds the rest
        Path hw = dir.resolve(HighWater.NAME);
        byte[] b = Files.readAllBytes(hw);
        int newer = ByteBuffer.wrap(b).getLong(4) > ByteBuffer.wrap(b).getLong(4096 + 4) ? 0 : 4096;
        b[newer + 10] ^= 0x7f;
        Files.write(hw, b);
        try (FileOutbox box = open()) {
            assertThat(box.recovery().losses()).isEmpty();
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(4);
        }
    }

    @Test
    void theOnlySegmentAndTheHighWaterFileLostAreMadeGoodByTheCrossCheck() throws Exception {
        try (FileOutbox box = open()) {
            for (int i = 0; i < 16; i++) {
                add(box, MessageKind.JOINT, "old " + (i + 1));
            }
        }
        for (Path p : segments()) {
            Files.delete(p);
        }
        Files.delete(dir.resolve(HighWater.NAME));
        try (FileOutbox box = open()) {
            assertThat(box.recovery().losses()).as("nothing left to tell from a first start").isEmpty();
            add(box, MessageKind.JOINT, "new 1");
            add(box, MessageKind.EVENT, "new event");
            add(box, MessageKind.JOINT, "new 2");
            // the retained status of the run before says joint seq 16, event 0
            List<Loss> found = box.raiseSeqs(new long[] {16, 0, 0},
                    (payload, seq) -> (new String(payload, StandardCharsets.UTF_8) + " as " + seq)
                            .getBytes(StandardCharsets.UTF_8));
            assertThat(found).containsExactly(new Loss(MessageKind.JOINT, 1, 16));
            List<Outbox.Entry> pending = box.pending(0, 100);
            assertThat(pending).extracting(e -> new String(e.payload(), StandardCharsets.UTF_8))
                    .containsExactly("new 1 as 17", "new event", "new 2 as 18");
            assertThat(pending).extracting(Outbox.Entry::id).containsExactly("joint-1", "event-1", "joint-2");
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(19);
            assertThat(box.unreportedLosses()).containsExactly(new Loss(MessageKind.JOINT, 1, 16));
            assertThat(box.raiseSeqs(new long[] {16, 0, 0}, (p, s) -> p)).as("a second check finds nothing new")
                    .isEmpty();
        }
        try (FileOutbox box = open()) {
            assertThat(seqs(box, MessageKind.JOINT)).containsExactly(17L, 18L);
            assertThat(box.nextSeq(MessageKind.JOINT)).isEqualTo(19);
            assertThat(box.recovery().losses()).as("the loss, not yet reported, is found again")
                    .containsExactly(new Loss(MessageKind.JOINT, 1, 16));
        }
    }

    @Test
    void theOnlySegmentLostAndTheHighWaterFileDamagedSaySoAndTheCrossCheckMakesItGood() throws Exception {
        try (FileOutbox box = open()) {
            for (int i = 0; i < 5; i++) {
                add(box, MessageKind.PART, "old " + (i + 1));
            }
        }
        for (Path p : segments()) {
            Files.delete(p);
        }
        Path hw = dir.resolve(HighWater.NAME);
        byte[] b = Files.readAllBytes(hw);
        b[10] ^= 1;
        b[4096 + 10] ^= 1;
        Files.write(hw, b);
        try (FileOutbox box = open()) {
            assertThat(box.recovery().notes()).anyMatch(n -> n.contains(HighWater.NAME) && n.contains("damaged"));
            add(box, MessageKind.PART, "new");
            assertThat(box.raiseSeqs(new long[] {0, 5, 0}, (p, s) -> p))
                    .containsExactly(new Loss(MessageKind.PART, 1, 5));
            assertThat(seqs(box, MessageKind.PART)).containsExactly(6L);
        }
    }
}
