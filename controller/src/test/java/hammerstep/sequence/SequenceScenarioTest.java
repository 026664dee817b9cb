package hammerstep.sequence;

import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.station.LampMode;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.Test;

import static hammerstep.sequence.TestPrograms.FINAL;
import static hammerstep.sequence.TestPrograms.SNUG;
import static hammerstep.sequence.TestPrograms.go;
import static hammerstep.sequence.TestPrograms.noGo;
import static org.assertj.core.api.Assertions.assertThat;

class SequenceScenarioTest {

    private final Harness h = new Harness(false);
    private final Pattern pattern = TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT);

    @Test
    void waitsForAPartWithTheWhiteLampAndTheToolOff() {
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(h.seq.tower(TowerLamp.WHITE)).isEqualTo(LampMode.STEADY);
        assertThat(h.seq.toolEnabled()).isFalse();
    }

    @Test
    void promptsEveryPositionInCrossOrderPassAfterPassAndEndsGo() {
        h.start(pattern, "SN-1");
        StringBuilder prompts = new StringBuilder();
        for (int k = 0; k < 8; k++) {
            assertThat(h.seq.phase()).isEqualTo(Phase.PROMPT);
            assertThat(h.seq.toolEnabled()).isTrue();
            assertThat(h.seq.tower(TowerLamp.BLUE)).isEqualTo(LampMode.STEADY);
            assertThat(h.seq.positionLamp(h.seq.prompted())).isEqualTo(LampMode.BLINKING);
            prompts.append(h.seq.pass().name().charAt(0)).append(h.seq.prompted() + 1).append(' ');
            h.rundown(go(h.seq.program()));
        }
        assertThat(prompts.toString()).isEqualTo("s1 s3 s2 s4 f1 f3 f2 f4 ");
        assertThat(h.seq.phase()).isEqualTo(Phase.COMPLETE);
        assertThat(h.seq.tower(TowerLamp.GREEN)).isEqualTo(LampMode.STEADY);
        assertThat(h.seq.toolEnabled()).isFalse();
        assertThat(h.parts()).singleElement().satisfies(p -> {
            assertThat(p.outcome().verdict()).isEqualTo("GO");
            assertThat(p.outcome().ended()).isEqualTo("COMPLETE");
            assertThat(p.outcome().jointIds()).hasSize(8);
        });
        JointOutcome first = h.joints().get(0).outcome();
        assertThat(first.position()).isEqualTo("A");
        assertThat(first.pass()).isEqualTo("snug");
        assertThat(first.attempt()).isEqualTo(1);
        assertThat(first.transducerSerial()).isEqualTo("TQ-0042");
    }

    @Test
    void showsTheVerdictOnlyAfterTheResultWasStored() {
        h.start(pattern, "SN-1");
        h.seq.rundownStarted(h.now());
        h.seq.jointJudged(go(SNUG), h.now());
        assertThat(h.seq.phase()).isEqualTo(Phase.STORING);
        assertThat(h.seq.tower(TowerLamp.GREEN)).isEqualTo(LampMode.OFF);
        assertThat(h.seq.toolEnabled()).isFalse();
        h.drain();
        assertThat(h.seq.tower(TowerLamp.GREEN)).isEqualTo(LampMode.STEADY);
        assertThat(h.seq.prompted()).isEqualTo(2);
    }

    @Test
    void dropsTheToolAtShutoffUntilTheNextPrompt() {
        h.start(pattern, "SN-1");
        h.seq.rundownStarted(h.now());
        assertThat(h.seq.toolEnabled()).isTrue();
        h.seq.shutoff(h.now());
        assertThat(h.seq.toolEnabled()).isFalse();
        h.seq.jointJudged(go(SNUG), h.now());
        h.drain();
        assertThat(h.seq.toolEnabled()).isTrue();
    }

    @Test
    void reworkWithOperatorAcknowledgeRetriesThePositionAndCountsTheAttempt() {
        h.start(pattern, "SN-1");
        h.rundown(noGo(SNUG));
        assertThat(h.seq.phase()).isEqualTo(Phase.REWORK);
        assertThat(h.seq.toolEnabled()).isFalse();
        assertThat(h.seq.tower(TowerLamp.RED)).isEqualTo(LampMode.STEADY);
        assertThat(h.seq.tower(TowerLamp.BLUE)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.positionLamp(0)).isEqualTo(LampMode.BLINKING);
        h.ack();
        assertThat(h.seq.phase()).isEqualTo(Phase.PROMPT);
        assertThat(h.seq.prompted()).isZero();
        h.rundown(go(SNUG));
        assertThat(h.joints()).extracting(j -> j.outcome().attempt()).containsExactly(1, 2);
        assertThat(h.seq.prompted()).isEqualTo(2);
        assertThat(h.eventCodes()).containsExactly("REWORK_ACKNOWLEDGED");
    }

    @Test
    void reworkThatNeedsTheSupervisorIgnoresTheOperatorButton() {
        h.start(TestPrograms.fourBolt(2, Acknowledge.SUPERVISOR, AfterNoGo.REJECT), "SN-1");
        h.rundown(noGo(SNUG));
        h.ack();
        assertThat(h.seq.phase()).isEqualTo(Phase.REWORK);
        assertThat(h.seq.toolEnabled()).isFalse();
        h.key();
        assertThat(h.seq.phase()).isEqualTo(Phase.PROMPT);
    }

    @Test
    void lastFailedAttemptWithRejectRejectsThePartUntilTheSupervisorKey() {
        h.start(TestPrograms.fourBolt(2, Acknowledge.OPERATOR, AfterNoGo.REJECT), "SN-1");
        h.rundown(noGo(SNUG));
        h.ack();
        h.rundown(noGo(SNUG));
        assertThat(h.seq.phase()).isEqualTo(Phase.REJECTED);
        assertThat(h.seq.tower(TowerLamp.RED)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.positionLamp(0)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.toolEnabled()).isFalse();
        h.ack();
        assertThat(h.seq.phase()).isEqualTo(Phase.REJECTED);
        h.key();
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(h.parts()).singleElement().satisfies(p -> {
            assertThat(p.outcome().verdict()).isEqualTo("NO_GO");
            assertThat(p.outcome().ended()).isEqualTo("REJECTED");
        });
        assertThat(h.eventCodes()).containsExactly("REWORK_ACKNOWLEDGED", "POSITION_FAILED");
    }

    @Test
    void skipPositionLeavesTheFailedPositionOutOfLaterPassesAndRejectsAtTheEnd() {
        h.start(TestPrograms.fourBolt(1, Acknowledge.OPERATOR, AfterNoGo.SKIP_POSITION), "SN-1");
        h.rundown(noGo(SNUG));
        assertThat(h.seq.phase()).isEqualTo(Phase.REWORK);
        h.ack();
        StringBuilder prompts = new StringBuilder();
        while (h.seq.phase() == Phase.PROMPT) {
            prompts.append(h.seq.prompted() + 1);
            h.rundown(go(h.seq.program()));
        }
        assertThat(prompts.toString()).isEqualTo("324" + "324");
        assertThat(h.seq.phase()).isEqualTo(Phase.REJECTED);
        h.key();
        assertThat(h.parts()).singleElement().satisfies(p -> assertThat(p.outcome().ended()).isEqualTo("REJECTED"));
    }

    @Test
    void continueKeepsTheFailedPositionInLaterPassesButThePartCannotEndGo() {
        h.start(TestPrograms.fourBolt(1, Acknowledge.OPERATOR, AfterNoGo.CONTINUE), "SN-1");
        h.rundown(noGo(SNUG));
        h.ack();
        StringBuilder prompts = new StringBuilder();
        while (h.seq.phase() == Phase.PROMPT) {
            prompts.append(h.seq.prompted() + 1);
            h.rundown(go(h.seq.program()));
        }
        assertThat(prompts.toString()).isEqualTo("324" + "1324");
        assertThat(h.seq.phase()).isEqualTo(Phase.REJECTED);
        assertThat(h.seq.partFailed()).isTrue();
    }

    @Test
    void removingThePartInWorkAbandonsIt() {
        h.start(pattern, "SN-1");
        h.rundown(go(SNUG));
        h.seq.partRemoved(h.now());
        h.drain();
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(h.parts()).singleElement().satisfies(p -> {
            assertThat(p.outcome().ended()).isEqualTo("ABANDONED");
            assertThat(p.outcome().jointIds()).hasSize(1);
        });
    }

    @Test
    void aStoreFailureStopsTheToolUntilTheSupervisorKeyRetries() {
        h.start(pattern, "SN-1");
        h.storeFails = true;
        h.rundown(go(SNUG));
        assertThat(h.seq.phase()).isEqualTo(Phase.FAULT);
        assertThat(h.seq.toolEnabled()).isFalse();
        assertThat(h.seq.tower(TowerLamp.RED)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.tower(TowerLamp.YELLOW)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.tower(TowerLamp.GREEN)).isEqualTo(LampMode.OFF);
        assertThat(h.seq.nextToStore()).isNull();
        h.ack();
        assertThat(h.seq.phase()).isEqualTo(Phase.FAULT);
        h.storeFails = false;
        h.key();
        assertThat(h.seq.phase()).isEqualTo(Phase.PROMPT);
        assertThat(h.joints()).hasSize(1);
        assertThat(h.seq.prompted()).isEqualTo(2);
    }

    @Test
    void aRundownWhileNothingIsPromptedIsAnAlarmNotAResult() {
        h.rundown(go(SNUG));
        assertThat(h.joints()).isEmpty();
        assertThat(h.eventCodes()).containsExactly("UNEXPECTED_RUNDOWN");
    }

    @Test
    void anUnknownModelStartsNoPart() {
        assertThat(h.seq.partArrived(new hammerstep.station.PartIdentity("SN-9", "X"), null, h.now())).isFalse();
        h.drain();
        assertThat(h.eventCodes()).containsExactly("UNKNOWN_MODEL");
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
    }

    @Test
    void aFinishedPartReturnsToWaitingAfterItsHoldTime() {
        Pattern one = new Pattern("one", "", java.util.List.of("A"),
                java.util.List.of(TestPrograms.pass("final", FINAL, Order.cross(1), 1, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
        h.start(one, "SN-1");
        h.rundown(go(FINAL));
        assertThat(h.seq.phase()).isEqualTo(Phase.COMPLETE);
        h.seq.onTick(h.clock.nanoTime() + 400_000_000L);
        assertThat(h.seq.phase()).isEqualTo(Phase.COMPLETE);
        h.seq.onTick(h.clock.nanoTime() + 500_000_000L);
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(h.seq.part()).isNull();
    }

    @Test
    void withConfirmSensorsTheToolRunsOnlyAtThePromptedPosition() {
        Harness c = new Harness(true);
        c.start(pattern, "SN-1");
        c.seq.toolAt(-1);
        assertThat(c.seq.toolEnabled()).isFalse();
        c.seq.toolAt(2);
        assertThat(c.seq.toolEnabled()).isFalse();
        c.seq.toolAt(0);
        assertThat(c.seq.toolEnabled()).isTrue();
    }

    @Test
    void withConfirmSensorsARundownOnADonePositionIsARehitThatNeedsRework() {
        Harness c = new Harness(true);
        c.start(pattern, "SN-1");
        c.seq.toolAt(0);
        c.rundown(go(SNUG));
        assertThat(c.seq.prompted()).isEqualTo(2);
        c.rundown(go(SNUG)); // the tool is still at position 1: relay bypassed or sensor moved
        JointOutcome rehit = c.joints().get(1).outcome();
        assertThat(rehit.positionIndex()).isEqualTo(1);
        assertThat(rehit.attempt()).isEqualTo(2);
        assertThat(rehit.result().verdict()).isEqualTo(Verdict.NO_GO);
        assertThat(rehit.result().reasons()).contains(Reason.REHIT);
        assertThat(c.eventCodes()).contains("REHIT");
        assertThat(c.seq.phase()).isEqualTo(Phase.REWORK);
        assertThat(c.seq.reworkPosition()).isZero();
    }

    @Test
    void withConfirmSensorsARundownOnAnotherPendingPositionIsOutOfSequence() {
        Harness c = new Harness(true);
        c.start(pattern, "SN-1");
        c.seq.toolAt(3);
        c.rundown(go(SNUG));
        JointOutcome wrong = c.joints().get(0).outcome();
        assertThat(wrong.positionIndex()).isEqualTo(4);
        assertThat(wrong.result().reasons()).containsExactly(Reason.OUT_OF_SEQUENCE);
        assertThat(c.eventCodes()).contains("OUT_OF_SEQUENCE");
        assertThat(c.seq.reworkPosition()).isEqualTo(3);
        c.ack();
        assertThat(c.seq.prompted()).isEqualTo(3);
    }
}
