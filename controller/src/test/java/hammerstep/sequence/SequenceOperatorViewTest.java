package hammerstep.sequence;

import hammerstep.joint.Reason;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.signal.SignalFaults;
import hammerstep.station.LampMode;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.Test;

import java.util.List;

import static hammerstep.sequence.TestPrograms.FINAL;
import static hammerstep.sequence.TestPrograms.SNUG;
import static hammerstep.sequence.TestPrograms.go;
import static hammerstep.sequence.TestPrograms.noGo;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * What the operator sees on the position lamps in each phase, and what the events tell the quality
 * system: which position, which part, who released a rework. Cross order of four positions is
 * A, C, B, D (indices 0, 2, 1, 3).
 */
class SequenceOperatorViewTest {

    private final Harness h = new Harness(false);

    private List<LampMode> positionLamps() {
        return List.of(h.seq.positionLamp(0), h.seq.positionLamp(1), h.seq.positionLamp(2), h.seq.positionLamp(3));
    }

    private List<StationEvent> events() {
        return h.stored.stream().filter(s -> s instanceof Store.Event).map(s -> ((Store.Event) s).event()).toList();
    }

    @Test
    void duringReworkTheFailedPositionBlinksDoneOnesStaySteadyAndNothingIsPrompted() {
        h.start(TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-1");
        h.rundown(go(SNUG));
        h.rundown(noGo(SNUG));
        assertThat(h.seq.phase()).isEqualTo(Phase.REWORK);
        assertThat(positionLamps()).containsExactly(LampMode.STEADY, LampMode.OFF, LampMode.BLINKING, LampMode.OFF);
        assertThat(h.seq.positionLamp(4)).as("no such position on this pattern").isEqualTo(LampMode.OFF);
        assertThat(h.seq.prompted()).isEqualTo(-1);
        assertThat(h.seq.reworkPosition()).isEqualTo(2);
        assertThat(h.seq.done(0)).isTrue();
        assertThat(h.seq.done(2)).isFalse();
        assertThat(h.seq.done(9)).isFalse();
        assertThat(h.seq.attempts(2)).isEqualTo(1);
        assertThat(h.seq.attempts(9)).isZero();
        h.ack();
        assertThat(positionLamps()).containsExactly(LampMode.STEADY, LampMode.OFF, LampMode.BLINKING, LampMode.OFF);
        assertThat(h.seq.reworkPosition()).isEqualTo(-1);
        assertThat(h.seq.prompted()).isEqualTo(2);
    }

    @Test
    void aRejectedPartBlinksItsFailedPositionAndKeepsTheDoneOnesSteady() {
        h.start(TestPrograms.fourBolt(1, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-1");
        h.rundown(go(SNUG));
        h.rundown(noGo(SNUG));
        assertThat(h.seq.phase()).isEqualTo(Phase.REJECTED);
        assertThat(positionLamps()).containsExactly(LampMode.STEADY, LampMode.OFF, LampMode.BLINKING, LampMode.OFF);
        assertThat(h.seq.tower(TowerLamp.BLUE)).isEqualTo(LampMode.OFF);
        assertThat(h.seq.tower(TowerLamp.WHITE)).isEqualTo(LampMode.OFF);
        assertThat(h.seq.prompted()).isEqualTo(-1);
    }

    @Test
    void aPositionLeftOutOfLaterPassesStillBlinksWhenThePartIsRejectedAtTheEnd() {
        h.start(TestPrograms.fourBolt(1, Acknowledge.OPERATOR, AfterNoGo.SKIP_POSITION), "SN-1");
        h.rundown(go(SNUG));
        h.rundown(noGo(SNUG));
        h.ack();
        while (h.seq.phase() == Phase.PROMPT) {
            h.rundown(go(h.seq.program()));
        }
        assertThat(h.seq.phase()).isEqualTo(Phase.REJECTED);
        assertThat(h.seq.passIndex()).isEqualTo(1);
        assertThat(positionLamps()).containsExactly(LampMode.STEADY, LampMode.STEADY, LampMode.BLINKING, LampMode.STEADY);
    }

    @Test
    void aCompletePartLightsEveryPositionSteadyUntilItIsTakenAway() {
        Pattern pattern = TestPrograms.fourBolt(1, Acknowledge.OPERATOR, AfterNoGo.REJECT);
        h.start(pattern, "SN-1");
        assertThat(h.seq.pattern()).isSameAs(pattern);
        assertThat(h.seq.part().serial()).isEqualTo("SN-1");
        while (h.seq.phase() == Phase.PROMPT) {
            h.rundown(go(h.seq.program()));
        }
        assertThat(h.seq.phase()).isEqualTo(Phase.COMPLETE);
        assertThat(h.seq.partFailed()).isFalse();
        assertThat(positionLamps()).containsOnly(LampMode.STEADY);
        h.seq.partRemoved(h.now());
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(positionLamps()).containsOnly(LampMode.OFF);
        assertThat(h.seq.tower(TowerLamp.WHITE)).isEqualTo(LampMode.STEADY);
        assertThat(h.seq.tower(TowerLamp.GREEN)).isEqualTo(LampMode.OFF);
        assertThat(h.parts()).as("taking a finished part away stores nothing more").hasSize(1);
    }

    @Test
    void aFinishedPartShowsGreenOnlyOnceItsRecordIsStoredThenForExactlyItsHoldTime() {
        Pattern one = new Pattern("one", "", List.of("A"),
                List.of(TestPrograms.pass("final", FINAL, Order.cross(1), 1, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
        h.start(one, "SN-1");
        h.seq.rundownStarted(h.now());
        h.seq.jointJudged(go(FINAL), h.now());
        long storedAt = h.now();
        h.take(h.seq.nextToStore());
        h.seq.stored(new ResultSink.Receipt("j1", 1), storedAt);
        assertThat(h.seq.phase()).isEqualTo(Phase.COMPLETE);
        assertThat(h.seq.tower(TowerLamp.GREEN)).as("the part's GO record is not on disk yet").isEqualTo(LampMode.OFF);
        h.seq.onTick(storedAt + 5_000_000_000L);
        assertThat(h.seq.phase()).as("the hold waits for the part record").isEqualTo(Phase.COMPLETE);
        storedAt += 700_000_000L; // a stalled forced write
        assertThat(h.seq.nextToStore()).isInstanceOf(SequenceRecord.PartClosed.class);
        h.take(h.seq.nextToStore());
        h.seq.stored(new ResultSink.Receipt("p1", 1), storedAt);
        assertThat(h.seq.tower(TowerLamp.GREEN)).isEqualTo(LampMode.STEADY);
        h.seq.onTick(storedAt + 500_000_000L - 1);
        assertThat(h.seq.phase()).as("1 ns before the 500 ms hold").isEqualTo(Phase.COMPLETE);
        h.seq.onTick(storedAt + 500_000_000L);
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
    }

    @Test
    void attemptsCountAgainFromOneInEachPass() {
        h.start(TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-1");
        h.rundown(noGo(SNUG));
        h.ack();
        while (h.seq.passIndex() == 0) {
            h.rundown(go(h.seq.program()));
        }
        assertThat(h.seq.pass().name()).isEqualTo("final");
        assertThat(h.seq.attempts(0)).isZero();
        h.rundown(go(FINAL));
        assertThat(h.joints()).extracting(j -> j.outcome().pass() + j.outcome().attempt())
                .containsExactly("snug1", "snug2", "snug1", "snug1", "snug1", "final1");
    }

    @Test
    void aPositionDoneInAnEarlierPassButNotInThisOneIsOutOfSequenceNotARehit() {
        Harness c = new Harness(true);
        Pattern pattern = new Pattern("check-2", "", List.of("A", "B", "C", "D"), List.of(
                TestPrograms.pass("snug", SNUG, Order.cross(4), 3, Acknowledge.OPERATOR, AfterNoGo.REJECT),
                TestPrograms.pass("check", FINAL, new int[] {1, 3}, 3, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
        c.start(pattern, "SN-1");
        for (int pos : Order.cross(4)) {
            c.seq.toolAt(pos);
            c.rundown(go(SNUG));
        }
        assertThat(c.seq.pass().name()).isEqualTo("check");
        assertThat(c.seq.done(0)).as("done in snug, not part of check").isFalse();
        c.seq.toolAt(1);
        assertThat(List.of(c.seq.positionLamp(0), c.seq.positionLamp(1))).containsExactly(LampMode.OFF, LampMode.BLINKING);
        c.seq.toolAt(0); // the operator's socket lands on A
        c.rundown(go(FINAL));
        assertThat(c.joints().get(4).outcome().result().reasons()).containsExactly(Reason.OUT_OF_SEQUENCE);
        assertThat(c.seq.reworkPosition()).isZero();
        assertThat(c.eventCodes()).contains("OUT_OF_SEQUENCE");
    }

    @Test
    void thePositionFailedAlarmNamesThePositionAndHowManyAttemptsItHad() {
        h.start(TestPrograms.fourBolt(2, Acknowledge.OPERATOR, AfterNoGo.CONTINUE), "SN-7");
        h.rundown(go(SNUG));
        h.rundown(noGo(SNUG));
        h.ack();
        h.rundown(noGo(SNUG));
        StationEvent failed = events().get(events().size() - 1);
        assertThat(failed.code()).isEqualTo("POSITION_FAILED");
        assertThat(failed.partSerial()).isEqualTo("SN-7");
        assertThat(failed.message()).isEqualTo("position 3 (C) is NO_GO after 2 attempts in pass snug");
        Harness once = new Harness(false);
        once.start(TestPrograms.fourBolt(1, Acknowledge.OPERATOR, AfterNoGo.CONTINUE), "SN-8");
        once.rundown(noGo(SNUG));
        assertThat(once.stored).filteredOn(s -> s instanceof Store.Event).extracting(s -> ((Store.Event) s).event().message())
                .containsExactly("position 1 (A) is NO_GO after 1 attempt in pass snug");
    }

    @Test
    void aReleasedReworkIsOnRecordWithThePositionAndWhoReleasedIt() {
        h.start(TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-1");
        h.rundown(go(SNUG));
        h.rundown(noGo(SNUG));
        h.ack();
        Harness s = new Harness(false);
        s.start(TestPrograms.fourBolt(3, Acknowledge.SUPERVISOR, AfterNoGo.REJECT), "SN-2");
        s.rundown(noGo(SNUG));
        s.key();
        assertThat(events()).singleElement().satisfies(e -> {
            assertThat(e.code()).isEqualTo("REWORK_ACKNOWLEDGED");
            assertThat(e.message()).contains("position 3 (C)").endsWith("by the operator");
            assertThat(e.partSerial()).isEqualTo("SN-1");
        });
        assertThat(s.stored).filteredOn(x -> x instanceof Store.Event).extracting(x -> ((Store.Event) x).event().message())
                .singleElement().satisfies(m -> assertThat(m).contains("position 1 (A)").endsWith("by the supervisor"));
    }

    @Test
    void aScanWhileAPartIsInWorkIsRefusedWithAWarningNamingBothParts() {
        h.start(TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-1");
        boolean started = h.seq.partArrived(new PartIdentity("SN-2", "M1"),
                TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT), h.now());
        h.drain();
        assertThat(started).isFalse();
        assertThat(h.seq.part().serial()).isEqualTo("SN-1");
        assertThat(events()).singleElement().satisfies(e -> {
            assertThat(e.code()).isEqualTo("IDENTITY_IGNORED");
            assertThat(e.severity()).isEqualTo(StationEvent.Severity.WARNING);
            assertThat(e.partSerial()).isEqualTo("SN-2");
            assertThat(e.message()).contains("SN-2").contains("SN-1");
        });
    }

    @Test
    void aFullStoreTellsTheCallerThePartWasNotStarted() {
        h.seq.storage(ResultSink.Storage.FULL);
        assertThat(h.seq.partArrived(new PartIdentity("SN-1", "M1"),
                TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT), h.now())).isFalse();
        assertThat(h.seq.part()).isNull();
        h.seq.storage(ResultSink.Storage.OK);
        assertThat(h.seq.partArrived(new PartIdentity("SN-1", "M1"),
                TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT), h.now())).isTrue();
    }

    @Test
    void eachPartRecordListsOnlyItsOwnJoints() {
        Pattern one = new Pattern("one", "", List.of("A"),
                List.of(TestPrograms.pass("final", FINAL, Order.cross(1), 1, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
        h.start(one, "SN-1");
        h.rundown(go(FINAL));
        h.seq.partRemoved(h.now());
        h.start(one, "SN-2");
        h.rundown(go(FINAL));
        assertThat(h.parts()).extracting(p -> p.outcome().jointIds()).containsExactly(List.of("r0"), List.of("r2"));
    }

    @Test
    void theLockoutReleaseIsRecordedAgainstThePartInWork() {
        h.start(TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-5");
        h.seq.sensorFault(SignalFaults.ZERO_DRIFT, "[ZERO_DRIFT]", h.now());
        h.seq.sensorFaults(0);
        h.key();
        assertThat(events()).extracting(StationEvent::code).containsExactly("SENSOR_FAULT", "SENSOR_FAULT_CLEARED");
        assertThat(events()).extracting(StationEvent::partSerial).containsExactly("SN-5", "SN-5");
        assertThat(h.seq.toolEnabled()).isTrue();
    }

    @Test
    void aPatternRefusesAnOrderThatNamesAPositionItDoesNotHave() {
        assertThatThrownBy(() -> new Pattern("p", "", List.of("A", "B"),
                List.of(TestPrograms.pass("final", FINAL, new int[] {0, 2}, 1, Acknowledge.OPERATOR, AfterNoGo.REJECT))))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("pass final names position 3 of a 2-position pattern");
        assertThatThrownBy(() -> new Pattern("p", "", List.of("A", "B"),
                List.of(TestPrograms.pass("final", FINAL, new int[] {-1}, 1, Acknowledge.OPERATOR, AfterNoGo.REJECT))))
                .isInstanceOf(IllegalArgumentException.class);
    }
}
