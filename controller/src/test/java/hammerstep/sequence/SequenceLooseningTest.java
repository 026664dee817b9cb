package hammerstep.sequence;

import hammerstep.joint.Direction;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.StationEvent;
import hammerstep.station.LampMode;
import org.junit.jupiter.api.Test;

import java.util.List;

import static hammerstep.sequence.TestPrograms.FINAL;
import static hammerstep.sequence.TestPrograms.go;
import static hammerstep.sequence.TestPrograms.noGo;
import static org.assertj.core.api.Assertions.assertThat;

/** A loosening in the station: it voids a position judged GO, which must then be tightened again. */
class SequenceLooseningTest {

    /** Three positions in order A, B, C; three attempts each, operator acknowledges rework. */
    private static final Pattern THREE = new Pattern("three", "", List.of("A", "B", "C"), List.of(
            TestPrograms.pass("final", FINAL, new int[] {0, 1, 2}, 3, Acknowledge.OPERATOR, AfterNoGo.REJECT)));

    private static JointResult loosening(JointProgram p) {
        return new JointResult(p, 0, 1, 3, new double[] {-380, -300, -150}, new long[] {1, 2, 3},
                new double[] {2, 2, 2}, new double[] {-0.5, -0.4, -0.2}, -380, 80, Long.MIN_VALUE, 0, 0,
                Verdict.NO_GO, List.of(Reason.LOOSENED), Direction.LOOSEN);
    }

    private static Store.Joint lastJoint(Harness h) {
        List<Store.Joint> joints = h.joints();
        return joints.get(joints.size() - 1);
    }

    private static StationEvent lastEvent(Harness h, String code) {
        return h.stored.stream().filter(s -> s instanceof Store.Event e && e.event().code().equals(code))
                .map(s -> ((Store.Event) s).event()).reduce((a, b) -> b).orElseThrow();
    }

    @Test
    void withConfirmSensorsALooseningOfAGoPositionVoidsItUntilItIsTightenedAgain() {
        Harness h = new Harness(true).start(THREE, "P1");
        h.seq.toolAt(0);
        h.rundown(go(FINAL));
        assertThat(h.seq.done(0)).isTrue();
        assertThat(h.seq.prompted()).isEqualTo(1);

        h.seq.toolAt(0); // the operator goes back to A with the tool in reverse
        h.rundown(loosening(FINAL));

        Store.Joint j = lastJoint(h);
        assertThat(j.outcome().positionIndex()).isEqualTo(1);
        assertThat(j.outcome().result().direction()).isEqualTo(Direction.LOOSEN);
        assertThat(j.outcome().result().reasons()).containsExactly(Reason.LOOSENED);
        StationEvent alarm = lastEvent(h, "LOOSENED");
        assertThat(alarm.severity()).isEqualTo(StationEvent.Severity.ALARM);
        assertThat(alarm.message()).contains("1 (A)");
        assertThat(h.seq.done(0)).isFalse();
        assertThat(h.seq.phase()).isEqualTo(Phase.PROMPT);
        assertThat(h.seq.prompted()).isEqualTo(0);
        assertThat(h.seq.positionLamp(0)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.attempts(0)).as("a loosening is no attempt").isEqualTo(1);

        // B and C cannot finish the part while A stands loosened: A is what the station prompts
        h.rundown(go(FINAL));
        assertThat(h.seq.done(0)).isTrue();
        h.seq.toolAt(1);
        h.rundown(go(FINAL));
        assertThat(h.parts()).isEmpty();
        h.seq.toolAt(2);
        h.rundown(go(FINAL));
        assertThat(h.parts()).hasSize(1);
        assertThat(h.parts().get(0).outcome().verdict()).isEqualTo("GO");
        assertThat(h.parts().get(0).outcome().jointIds()).hasSize(5);
    }

    @Test
    void withoutSensorsALooseningBeforeThePromptedPositionIsTouchedVoidsThePositionJudgedGoLast() {
        Harness h = new Harness(false).start(THREE, "P2");
        h.rundown(go(FINAL));
        h.rundown(go(FINAL));
        assertThat(h.seq.prompted()).isEqualTo(2);

        h.rundown(loosening(FINAL));

        assertThat(lastJoint(h).outcome().positionIndex()).isEqualTo(2);
        assertThat(lastEvent(h, "LOOSENED").message()).contains("2 (B)", "no confirm sensors");
        assertThat(h.seq.done(0)).isTrue();
        assertThat(h.seq.done(1)).isFalse();
        assertThat(h.seq.prompted()).isEqualTo(1);
        assertThat(h.seq.positionLamp(1)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.toolEnabled()).isTrue();

        h.rundown(go(FINAL));
        h.rundown(go(FINAL));
        assertThat(h.parts()).singleElement().satisfies(p -> assertThat(p.outcome().verdict()).isEqualTo("GO"));
    }

    @Test
    void backingOutTheNoGoBoltOfThePromptedPositionVoidsNothingAndCostsNoAttempt() {
        Harness h = new Harness(false).start(THREE, "P3");
        h.rundown(go(FINAL));
        h.rundown(noGo(FINAL));
        assertThat(h.seq.phase()).isEqualTo(Phase.REWORK);
        h.ack();
        assertThat(h.seq.prompted()).isEqualTo(1);

        h.rundown(loosening(FINAL));

        assertThat(lastJoint(h).outcome().positionIndex()).isEqualTo(2);
        assertThat(lastEvent(h, "LOOSENED").severity()).isEqualTo(StationEvent.Severity.NOTICE);
        assertThat(h.seq.done(0)).isTrue();
        assertThat(h.seq.phase()).isEqualTo(Phase.PROMPT);
        assertThat(h.seq.prompted()).isEqualTo(1);
        assertThat(h.seq.attempts(1)).isEqualTo(1);
    }

    @Test
    void aLooseningOfThePromptedPositionNotYetTightenedVoidsNothing() {
        Harness h = new Harness(true).start(THREE, "P4");
        h.seq.toolAt(0);
        h.rundown(loosening(FINAL));
        assertThat(lastEvent(h, "LOOSENED").severity()).isEqualTo(StationEvent.Severity.NOTICE);
        assertThat(lastJoint(h).outcome().attempt()).isEqualTo(1);
        assertThat(h.seq.prompted()).isEqualTo(0);
        assertThat(h.seq.attempts(0)).isZero();
        assertThat(h.seq.phase()).isEqualTo(Phase.PROMPT);
    }
}
