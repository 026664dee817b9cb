package hammerstep.station.loop;

import hammerstep.results.MemoryOutbox;
import hammerstep.sequence.Phase;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The station loop in virtual time against a synthetic tool: half-sine blows whose peaks climb by a
 * fixed step while the tool is enabled; no blow starts once enable dropped.
 */
class StationAgentTest {

    private final StationFixture station = new StationFixture();

    @BeforeEach
    void start() {
        station.start(new MemoryOutbox(), StationFixture.replayConditioning());
    }

    @Test
    void runsAPartToGoAndDropsTheToolWithinOneBlockOfTheCrossing() {
        station.agent.doWork();
        assertThat(station.lamps.lit(TowerLamp.WHITE)).isTrue();
        assertThat(station.tool.enabled).isFalse();
        station.scanner.queue.add(new PartIdentity("SN-100", "M"));
        station.cycle();
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(station.tool.enabled).isTrue();
        assertThat(station.lamps.lit(TowerLamp.BLUE)).isTrue();
        station.tighten();
        station.tighten();
        assertThat(station.errors).isEmpty();
        assertThat(station.joints).hasSize(2).allSatisfy(j -> {
            assertThat(j.result().verdict()).isEqualTo(hammerstep.joint.Verdict.GO);
            assertThat(j.result().blowsAfterShutoff()).isZero();
            assertThat(j.result().finalTorqueNm()).isBetween(200.0, 230.0);
        });
        assertThat(station.blowsStartedAfterDisable).isZero();
        assertThat(station.agent.lastShutoffToRelayNs()).isBetween(0L, StationFixture.BLOCK_NS);
        assertThat(station.parts).singleElement().satisfies(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(station.lamps.lit(TowerLamp.GREEN)).isTrue();
        assertThat(station.tool.enabled).isFalse();
    }

    @Test
    void aWeakToolGoesToReworkAndTheButtonReleasesIt() {
        station.agent.doWork();
        station.stepNm = 30; // saturates below shut-off: the rundown times out at the operator's release
        station.scanner.queue.add(new PartIdentity("SN-101", "M"));
        station.cycle();
        station.pullTrigger();
        for (int k = 0; k < 20; k++) { // about 4 blows, peaks up to 120 N·m
            station.cycle();
        }
        station.trigger = false;
        for (int k = 0; k < 40; k++) {
            station.cycle();
        }
        assertThat(station.joints).singleElement().satisfies(j ->
                assertThat(j.result().verdict()).isEqualTo(hammerstep.joint.Verdict.NO_GO));
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.REWORK);
        assertThat(station.tool.enabled).isFalse();
        assertThat(station.lamps.lit(TowerLamp.RED)).isTrue();
        station.inputs.ack = true;
        station.cycle();
        station.inputs.ack = false;
        station.cycle();
        assertThat(station.agent.sequence().phase()).isEqualTo(Phase.PROMPT);
        assertThat(station.tool.enabled).isTrue();
        station.stepNm = 45;
        station.tighten();
        assertThat(station.joints).hasSize(2);
        assertThat(station.joints.get(1).attempt()).isEqualTo(2);
    }

    @Test
    void blinksAPromptedPositionLampFromTheClock() {
        station.scanner.queue.add(new PartIdentity("SN-102", "M"));
        station.agent.doWork();
        boolean first = station.lamps.positions[0];
        station.clock.advanceNs(500_000_000L);
        station.agent.doWork();
        assertThat(station.lamps.positions[0]).isNotEqualTo(first);
        assertThat(station.lamps.positions[1]).isFalse();
    }
}
