package hammerstep.sequence;

import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.signal.SignalFaults;
import hammerstep.station.LampMode;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.Test;

import static hammerstep.sequence.TestPrograms.go;
import static hammerstep.sequence.TestPrograms.noGo;
import static org.assertj.core.api.Assertions.assertThat;

/** The sequence's own handling of faults: sensor lockout, part taken away mid-rundown, storage. */
class SequenceFaultTest {

    private final Harness h = new Harness(false);
    private final Pattern pattern = TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT);

    private StationEvent lastEvent() {
        return h.stored.stream().filter(s -> s instanceof Store.Event).map(s -> ((Store.Event) s).event())
                .reduce((a, b) -> b).orElseThrow();
    }

    @Test
    void aSensorFaultLocksTheToolOutWithAnAlarmNamingItAndRedAndYellowBlinking() {
        h.start(pattern, "SN-1");
        assertThat(h.seq.toolEnabled()).isTrue();
        h.seq.sensorFault(SignalFaults.FLAT_LINE, "[FLAT_LINE]", h.now());
        h.drain();
        assertThat(h.seq.sensorLockout()).isEqualTo(SignalFaults.FLAT_LINE);
        assertThat(h.seq.toolEnabled()).isFalse();
        assertThat(h.seq.tower(TowerLamp.RED)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.tower(TowerLamp.YELLOW)).isEqualTo(LampMode.BLINKING);
        assertThat(h.seq.phase()).as("the part stays where it was").isEqualTo(Phase.PROMPT);
        StationEvent e = lastEvent();
        assertThat(e.code()).isEqualTo("SENSOR_FAULT");
        assertThat(e.severity()).isEqualTo(StationEvent.Severity.ALARM);
        assertThat(e.message()).contains("[FLAT_LINE]");
        assertThat(e.partSerial()).isEqualTo("SN-1");
    }

    @Test
    void aSecondFaultAddsItsBitWithoutASecondAlarm() {
        h.seq.sensorFault(SignalFaults.ZERO_DRIFT, "[ZERO_DRIFT]", h.now());
        h.seq.sensorFault(SignalFaults.OVER_RANGE, "[OVER_RANGE]", h.now());
        h.drain();
        assertThat(h.seq.sensorLockout()).isEqualTo(SignalFaults.ZERO_DRIFT | SignalFaults.OVER_RANGE);
        assertThat(h.eventCodes()).containsExactly("SENSOR_FAULT");
        assertThat(lastEvent().partSerial()).isNull();
        assertThat(h.seq.tower(TowerLamp.WHITE)).isEqualTo(LampMode.STEADY);
    }

    @Test
    void noFaultBitsIsNoLockout() {
        h.seq.sensorFault(0, "[]", h.now());
        h.drain();
        assertThat(h.seq.sensorLockout()).isZero();
        assertThat(h.stored).isEmpty();
        assertThat(h.seq.tower(TowerLamp.RED)).isEqualTo(LampMode.OFF);
        assertThat(h.seq.tower(TowerLamp.YELLOW)).isEqualTo(LampMode.OFF);
    }

    @Test
    void theKeyReleasesTheLockoutOnlyWhenTheSignalIsHealthyAndDoesNothingElseThatTurn() {
        h.start(pattern, "SN-2");
        h.rundown(noGo(h.seq.program()));
        assertThat(h.seq.phase()).isEqualTo(Phase.REWORK);
        h.seq.sensorFault(SignalFaults.NOT_FINITE, "[NOT_FINITE]", h.now());
        h.seq.sensorFaults(SignalFaults.NOT_FINITE);
        h.key();
        assertThat(h.seq.sensorLockout()).isNotZero();
        assertThat(h.seq.phase()).isEqualTo(Phase.REWORK);
        h.seq.sensorFaults(0);
        h.key();
        assertThat(h.seq.sensorLockout()).isZero();
        assertThat(h.eventCodes()).endsWith("SENSOR_FAULT_CLEARED");
        assertThat(h.seq.phase()).as("the key that released the lockout left the rework alone").isEqualTo(Phase.REWORK);
        h.key();
        assertThat(h.seq.phase()).isEqualTo(Phase.PROMPT);
        assertThat(h.seq.toolEnabled()).isTrue();
    }

    @Test
    void aFaultReportedDuringItsOwnCycleCountsAsStandingUntilTheLoopSaysOtherwise() {
        h.seq.sensorFaults(0);
        h.seq.sensorFault(SignalFaults.NOISE, "[NOISE]", h.now());
        h.key(); // same cycle: the fault is still standing
        assertThat(h.seq.sensorLockout()).isEqualTo(SignalFaults.NOISE);
    }

    @Test
    void aRundownUnderWayStillEndsAndIsJudgedDuringALockout() {
        h.start(pattern, "SN-3");
        h.seq.rundownStarted(h.now());
        h.seq.sensorFault(SignalFaults.OVER_RANGE, "[OVER_RANGE]", h.now());
        assertThat(h.seq.toolEnabled()).isFalse();
        h.seq.jointJudged(noGo(h.seq.program()), h.now());
        h.drain();
        assertThat(h.joints()).hasSize(1);
        assertThat(h.seq.phase()).isEqualTo(Phase.REWORK);
    }

    @Test
    void aPartTakenAwayDuringARundownDropsTheToolThenStoresTheJointAndAbandonsThePart() {
        h.start(pattern, "SN-4");
        h.seq.rundownStarted(h.now());
        assertThat(h.seq.toolEnabled()).isTrue();
        h.seq.partRemoved(h.now());
        assertThat(h.seq.toolEnabled()).isFalse();
        assertThat(h.seq.phase()).isEqualTo(Phase.RUNDOWN);
        h.seq.jointJudged(go(h.seq.program()), h.now());
        h.drain();
        assertThat(h.joints()).hasSize(1);
        assertThat(h.parts()).singleElement().satisfies(p -> {
            assertThat(p.outcome().ended()).isEqualTo("ABANDONED");
            assertThat(p.outcome().verdict()).isEqualTo("NO_GO");
            assertThat(p.outcome().jointIds()).hasSize(1);
        });
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(h.seq.toolEnabled()).isFalse();
    }

    @Test
    void aNoGoJudgedAfterThePartWasTakenAwayAbandonsItToo() {
        h.start(pattern, "SN-5");
        h.seq.rundownStarted(h.now());
        h.seq.partRemoved(h.now());
        h.seq.jointJudged(noGo(h.seq.program()), h.now());
        h.drain();
        assertThat(h.parts()).singleElement().satisfies(p -> assertThat(p.outcome().ended()).isEqualTo("ABANDONED"));
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
    }

    @Test
    void aFullStoreRefusesAPartAndShowsYellowBlinkingWithoutWhite() {
        h.seq.storage(ResultSink.Storage.FULL);
        assertThat(h.seq.partArrived(new hammerstep.station.PartIdentity("SN-6", "M1"), pattern, h.now())).isFalse();
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(h.seq.tower(TowerLamp.WHITE)).isEqualTo(LampMode.OFF);
        assertThat(h.seq.tower(TowerLamp.YELLOW)).isEqualTo(LampMode.BLINKING);
        h.seq.storage(ResultSink.Storage.LOW);
        assertThat(h.seq.tower(TowerLamp.YELLOW)).isEqualTo(LampMode.STEADY);
        assertThat(h.seq.tower(TowerLamp.WHITE)).isEqualTo(LampMode.STEADY);
        assertThat(h.seq.partArrived(new hammerstep.station.PartIdentity("SN-6", "M1"), pattern, h.now())).isTrue();
        h.seq.storage(ResultSink.Storage.OK);
        assertThat(h.seq.tower(TowerLamp.YELLOW)).isEqualTo(LampMode.OFF);
        h.seq.warning(true);
        assertThat(h.seq.tower(TowerLamp.YELLOW)).isEqualTo(LampMode.STEADY);
    }
}
