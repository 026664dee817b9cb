package hammerstep.station.loop;

import hammerstep.health.ToolHealth;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.StationEvent;
import hammerstep.station.TowerLamp;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceKeeper;
import hammerstep.trace.TraceRecorder;
import hammerstep.trace.TraceStore;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The station loop with the engineer's watches attached: every joint's trace kept and named in its
 * result, and tool health raising TOOL_WEAK with the yellow lamp when the synthetic tool slows down.
 */
class StationAgentWatchTest {

    @TempDir
    Path dir;

    private final StationFixture station = new StationFixture();

    @BeforeEach
    void start() {
        station.start(new MemoryOutbox(), StationFixture.replayConditioning());
        station.stepNm = 30; // peak = 30 N·m × n
    }

    private void tightenPart(String serial) {
        station.scanPart(serial);
        station.tighten(300, 40);
        station.tighten(300, 40);
        station.cycles(200);
    }

    @Test
    void keepsEveryJointsTraceAndRaisesToolWeakWithTheYellowLampWhenTheToolSlows() throws Exception {
        station.agent.keepTraces(new TraceKeeper(TraceRecorder.forSeconds(StationFixture.RATE, 2),
                new TraceStore(dir, 100, Long.MAX_VALUE, StoredTrace.Encoding.INT16), 20));
        station.agent.watchTool("AW-1", new ToolHealth(new ToolHealth.Settings(4, 3, 0.15, 3)));
        station.agent.doWork();

        for (int p = 0; p < 4; p++) {
            tightenPart("SN-" + p);
        }
        assertThat(station.events).isEmpty();
        assertThat(station.lamps.lit(TowerLamp.YELLOW)).isFalse();

        station.intervalNs = 26_000_000L; // 3000 → about 2300 blows/min: 23 % slower
        for (int p = 4; p < 7; p++) {
            tightenPart("SN-" + p);
        }

        assertThat(station.errors).isEmpty();
        assertThat(station.joints).hasSize(14).allSatisfy(j -> {
            assertThat(j.tracePath()).isNotNull();
            assertThat(Path.of(j.tracePath())).exists();
        });
        assertThat(StoredTrace.readHeader(Path.of(station.joints.get(0).tracePath())).metadata())
                .containsEntry("part_serial", "SN-0").containsEntry("program", "final");
        assertThat(station.events).singleElement().satisfies(e -> {
            assertThat(e.code()).isEqualTo("TOOL_WEAK");
            assertThat(e.severity()).isEqualTo(StationEvent.Severity.WARNING);
            assertThat(e.message()).contains("tool AW-1 on program final: blow rate fell");
        });
        assertThat(station.lamps.lit(TowerLamp.YELLOW)).isTrue();

        station.intervalNs = 20_000_000L;
        for (int p = 7; p < 10; p++) {
            tightenPart("SN-" + p);
        }
        assertThat(station.events).extracting(StationEvent::code).containsExactly("TOOL_WEAK", "TOOL_OK");
        assertThat(station.lamps.lit(TowerLamp.YELLOW)).isFalse();
    }
}
