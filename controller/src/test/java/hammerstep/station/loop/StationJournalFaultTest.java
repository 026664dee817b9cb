package hammerstep.station.loop;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StationEvent;
import hammerstep.results.StationId;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
import hammerstep.station.LampMode;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleRing;
import hammerstep.station.TowerLamp;
import hammerstep.station.VirtualClock;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
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

    private static final double RATE = 20_000;
    private static final int BLOCK = 64;
    private static final long BLOCK_NS = (long) (BLOCK * 1e9 / RATE);
    private static final JointProgram FINAL = new JointProgram("final", "", new JointProgram.Torque(180, 200, 230),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 2, 40, 7.5),
            new JointProgram.Rundown(10, 60, 4000), 200, 0);
    private static final StationId ID = new StationId("s", "l", "st");

    @TempDir
    Path dir;

    private final AtomicLong freeBytes = new AtomicLong(Long.MAX_VALUE);
    private final VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
    private final SampleRing ring = new SampleRing(RATE, BLOCK, 16);
    private final Fakes.RecordingLamps lamps = new Fakes.RecordingLamps(4);
    private final Fakes.RecordingTool tool = new Fakes.RecordingTool();
    private final Fakes.Inputs inputs = new Fakes.Inputs();
    private final Fakes.Scanner scanner = new Fakes.Scanner();
    private final AtomicLong ids = new AtomicLong();
    private final List<StationEvent> events = new ArrayList<>();
    private final List<String> storeFailures = new ArrayList<>();
    private final Pattern pattern = new Pattern("p2", "", List.of("L", "R"), List.of(
            new Pattern.Pass("final", FINAL, Order.cross(2), 2, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
    private StationAgent agent;

    private boolean trigger;
    private long blowStartNs = Long.MIN_VALUE;
    private long nextBlowNs;
    private int blowNo;

    private FileOutbox openJournal() throws ResultStoreException {
        return FileOutbox.open(new StorageSettings(dir, 1 << 20, 1 << 20, 1L << 30, 1000, 100), freeBytes::get);
    }

    private void start(Outbox outbox) {
        ResultSink sink = new OutboxResultSink(outbox, ID, () -> "id-" + ids.incrementAndGet(),
                Clock.fixed(Instant.EPOCH, ZoneOffset.UTC));
        agent = new StationAgent(clock, new StationPorts(ring, lamps, tool, inputs, scanner), sink,
                new Sequence(clock, new Sequence.Settings("TQ-1", null, 300), false), Map.of("M", pattern),
                JointMonitor.replayConditioning(FINAL), 1_000_000_000L, new StationListener() {
                    @Override
                    public void onEvent(StationEvent event, ResultSink.Receipt receipt) {
                        events.add(event);
                    }

                    @Override
                    public void onStoreFailed(String message) {
                        storeFailures.add(message);
                    }
                }, t -> { throw new AssertionError(t); });
        agent.doWork();
    }

    private void cycle() {
        long t0 = clock.nanoTime();
        float[] block = new float[BLOCK];
        for (int i = 0; i < BLOCK; i++) {
            long t = t0 + (long) (i * 1e9 / RATE);
            if (trigger && tool.enabled && t - nextBlowNs >= 0) {
                blowStartNs = t;
                blowNo++;
                nextBlowNs = t + 20_000_000L;
            }
            double dt = (t - blowStartNs) * 1e-9;
            block[i] = dt >= 0 && dt < 0.002 ? (float) (45 * blowNo * Math.sin(Math.PI * dt / 0.002)) : 0f;
        }
        ring.offer(block, 0, BLOCK, t0);
        clock.advanceNs(BLOCK_NS);
        agent.doWork();
    }

    private void tighten() {
        blowNo = 0;
        nextBlowNs = clock.nanoTime();
        trigger = true;
        for (int k = 0; k < 200 && tool.enabled; k++) {
            cycle();
        }
        trigger = false;
        for (int k = 0; k < 40; k++) {
            cycle();
        }
    }

    private void onePart(String serial) {
        scanner.queue.add(new PartIdentity(serial, "M"));
        cycle();
        tighten();
        tighten();
        for (int k = 0; k < 200; k++) {
            cycle(); // the green hold ends
        }
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
            scanner.queue.add(new PartIdentity("SN-11", "M"));
            cycle();
            tighten();
            freeBytes.set(50); // the volume fills while the part is in work: its results are still stored
            tighten();
            for (int k = 0; k < 200; k++) {
                cycle();
            }
            assertThat(agent.sequence().phase()).isEqualTo(Phase.WAITING);
            before = payloads(box);
            assertThat(before).anySatisfy(p -> assertThat(p).contains("\"STORAGE_FULL\"").contains("ALARM"));
            assertThat(before.stream().filter(p -> p.contains(" PART ")).count()).isEqualTo(2);

            scanner.queue.add(new PartIdentity("SN-12", "M"));
            for (int k = 0; k < 20; k++) {
                cycle();
            }
            assertThat(agent.sequence().phase()).as("no part starts on a full store").isEqualTo(Phase.WAITING);
            assertThat(agent.sequence().part()).isNull();
            assertThat(tool.enabled).isFalse();
            assertThat(agent.sequence().tower(TowerLamp.WHITE)).isEqualTo(LampMode.OFF);
            assertThat(agent.sequence().tower(TowerLamp.YELLOW)).isEqualTo(LampMode.BLINKING);
            assertThat(payloads(box)).containsExactlyElementsOf(before);
        }
        try (FileOutbox box = openJournal()) {
            assertThat(payloads(box)).as("after a restart").containsExactlyElementsOf(before);
        }
    }

    @Test
    void aStoreThatFailsStopsTheToolKeepsTheVerdictBackAndStoresItOnTheKey() throws Exception {
        FailingOutbox box = new FailingOutbox();
        start(box);
        scanner.queue.add(new PartIdentity("SN-20", "M"));
        cycle();
        box.failing = true; // e.g. the medium went read-only
        tighten();
        assertThat(agent.sequence().phase()).isEqualTo(Phase.FAULT);
        assertThat(storeFailures).isNotEmpty();
        assertThat(tool.enabled).isFalse();
        assertThat(agent.sequence().tower(TowerLamp.RED)).isEqualTo(LampMode.BLINKING);
        assertThat(agent.sequence().tower(TowerLamp.GREEN)).as("no verdict shown before it is stored")
                .isEqualTo(LampMode.OFF);
        assertThat(box.backlog()).isZero();
        box.failing = false;
        inputs.key = true;
        cycle();
        inputs.key = false;
        cycle();
        assertThat(agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(box.pending(0, 10)).anySatisfy(e -> assertThat(e.kind()).isEqualTo(MessageKind.JOINT));
        tighten();
        for (int k = 0; k < 5; k++) {
            cycle();
        }
        assertThat(box.pending(0, 100).stream().filter(e -> e.kind() == MessageKind.JOINT)).hasSize(2);
        assertThat(box.pending(0, 100).stream().filter(e -> e.kind() == MessageKind.PART)).hasSize(1);
    }

    @Test
    void aPartInWorkWhenTheStationStoppedIsMarkedInterruptedAndNeedsTheSupervisorBeforeTheNextPart() throws Exception {
        try (FileOutbox box = openJournal()) {
            start(box);
            scanner.queue.add(new PartIdentity("SN-30", "M"));
            cycle();
            tighten(); // one of two positions done, then the power goes
            assertThat(box.pending(0, 100)).extracting(Outbox.Entry::kind).containsExactly(MessageKind.JOINT);
        }
        try (FileOutbox box = openJournal()) {
            start(box);
            assertThat(tool.enabled).isFalse();
            assertThat(agent.sequence().tower(TowerLamp.RED)).isEqualTo(LampMode.BLINKING);
            assertThat(agent.sequence().tower(TowerLamp.WHITE)).isEqualTo(LampMode.OFF);
            scanner.queue.add(new PartIdentity("SN-31", "M"));
            cycle();
            assertThat(agent.sequence().part().serial()).as("no new part before the key").isEqualTo("SN-30");
            inputs.key = true;
            cycle();
            inputs.key = false;
            cycle();
            List<Outbox.Entry> all = box.pending(0, 100);
            assertThat(all).extracting(Outbox.Entry::kind).containsExactly(MessageKind.JOINT, MessageKind.EVENT,
                    MessageKind.EVENT, MessageKind.PART);
            for (Outbox.Entry e : all) {
                hammerstep.results.MessageSchemas.assertValid(e.payload());
            }
            String part = new String(all.get(3).payload(), java.nio.charset.StandardCharsets.UTF_8);
            assertThat(part).contains("\"part_serial\":\"SN-30\"", "\"verdict\":\"NO_GO\"",
                    "\"ended\":\"INTERRUPTED\"", "\"joints\":[\"" + all.get(0).id() + "\"]");
            assertThat(events).extracting(StationEvent::code).contains("PART_INTERRUPTED", "IDENTITY_IGNORED");
            onePart("SN-32");
            assertThat(box.pending(0, 100).stream().filter(e -> e.kind() == MessageKind.PART)).hasSize(2);
        }
        try (FileOutbox box = openJournal()) {
            assertThat(box.unfinishedPartJoints()).as("closed: nothing to mark at the next start").isEmpty();
        }
    }

    /** An in-memory outbox whose appends can be made to fail. */
    private static final class FailingOutbox implements Outbox {
        private final MemoryOutbox inner = new MemoryOutbox();
        boolean failing;

        public long nextSeq(MessageKind kind) {
            return inner.nextSeq(kind);
        }

        public long append(MessageKind kind, long seq, String id, byte[] payload) throws ResultStoreException {
            if (failing) {
                throw new ResultStoreException("write failed: read-only file system");
            }
            return inner.append(kind, seq, id, payload);
        }

        public List<Entry> pending(long afterPosition, int max) throws ResultStoreException {
            return inner.pending(afterPosition, max);
        }

        public void markDelivered(long position) throws ResultStoreException {
            inner.markDelivered(position);
        }

        public long backlog() {
            return inner.backlog();
        }

        public ResultSink.Storage storage() {
            return inner.storage();
        }

        public Recovery recovery() {
            return inner.recovery();
        }

        @Override
        public List<Entry> unfinishedPartJoints() {
            return inner.unfinishedPartJoints();
        }

        public void close() {
            inner.close();
        }
    }
}
