package hammerstep.station.loop;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.StationCommands.Reply;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.results.StationId;
import hammerstep.results.ResultStoreException;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
import hammerstep.station.SampleRing;
import hammerstep.station.VirtualClock;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.AtomicReference;

import static org.assertj.core.api.Assertions.assertThat;

/** The plant's commands reach the station loop through the desk and are answered after the loop acted. */
class CommandDeskTest {

    private static final JointProgram FINAL = program("final", 200);

    private final VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
    private final Fakes.Inputs inputs = new Fakes.Inputs();
    private final AtomicLong ids = new AtomicLong();
    private final MemoryOutbox outbox = new MemoryOutbox();
    private final StorageSwitch sink = new StorageSwitch(new OutboxResultSink(outbox, new StationId("s", "l", "st"),
            () -> "id-" + ids.incrementAndGet(), new VirtualClock(Instant.EPOCH)));
    private final List<PartOutcome> parts = new ArrayList<>();
    private final List<StationEvent> events = new ArrayList<>();
    private final AtomicReference<Map<String, Pattern>> onDisk = new AtomicReference<>(Map.of("M", pattern("p2", FINAL)));
    private final CommandDesk desk = new CommandDesk(() -> {
        Map<String, Pattern> m = onDisk.get();
        if (m == null) {
            throw new IllegalStateException("patterns/p2.yaml:3:5: 'passes' is missing\nmore detail");
        }
        return m;
    });
    private final StationAgent agent = new StationAgent(clock, new StationPorts(new SampleRing(20_000, 64, 4),
            new Fakes.RecordingLamps(4), new Fakes.RecordingTool(), inputs, new Fakes.Scanner()), sink,
            new Sequence(new Sequence.Settings("TQ-1", null, 300), false), onDisk.get(),
            JointMonitor.replayConditioning(FINAL), 1_000_000_000L, new StationListener() {
                @Override
                public void onPart(PartOutcome part, ResultSink.Receipt receipt) {
                    parts.add(part);
                }

                @Override
                public void onEvent(StationEvent event, ResultSink.Receipt receipt) {
                    events.add(event);
                }
            }, t -> {
                throw new AssertionError(t);
            });

    CommandDeskTest() {
        agent.takeCommands(desk);
    }

    private static JointProgram program(String id, double shutoffNm) {
        return new JointProgram(id, "rev-" + shutoffNm, new JointProgram.Torque(180, 200, 230), FinalTorque.MAX_PEAK,
                new JointProgram.Blows(40, 20, 2, 40, 7.5), new JointProgram.Rundown(10, 60, 4000), shutoffNm, 0);
    }

