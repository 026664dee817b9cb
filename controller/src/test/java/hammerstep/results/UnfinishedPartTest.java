package hammerstep.results;

import hammerstep.results.journal.FileOutbox;
import hammerstep.station.VirtualClock;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

/** A part in work when the station stopped: found in the journal at the next start. */
class UnfinishedPartTest {

    @TempDir
    Path dir;

    private final AtomicInteger next = new AtomicInteger();

    private FileOutbox open() throws ResultStoreException {
        return FileOutbox.open(new StorageSettings(dir, 1 << 20, 64L << 20, 1L << 30, 0, 0), () -> Long.MAX_VALUE);
    }

    private OutboxResultSink sink(Outbox box) {
        return new OutboxResultSink(box, Samples.STATION, () -> "id-" + next.incrementAndGet(),
                new VirtualClock(Samples.T0));
    }

    private static JointOutcome joint(String serial, int position) {
        JointOutcome j = Samples.joint(position, true);
        return new JointOutcome(serial, j.partModel(), j.pattern(), j.position(), j.positionIndex(), j.pass(),
                j.attempt(), j.result(), j.transducerSerial(), j.calibrationDue(), j.at(), j.tracePath());
    }

    @Test
    void jointsAfterTheLastPartRecordAreThePartThatWasInWork() throws Exception {
        try (FileOutbox box = open()) {
            OutboxResultSink sink = sink(box);
            ResultSink.Receipt a1 = sink.joint(joint("WH-1", 1));
            sink.part(Samples.part(List.of(a1.id())));
            sink.joint(joint("WH-2", 1));
            sink.event(Samples.event());
            sink.joint(joint("WH-2", 2));
            assertThat(sink.unfinishedPart()).as("only what the store found when it opened").isNull();
        }
        try (FileOutbox box = open()) {
            UnfinishedPart u = sink(box).unfinishedPart();
            assertThat(u).isEqualTo(new UnfinishedPart("WH-2", "hub-5", "wheel-5", List.of("id-3", "id-5")));
            assertThat(box.unfinishedPartJoints()).extracting(Outbox.Entry::seq).containsExactly(2L, 3L);
        }
    }

    @Test
    void evenDeliveredJointsCountAndAPartRecordClosesThePart() throws Exception {
        try (FileOutbox box = open()) {
            OutboxResultSink sink = sink(box);
            sink.joint(joint("WH-3", 1));
            for (Outbox.Entry e : box.pending(0, 10)) {
                box.markDelivered(e.position());
            }
        }
        try (FileOutbox box = open()) {
            assertThat(sink(box).unfinishedPart().jointIds()).containsExactly("id-1");
            sink(box).part(Samples.part(List.of("id-1")));
        }
        try (FileOutbox box = open()) {
            assertThat(sink(box).unfinishedPart()).isNull();
            assertThat(box.unfinishedPartJoints()).isEmpty();
        }
    }

    @Test
    void aFreshOrMemoryStoreHasNoUnfinishedPart() throws Exception {
        try (FileOutbox box = open()) {
            assertThat(sink(box).unfinishedPart()).isNull();
        }
        assertThat(sink(new MemoryOutbox()).unfinishedPart()).isNull();
    }
}
