package hammerstep.station.loop;

import hammerstep.results.ForwardingOutbox;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.sequence.Phase;
import hammerstep.station.LampMode;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.concurrent.atomic.AtomicLong;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Faults of the result store under the running station: power lost in the middle of writing the
 * last record (a torn tail, cut at every byte of it, or followed by zeros or junk), the volume
 * filling up, and a store that fails outright. Nothing already stored may be lost or changed; a new
 * part is refused with a clear lamp and event while the store is full.
 */
class StationJournalFaultTest {

    @TempDir
    Path dir;

    private final AtomicLong freeBytes = new AtomicLong(Long.MAX_VALUE);
    private final StationFixture station = new StationFixture();

    private FileOutbox openJournal() throws ResultStoreException {
        return FileOutbox.open(new StorageSettings(dir, 1 << 20, 1 << 20, 1L << 30, 1000, 100), freeBytes::get);
    }

    private void start(Outbox outbox) {
        station.start(outbox, StationFixture.replayConditioning(), t -> { throw new AssertionError(t); });
        station.agent.doWork();
    }

    private void onePart(String serial) {
        station.scanPart(serial);
        station.tighten();
        station.tighten();
        station.cycles(200); // the green hold ends
    }

    private static List<String> payloads(Outbox box) throws ResultStoreException {
        return box.pending(0, 10_000).stream().map(e -> e.id() + " " + e.kind() + " " + e.seq() + " "
                + new String(e.payload(), java.nio.charset.StandardCharsets.UTF_8)).toList();
    }

