package hammerstep.station.loop;

import hammerstep.results.MemoryOutbox;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;
import org.agrona.concurrent.AgentTerminationException;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** What the duty cycle does with what a cycle throws: safe-off always; an Error stops the station. */
class StationAgentErrorTest {

    private final StationFixture station = new StationFixture();

    @BeforeEach
    void startAPositionPrompted() {
        station.start(new MemoryOutbox(), StationFixture.replayConditioning());
        station.scanner.queue.add(new PartIdentity("SN-1", "M"));
        station.cycle();
        station.tighten(); // position 1 GO: green lit, position 2 prompted, tool on
        assertThat(station.tool.enabled).isTrue();
        assertThat(station.lamps.lit(TowerLamp.GREEN)).isTrue();
        assertThat(station.lamps.positions).contains(true);
    }

    @Test
    void anExceptionDropsTheToolShowsTheFaultPictureAndTheLoopGoesOn() {
        station.inputs.failWith = new IllegalStateException("a fault in the cycle");
        station.agent.doWork();
        assertThat(station.errors).singleElement().isInstanceOf(IllegalStateException.class);
        assertThat(station.tool.enabled).isFalse();
        assertFaultPicture();

        station.cycle();
        assertThat(station.tool.enabled).as("the next cycle restores what the sequence asks").isTrue();
        assertThat(station.lamps.lit(TowerLamp.RED)).isFalse();
        assertThat(station.agent.errors()).isEqualTo(1);
    }

    @Test
    void anErrorDropsTheToolShowsTheFaultPictureAndStopsTheStationForGood() {
        OutOfMemoryError oom = new OutOfMemoryError("test");
        station.inputs.failWith = oom;
        assertThatThrownBy(() -> station.agent.doWork())
                .isInstanceOf(AgentTerminationException.class).hasCause(oom);
        assertThat(station.errors).containsExactly(oom);
        assertThat(station.tool.enabled).isFalse();
        assertFaultPicture();

        int writes = station.lamps.writes;
        int toolCommands = station.tool.commands.size();
        for (int k = 0; k < 10; k++) {
            assertThat(station.agent.doWork()).isZero();
        }
        assertThat(station.tool.enabled).isFalse();
        assertThat(station.tool.commands).hasSize(toolCommands);
        assertThat(station.lamps.writes).as("a stopped station touches nothing").isEqualTo(writes);
    }

    private void assertFaultPicture() {
        assertThat(station.lamps.lit(TowerLamp.RED)).isTrue();
        for (TowerLamp t : TowerLamp.values()) {
            if (t != TowerLamp.RED) {
                assertThat(station.lamps.lit(t)).as(t.name()).isFalse();
            }
        }
        assertThat(station.lamps.positions).containsOnly(false);
    }
}
