package hammerstep.sequence;

import hammerstep.results.StationEvent;
import hammerstep.station.StationClock;
import hammerstep.station.loop.SequenceRecords;
import org.junit.jupiter.api.Test;

import java.lang.reflect.Constructor;
import java.lang.reflect.Field;
import java.time.Instant;
import java.util.Arrays;
import java.util.List;

import static hammerstep.sequence.TestPrograms.SNUG;
import static hammerstep.sequence.TestPrograms.noGo;
import static org.assertj.core.api.Assertions.assertThat;

/** The sequence hands out typed records with the time of the call; the loop stamps and words them. */
class SequenceRecordTest {

    private final Harness h = new Harness(false);

    @Test
    void aRejectedPositionComesOutAsTypedRecordsCarryingTheCallTimeAndIsWordedAndStampedAtTheSink() {
        h.start(TestPrograms.fourBolt(2, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-7");
        h.rundown(noGo(SNUG));
        h.ack();
        h.rundown(noGo(SNUG));
        h.key();

        List<Class<?>> kinds = h.records.stream().<Class<?>>map(Object::getClass).toList();
        assertThat(kinds).containsExactly(SequenceRecord.JointJudged.class, SequenceRecord.ReworkAcknowledged.class,
                SequenceRecord.JointJudged.class, SequenceRecord.PositionFailed.class,
                SequenceRecord.PartClosed.class);
        SequenceRecord.PositionFailed failed = (SequenceRecord.PositionFailed) h.records.get(3);
        assertThat(failed).isEqualTo(new SequenceRecord.PositionFailed("SN-7", new SequenceRecord.Position(1, "A"), 2,
                "snug", failed.atNs()));
        SequenceRecord.ReworkAcknowledged ack = (SequenceRecord.ReworkAcknowledged) h.records.get(1);
        assertThat(ack.by()).isEqualTo("operator");
        long[] times = h.records.stream().mapToLong(SequenceRecord::atNs).toArray();
        assertThat(times).as("each record carries the time of the call that made it, in order").isSorted();
        assertThat(times[0]).isNotEqualTo(times[4]);

        StationEvent worded = ((Store.Event) h.stored.get(3)).event();
        assertThat(worded.code()).isEqualTo("POSITION_FAILED");
        assertThat(worded.severity()).isEqualTo(StationEvent.Severity.ALARM);
        assertThat(worded.message()).isEqualTo("position 1 (A) is NO_GO after 2 attempts in pass snug");
        assertThat(worded.partSerial()).isEqualTo("SN-7");
        assertThat(worded.at()).isEqualTo(h.clock.instantOf(failed.atNs()));
        assertThat(worded.at()).isEqualTo(Instant.parse("2026-03-02T06:00:00Z").plusNanos(failed.atNs()));
        Store.Part part = (Store.Part) h.stored.get(4);
        assertThat(part.outcome().started()).as("the part's start, stamped from the time of its arrival")
                .isEqualTo(h.clock.instantOf(1_000_000));
    }

    @Test
    void aLooseningThatVoidsAGoIsAnAlarmAndOneThatVoidsNothingANotice() {
        SequenceRecord.Position a = new SequenceRecord.Position(3, "C");
        StationEvent.Severity voided = new SequenceRecord.Loosened("S", a, true, false, 0).severity();
        StationEvent.Severity not = new SequenceRecord.Loosened("S", a, false, false, 0).severity();
        assertThat(voided).isEqualTo(StationEvent.Severity.ALARM);
        assertThat(not).isEqualTo(StationEvent.Severity.NOTICE);
        assertThat(SequenceRecords.message(new SequenceRecord.Loosened("S", a, true, true, 0))).isEqualTo(
                "position 3 (C), judged GO, was loosened (no confirm sensors: taken as the position judged GO last)"
                        + ": it is prompted again and must be tightened again");
        assertThat(SequenceRecords.message(new SequenceRecord.WrongPosition("S", a, null, false, 0)))
                .isEqualTo("rundown on position 3 (C) while - was prompted");
    }

    @Test
    void theSequenceHoldsNoClock() {
        for (Class<?> c : List.of(Sequence.class, Records.class, PartProgress.class, SensorLockout.class)) {
            for (Field f : c.getDeclaredFields()) {
                assertThat(StationClock.class.isAssignableFrom(f.getType())).as(c.getSimpleName() + "." + f.getName())
                        .isFalse();
                assertThat(f.getType().getPackageName()).as(c.getSimpleName() + "." + f.getName())
                        .isNotEqualTo("java.time");
            }
        }
        for (Constructor<?> k : Sequence.class.getConstructors()) {
            assertThat(Arrays.asList(k.getParameterTypes())).doesNotContain(StationClock.class);
        }
    }
}