    private static Pattern pattern(String id, JointProgram program) {
        return new Pattern(id, "", List.of("L", "R"), List.of(
                new Pattern.Pass("final", program, Order.cross(2), 2, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
    }

    private void cycle() {
        clock.advanceNs(3_200_000L);
        agent.doWork();
    }

    private static Reply now(CompletionStage<Reply> stage) {
        CompletableFuture<Reply> f = stage.toCompletableFuture();
        assertThat(f).as("answered").isDone();
        return f.join();
    }

    /** The reload reads its files on a thread of its own: cycle until that thread handed them over. */
    private Reply cycleUntilAnswered(CompletionStage<Reply> stage) {
        CompletableFuture<Reply> f = stage.toCompletableFuture();
        long end = System.nanoTime() + 10_000_000_000L;
        while (!f.isDone() && System.nanoTime() - end < 0) {
            cycle();
            Thread.onSpinWait();
        }
        return now(f);
    }

    @Test
    void showsTheDataGapsTheStationCountedForTheStatus() {
        cycle();
        assertThat(desk.dataGaps()).isEqualTo(new StationCommands.DataGaps(0, 0));
        float[] quiet = new float[64];
        agent.onBlock(quiet, 0, 64, 0);
        agent.onBlock(quiet, 0, 64, 6_400_000L); // the block from 3.2 ms was lost
        cycle();
        assertThat(desk.dataGaps()).isEqualTo(new StationCommands.DataGaps(1, 0));
    }

    @Test
    void startsThePartTheCommandNamesAndAnswersOnlyAfterTheStationActed() {
        cycle();
        CompletionStage<Reply> answer = desk.startPart("SN-1", "M");

        assertThat(answer.toCompletableFuture()).as("not before the station cycle").isNotDone();
        assertThat(desk.activity().mode()).isEqualTo("WAITING");
        cycle();

        assertThat(now(answer)).isEqualTo(Reply.accepted("part SN-1 started: pattern p2"));
        assertThat(agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(agent.sequence().part().serial()).isEqualTo("SN-1");
        assertThat(desk.activity()).satisfies(a -> {
            assertThat(a.mode()).isEqualTo("PROMPT");
            assertThat(a.partSerial()).isEqualTo("SN-1");
            assertThat(a.partModel()).isEqualTo("M");
            assertThat(a.pattern()).isEqualTo("p2");
        });
    }

    @Test
    void refusesAnUnknownModelAPartWhileOneIsInWorkAndAFullStoreWithoutStoringAnything() {
        CompletionStage<Reply> unknown = desk.startPart("SN-2", "X");
        cycle();
        assertThat(now(unknown).code()).isEqualTo("UNKNOWN_MODEL");
        assertThat(now(unknown).message()).contains("knows M");
        assertThat(agent.sequence().phase()).isEqualTo(Phase.WAITING);

        sink.storage = ResultSink.Storage.FULL;
        CompletionStage<Reply> full = desk.startPart("SN-3", "M");
        cycle();
        assertThat(now(full).code()).isEqualTo("STORAGE_FULL");
        assertThat(agent.sequence().phase()).isEqualTo(Phase.WAITING);

        sink.storage = ResultSink.Storage.OK;
        desk.startPart("SN-4", "M");
        cycle();
        CompletionStage<Reply> busy = desk.startPart("SN-5", "M");
        cycle();
        assertThat(now(busy)).isEqualTo(Reply.refused("BUSY", "part SN-4 is in work"));
        assertThat(agent.sequence().part().serial()).isEqualTo("SN-4");
        assertThat(events).as("a refused command changes nothing, not even the event log").isEmpty();
    }

    @Test
    void aPartNamedBeforeItIsInTheFixtureStartsWhenItArrives() {
        inputs.partSensor = true;
        inputs.present = false;
        cycle();
        CompletionStage<Reply> answer = desk.startPart("SN-6", "M");
        cycle();
        assertThat(now(answer).ok()).isTrue();
        assertThat(now(answer).message()).contains("starts when it is in the fixture");
        assertThat(agent.sequence().phase()).isEqualTo(Phase.WAITING);

        inputs.present = true;
        cycle();
        assertThat(agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(agent.sequence().part().serial()).isEqualTo("SN-6");
    }

    @Test
    void aQueuedPartShowsInTheActivityUntilItArrives() {
        inputs.partSensor = true;
        inputs.present = false;
        cycle();
        assertThat(desk.activity().queuedSerial()).isNull();

        desk.startPart("SN-20", "M");
        cycle();
        assertThat(desk.activity()).satisfies(a -> {
            assertThat(a.mode()).isEqualTo("WAITING");
            assertThat(a.partSerial()).as("not in work yet").isNull();
            assertThat(a.queuedSerial()).isEqualTo("SN-20");
            assertThat(a.queuedModel()).isEqualTo("M");
        });

        inputs.present = true;
        cycle();
        cycle(); // the snapshot is taken as a cycle begins
        assertThat(desk.activity()).satisfies(a -> {
            assertThat(a.partSerial()).isEqualTo("SN-20");
            assertThat(a.queuedSerial()).as("started: no longer waiting").isNull();
        });
    }

    @Test
    void endPartCancelsAQueuedPartWithAnAnswerAndItNeverStarts() {
        inputs.partSensor = true;
        inputs.present = false;
        cycle();
        desk.startPart("SN-21", "M");
        cycle();

        CompletionStage<Reply> cancel = desk.endPart("wrong label");
        cycle();
        assertThat(now(cancel)).isEqualTo(Reply.accepted(
                "part SN-21 was waiting for the fixture and is cancelled; it never started"));
        assertThat(desk.activity().queuedSerial()).isNull();

        inputs.present = true;
        cycle();
        cycle();
        assertThat(agent.sequence().phase()).as("the cancelled part does not start on arrival").isEqualTo(Phase.WAITING);
        assertThat(agent.sequence().part()).isNull();
        assertThat(parts).as("it never started: no part message").isEmpty();
        assertThat(events).isEmpty();

        CompletionStage<Reply> again = desk.endPart(null);
        cycle();
        assertThat(now(again)).isEqualTo(Reply.refused("NO_PART", "no part in work and none waiting for the fixture"));
    }

    @Test
    void aSecondQueuedPartReplacesTheFirstAndSaysSo() {
        inputs.partSensor = true;
        inputs.present = false;
        cycle();
        desk.startPart("SN-22", "M");
        cycle();
        CompletionStage<Reply> second = desk.startPart("SN-23", "M");
        cycle();

        assertThat(now(second).ok()).isTrue();
        assertThat(now(second).message()).contains("starts when it is in the fixture")
                .contains("replaces part SN-22, which was waiting for it and never started");
        assertThat(desk.activity().queuedSerial()).isEqualTo("SN-23");
    }

    @Test
    void endsThePartInWorkAsAbandonedWithTheReasonOnRecord() {
        desk.startPart("SN-7", "M");
        cycle();
        CompletionStage<Reply> end = desk.endPart("scrapped at repair");
        cycle();

        assertThat(now(end)).isEqualTo(Reply.accepted("part SN-7 ended"));
        assertThat(agent.sequence().phase()).isEqualTo(Phase.WAITING);
        assertThat(parts).singleElement().satisfies(p -> {
            assertThat(p.partSerial()).isEqualTo("SN-7");
            assertThat(p.ended()).isEqualTo("ABANDONED");
            assertThat(p.verdict()).isEqualTo("NO_GO");
        });
        assertThat(events).singleElement().satisfies(e -> {
            assertThat(e.code()).isEqualTo("PART_ENDED");
            assertThat(e.message()).contains("scrapped at repair");
            assertThat(e.partSerial()).isEqualTo("SN-7");
        });

        CompletionStage<Reply> again = desk.endPart("twice");
        cycle();
        assertThat(now(again).code()).isEqualTo("NO_PART");
        assertThat(parts).hasSize(1);
    }

    @Test
    void reloadWaitsForThePartInWorkThenTheNextPartUsesTheNewProgram() {
        desk.startPart("SN-8", "M");
        cycle();
        JointProgram changed = program("final", 210);
        onDisk.set(Map.of("M", pattern("p2", changed), "N", pattern("n2", changed)));
        CompletionStage<Reply> reload = desk.reloadPrograms();
        for (int k = 0; k < 50; k++) {
            cycle();
        }
        assertThat(reload.toCompletableFuture()).as("waits while SN-8 is in work").isNotDone();
        assertThat(agent.sequence().program()).isEqualTo(FINAL);

        desk.endPart("reload test");
        Reply r = cycleUntilAnswered(reload);

        assertThat(r).isEqualTo(Reply.accepted("programs reloaded: 2 part models"));
        CompletionStage<Reply> next = desk.startPart("SN-9", "N");
        cycle();
        assertThat(now(next).ok()).isTrue();
        assertThat(agent.sequence().program()).isEqualTo(changed);
    }

    @Test
    void aReloadWithABadFileChangesNothingAndSaysWhy() {
        onDisk.set(null);
        Reply r = cycleUntilAnswered(desk.reloadPrograms());

        assertThat(r).isEqualTo(Reply.refused("RELOAD_FAILED", "patterns/p2.yaml:3:5: 'passes' is missing"));
        CompletionStage<Reply> start = desk.startPart("SN-10", "M");
        cycle();
        assertThat(now(start).ok()).isTrue();
        assertThat(agent.sequence().program()).isEqualTo(FINAL);
    }

    @Test
    void aFullQueueAnswersBusyAtOnceAndAStoppedStationAnswersEveryWaitingCommand() {
        List<CompletionStage<Reply>> waiting = new ArrayList<>();
        for (int k = 0; k < CommandDesk.QUEUE_CAPACITY; k++) {
            waiting.add(desk.endPart("k" + k));
        }
        CompletionStage<Reply> overflow = desk.startPart("SN-11", "M");
        assertThat(now(overflow).code()).isEqualTo("BUSY");

        agent.onClose();

        assertThat(waiting).allSatisfy(w -> assertThat(now(w).code()).isEqualTo("UNAVAILABLE"));
        assertThat(now(desk.startPart("SN-12", "M")).code()).isEqualTo("UNAVAILABLE");
        cycle();
        assertThat(agent.sequence().phase()).isEqualTo(Phase.WAITING);
    }

    @Test
    void aStationWithoutALoaderRefusesReload() {
        CommandDesk none = new CommandDesk(null);
        assertThat(now(none.reloadPrograms()).code()).isEqualTo("UNAVAILABLE");
    }

    /** The sink with a storage state the test sets. */
    static final class StorageSwitch implements ResultSink {
        private final ResultSink inner;
        Storage storage = Storage.OK;

        StorageSwitch(ResultSink inner) {
            this.inner = inner;
        }

        @Override
        public Receipt joint(JointOutcome joint) throws ResultStoreException {
            return inner.joint(joint);
        }

        @Override
        public Receipt part(PartOutcome part) throws ResultStoreException {
            return inner.part(part);
        }

        @Override
        public Receipt event(StationEvent event) throws ResultStoreException {
            return inner.event(event);
        }

        @Override
        public Storage storage() {
            return storage;
        }
    }
}
