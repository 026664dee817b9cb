package hammerstep.sequence;

import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;
import hammerstep.results.UnfinishedPart;
import hammerstep.station.LampMode;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.Test;

import java.util.List;

import static hammerstep.sequence.TestPrograms.SNUG;
import static hammerstep.sequence.TestPrograms.go;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** A part that was in work when the station stopped: marked interrupted, and the supervisor closes it. */
class SequenceInterruptedPartTest {

    private final Harness h = new Harness(false);
    private final UnfinishedPart unfinished = new UnfinishedPart("SN-4", "M1", "flange-4", List.of("j1", "j2", "j3"));

    @Test
    void holdsTheStationWithTheToolOffAndRedBlinkingUntilTheSupervisorKey() {
        h.seq.partInterrupted(unfinished, h.now());
        h.drain();
        assertThat(h.seq.phase()).isEqualTo(Phase.REJECTED);
        assertThat(h.seq.toolEnabled()).isFalse();
        assertThat(h.seq.tower(TowerLamp.RED)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.tower(TowerLamp.WHITE)).as("not ready for a new part").isEqualTo(LampMode.OFF);
        assertThat(h.seq.positionLamp(0)).isEqualTo(LampMode.OFF);
        assertThat(h.seq.program()).as("the monitor only watches").isNull();
        assertThat(h.stored).singleElement().satisfies(s -> {
            StationEvent e = ((Store.Event) s).event();
            assertThat(e.code()).isEqualTo("PART_INTERRUPTED");
            assertThat(e.severity()).isEqualTo(StationEvent.Severity.ALARM);
            assertThat(e.partSerial()).isEqualTo("SN-4");
            assertThat(e.message()).contains("3 joints");
        });
        assertThat(h.parts()).as("no part record before the supervisor has seen it").isEmpty();
    }

    @Test
    void aScanTheOperatorButtonOrARundownStartNothingWhileItStands() {
        h.seq.partInterrupted(unfinished, h.now());
        Pattern pattern = TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT);
        assertThat(h.seq.partArrived(new PartIdentity("SN-5", "M1"), pattern, h.now())).isFalse();
        h.ack();
        h.rundown(go(SNUG));
        assertThat(h.seq.phase()).isEqualTo(Phase.REJECTED);
        assertThat(h.joints()).isEmpty();
        assertThat(h.eventCodes()).containsExactly("PART_INTERRUPTED", "IDENTITY_IGNORED", "UNEXPECTED_RUNDOWN");
    }

    @Test
    void theKeyStoresTheInterruptedPartRecordWithItsJointsAndTheNextPartRunsNormally() {
        h.seq.partInterrupted(unfinished, h.now());
        h.key();
        assertThat(h.parts()).singleElement().satisfies(p -> {
            PartOutcome o = p.outcome();
            assertThat(o.partSerial()).isEqualTo("SN-4");
            assertThat(o.partModel()).isEqualTo("M1");
            assertThat(o.pattern()).isEqualTo("flange-4");
            assertThat(o.verdict()).isEqualTo("NO_GO");
            assertThat(o.ended()).isEqualTo("INTERRUPTED");
            assertThat(o.jointIds()).containsExactly("j1", "j2", "j3");
            assertThat(o.started()).as("not known after a stop").isNull();
        });
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(h.seq.tower(TowerLamp.WHITE)).isEqualTo(LampMode.STEADY);
        Pattern one = new Pattern("one", "", List.of("A"), List.of(
                TestPrograms.pass("final", TestPrograms.FINAL, Order.cross(1), 1, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
        h.start(one, "SN-5");
        h.rundown(go(TestPrograms.FINAL));
        assertThat(h.parts()).extracting(p -> p.outcome().ended()).containsExactly("INTERRUPTED", "COMPLETE");
        assertThat(h.parts().get(1).outcome().jointIds()).hasSize(1);
        assertThat(h.parts().get(1).outcome().pattern()).isEqualTo("one");
    }

    @Test
    void aLaterRejectedPartEndsRejectedNotInterrupted() {
        h.seq.partInterrupted(unfinished, h.now());
        h.key();
        h.start(TestPrograms.fourBolt(1, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-6");
        h.rundown(TestPrograms.noGo(SNUG));
        h.key();
        assertThat(h.parts()).extracting(p -> p.outcome().ended()).containsExactly("INTERRUPTED", "REJECTED");
    }

    @Test
    void thePlantEndingItClosesItAsInterruptedToo() {
        h.seq.partInterrupted(unfinished, h.now());
        assertThat(h.seq.endPart("scrapped after the power cut", h.now())).isNull();
        h.drain();
        assertThat(h.parts()).singleElement().satisfies(p -> {
            assertThat(p.outcome().ended()).isEqualTo("INTERRUPTED");
            assertThat(p.outcome().jointIds()).containsExactly("j1", "j2", "j3");
        });
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
    }

    @Test
    void isTakenOverOnlyAtStart() {
        h.start(TestPrograms.fourBolt(1, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-6");
        assertThatThrownBy(() -> h.seq.partInterrupted(unfinished, h.now())).isInstanceOf(IllegalStateException.class);
    }
}