    private Path segment() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.filter(p -> p.getFileName().toString().endsWith(".hsj")).sorted().reduce((a, b) -> b).orElseThrow();
        }
    }

    @Test
    void aRecordTornAtAnyByteIsCutAtStartReportedAndEveryEarlierRecordIsKept() throws Exception {
        try (FileOutbox box = openJournal()) {
            start(box);
            onePart("SN-1");
            onePart("SN-2");
        }
        Path seg = segment();
        byte[] whole = Files.readAllBytes(seg);
        List<String> all;
        try (FileOutbox box = openJournal()) {
            all = payloads(box);
        }
        // the last record's extent: the journal without it is what a reopened store must keep
        try (FileOutbox box = openJournal()) {
            assertThat(box.recovery().clean()).isTrue();
        }
        int lastRecordBytes = lastRecordBytes(whole, all);
        Random rnd = new Random(11);
        for (int cut = 1; cut < lastRecordBytes; cut++) {
            for (int tail = 0; tail < 3; tail++) {
                byte[] torn = Arrays.copyOf(whole, whole.length - cut + (tail == 0 ? 0 : cut));
                if (tail == 2) {
                    for (int i = whole.length - cut; i < torn.length; i++) {
                        torn[i] = (byte) rnd.nextInt(256);
                    }
                } // tail 1: zeros where the record was (a preallocated block that was never written)
                if (Arrays.equals(torn, whole)) {
                    continue; // the bytes zeroed were zeros already
                }
                Files.write(seg, torn);
                try (FileOutbox box = openJournal()) {
                    assertThat(box.recovery().clean()).as("cut %d tail %d", cut, tail).isFalse();
                    assertThat(payloads(box)).as("cut %d tail %d", cut, tail)
                            .containsExactlyElementsOf(all.subList(0, all.size() - 1));
                }
            }
        }
        // the station reports the repair in its first record after the restart
        Files.write(seg, Arrays.copyOf(whole, whole.length - 7));
        try (FileOutbox box = openJournal()) {
            start(box);
            onePart("SN-3");
            assertThat(payloads(box)).anySatisfy(p -> assertThat(p).contains("OUTBOX_RECOVERED").contains("torn"));
            assertThat(payloads(box).subList(0, all.size() - 1)).containsExactlyElementsOf(all.subList(0, all.size() - 1));
        }
    }

    /** Bytes of the last record: the shortest cut after which a reopened store no longer has it. */
    private int lastRecordBytes(byte[] whole, List<String> all) throws Exception {
        Path seg = segment();
        for (int cut = 1; cut < whole.length; cut++) {
            Files.write(seg, Arrays.copyOf(whole, whole.length - cut));
            try (FileOutbox box = openJournal()) {
                if (payloads(box).size() < all.size() - 1) {
                    Files.write(seg, whole);
                    return cut - 1;
                }
            }
        }
        throw new AssertionError("no record boundary found");
    }

    @Test
    void aFullVolumeRefusesTheNextPartWithLampAndEventAndLosesNothingStored() throws Exception {
        List<String> before;
        try (FileOutbox box = openJournal()) {
            start(box);
            onePart("SN-10");
            station.scanner.queue.add(new PartIdentity("SN-11", "M"));
            station.cycle();
            station.tighten();
            freeBytes.set(50); // the volume fills while the part is in work: its results are still stored
            station.tighten();
            for (int k = 0; k < 200; k++) {
                station.cycle();
            }
            assertThat(station.agent.sequence().phase()).isEqualTo(Phase.WAITING);
            before = payloads(box);
            assertThat(before).anySatisfy(p -> assertThat(p).contains("\"STORAGE_FULL\"").contains("ALARM"));
            assertThat(before.stream().filter(p -> p.contains(" PART ")).count()).isEqualTo(2);

            station.scanner.queue.add(new PartIdentity("SN-12", "M"));
            for (int k = 0; k < 20; k++) {
                station.cycle();
            }
            assertThat(station.agent.sequence().phase()).as("no part starts on a full store").isEqualTo(Phase.WAITING);
            assertThat(station.agent.sequence().part()).isNull();
            assertThat(station.tool.enabled).isFalse();
            assertThat(station.agent.sequence().tower(TowerLamp.WHITE)).isEqualTo(LampMode.OFF);
            assertThat(station.agent.sequence().tower(TowerLamp.YELLOW)).isEqualTo(LampMode.BLINKING);
            assertThat(payloads(box)).containsExactlyElementsOf(before);
        }
        try (FileOutbox box = openJournal()) {
            assertThat(payloads(box)).as("after a restart").containsExactlyElementsOf(before);
        }
    }

    @Test
    void aStoreFullAtStartRefusesTheFirstPartAsWhenItFillsInService() throws Exception {
        freeBytes.set(50); // the volume was full before the station started
        try (FileOutbox box = openJournal()) {
            new hammerstep.results.OutboxResultSink(box, new hammerstep.results.StationId("s", "l", "st"))
                    .reportStorageAtStart(); // as the service does when it opens the journal
            start(box);
            station.scanner.queue.add(new PartIdentity("SN-30", "M"));
            for (int k = 0; k < 20; k++) {
                station.cycle();
            }
            assertThat(station.agent.sequence().phase()).as("no part starts on a full store").isEqualTo(Phase.WAITING);
            assertThat(station.agent.sequence().part()).isNull();
            assertThat(station.tool.enabled).isFalse();
            assertThat(station.agent.sequence().tower(TowerLamp.WHITE)).isEqualTo(LampMode.OFF);
            assertThat(station.agent.sequence().tower(TowerLamp.YELLOW)).isEqualTo(LampMode.BLINKING);
            List<String> stored = payloads(box);
            assertThat(stored).hasSize(1);
            assertThat(stored.get(0)).contains("\"STORAGE_FULL\"").contains("ALARM").contains("full at start");
        }
    }

    @Test
    void aStoreThatFailsStopsTheToolKeepsTheVerdictBackAndStoresItOnTheKey() throws Exception {
        FailingOutbox box = new FailingOutbox();
        start(box);
        station.scanner.queue.add(new PartIdentity("SN-20", "M"));
        station.cycle();
        box.failing = true; // e.g. the medium went read-only
        station.tighten();
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.FAULT);
        assertThat(station.storeFailures).isNotEmpty();
        assertThat(station.tool.enabled).isFalse();
        assertThat(station.agent.sequence().tower(TowerLamp.RED)).isEqualTo(LampMode.BLINKING);
        assertThat(station.agent.sequence().tower(TowerLamp.GREEN)).as("no verdict shown before it is stored")
                .isEqualTo(LampMode.OFF);
        assertThat(box.backlog()).isZero();
        box.failing = false;
        station.inputs.key = true;
        station.cycle();
        station.inputs.key = false;
        station.cycle();
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(box.pending(0, 10)).anySatisfy(e -> assertThat(e.kind()).isEqualTo(MessageKind.JOINT));
        station.tighten();
        for (int k = 0; k < 5; k++) {
            station.cycle();
        }
        assertThat(box.pending(0, 100).stream().filter(e -> e.kind() == MessageKind.JOINT)).hasSize(2);
        assertThat(box.pending(0, 100).stream().filter(e -> e.kind() == MessageKind.PART)).hasSize(1);
    }

    @Test
    void aPartInWorkWhenTheStationStoppedIsMarkedInterruptedAndNeedsTheSupervisorBeforeTheNextPart() throws Exception {
        try (FileOutbox box = openJournal()) {
            start(box);
            station.scanner.queue.add(new PartIdentity("SN-30", "M"));
            station.cycle();
            station.tighten(); // one of two positions done, then the power goes
            assertThat(box.pending(0, 100)).extracting(Outbox.Entry::kind).containsExactly(MessageKind.JOINT);
        }
        try (FileOutbox box = openJournal()) {
            start(box);
            assertThat(station.tool.enabled).isFalse();
            assertThat(station.agent.sequence().tower(TowerLamp.RED)).isEqualTo(LampMode.BLINKING);
            assertThat(station.agent.sequence().tower(TowerLamp.WHITE)).isEqualTo(LampMode.OFF);
            station.scanner.queue.add(new PartIdentity("SN-31", "M"));
            station.cycle();
            assertThat(station.agent.sequence().part().serial()).as("no new part before the key").isEqualTo("SN-30");
            station.inputs.key = true;
            station.cycle();
            station.inputs.key = false;
            station.cycle();
            List<Outbox.Entry> all = box.pending(0, 100);
            assertThat(all).extracting(Outbox.Entry::kind).containsExactly(MessageKind.JOINT, MessageKind.EVENT,
                    MessageKind.EVENT, MessageKind.PART);
            for (Outbox.Entry e : all) {
                hammerstep.results.MessageSchemas.assertValid(e.payload());
            }
            String part = new String(all.get(3).payload(), java.nio.charset.StandardCharsets.UTF_8);
            assertThat(part).contains("\"part_serial\":\"SN-30\"", "\"verdict\":\"NO_GO\"",
                    "\"ended\":\"INTERRUPTED\"", "\"joints\":[\"" + all.get(0).id() + "\"]");
            assertThat(station.events).extracting(hammerstep.results.StationEvent::code).contains("PART_INTERRUPTED", "IDENTITY_IGNORED");
            onePart("SN-32");
            assertThat(box.pending(0, 100).stream().filter(e -> e.kind() == MessageKind.PART)).hasSize(2);
        }
        try (FileOutbox box = openJournal()) {
            assertThat(box.unfinishedPartJoints()).as("closed: nothing to mark at the next start").isEmpty();
        }
    }

    @Test
    void theOnlySegmentLostIsReportedByKindAndRangeAndSeqGoesOnAboveIt() throws Exception {
        List<Outbox.Entry> before;
        try (FileOutbox box = openJournal()) {
            start(box);
            onePart("SN-40");
            onePart("SN-41");
            before = box.pending(0, 100);
            for (Outbox.Entry e : before) {
                box.markDelivered(e.position()); // all delivered: the subscriber has them
            }
        }
        long lastJoint = lastSeq(before, MessageKind.JOINT);
        long lastPart = lastSeq(before, MessageKind.PART);
        assertThat(lastJoint).isEqualTo(4);
        try (Stream<Path> s = Files.list(dir)) {
            for (Path p : s.filter(p -> p.getFileName().toString().endsWith(".hsj")).toList()) {
                Files.delete(p); // a restore that left the journal out
            }
        }
        try (FileOutbox box = openJournal()) {
            start(box);
            onePart("SN-42");
            List<Outbox.Entry> after = box.pending(0, 100);
            List<String> alarms = after.stream().filter(e -> e.kind() == MessageKind.EVENT)
                    .map(e -> new String(e.payload(), java.nio.charset.StandardCharsets.UTF_8))
                    .filter(p -> p.contains("\"RESULTS_LOST\"")).toList();
            assertThat(alarms).hasSize(2);
            assertThat(alarms.get(0)).contains("\"ALARM\"", "joint seq 1 to " + lastJoint);
            assertThat(alarms.get(1)).contains("\"ALARM\"", "part seq " + (lastPart == 1 ? "1" : "1 to " + lastPart));
            assertThat(after.stream().filter(e -> e.kind() == MessageKind.JOINT).map(Outbox.Entry::seq))
                    .containsExactly(lastJoint + 1, lastJoint + 2);
            assertThat(after.stream().filter(e -> e.kind() == MessageKind.PART).map(Outbox.Entry::seq))
                    .containsExactly(lastPart + 1);
            for (Outbox.Entry e : after) {
                hammerstep.results.MessageSchemas.assertValid(e.payload());
            }
        }
        try (FileOutbox box = openJournal()) {
            assertThat(box.recovery().losses()).as("reported once, not at every start").isEmpty();
        }
    }

    private static long lastSeq(List<Outbox.Entry> entries, MessageKind kind) {
        return entries.stream().filter(e -> e.kind() == kind).mapToLong(Outbox.Entry::seq).max().orElse(0);
    }

    /** An in-memory outbox whose appends can be made to fail. */
    private static final class FailingOutbox extends ForwardingOutbox {
        boolean failing;

        FailingOutbox() {
            super(new MemoryOutbox());
        }

        @Override
        public long append(MessageKind kind, long seq, String id, byte[] payload) throws ResultStoreException {
            if (failing) {
                throw new ResultStoreException("write failed: read-only file system");
            }
            return super.append(kind, seq, id, payload);
        }
    }
}
