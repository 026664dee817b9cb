package hammerstep.station.loop;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.StationId;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.station.PartIdentity;
import hammerstep.station.PartIdentitySource;
import hammerstep.station.SampleRing;
import hammerstep.station.SystemStationClock;
import hammerstep.station.ToolEnable;
import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.function.BooleanSupplier;

import static org.assertj.core.api.Assertions.assertThat;

/** The agent on its own thread, as on a board: it picks up a part and drops the tool when stopped. */
class StationRunnerTest {

    static final class ThreadSafeTool implements ToolEnable {
        volatile boolean enabled;

        @Override
        public void set(boolean on) {
            enabled = on;
        }
    }

    private static boolean within(long ms, BooleanSupplier condition) {
        long deadline = System.nanoTime() + ms * 1_000_000L;
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() - deadline > 0) {
                return false;
            }
            Thread.onSpinWait();
        }
        return true;
    }

    @Test
    void runsTheDutyCycleOnItsThreadAndDropsTheToolOnClose() {
        JointProgram p = new JointProgram("final", "", new JointProgram.Torque(180, 200, 230), FinalTorque.MAX_PEAK,
                new JointProgram.Blows(40, 20, 2, 40, 7.5), new JointProgram.Rundown(10, 60, 4000), 200, 0);
        Pattern pattern = new Pattern("p1", "", List.of("A"),
                List.of(new Pattern.Pass("final", p, Order.cross(1), 2, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
        ConcurrentLinkedQueue<PartIdentity> scans = new ConcurrentLinkedQueue<>();
        PartIdentitySource scanner = scans::poll;
        ThreadSafeTool tool = new ThreadSafeTool();
        SystemStationClock clock = new SystemStationClock();
        StationAgent agent = new StationAgent(clock,
                new StationPorts(new SampleRing(20_000, 16, 8), new Fakes.RecordingLamps(1), tool, new Fakes.Inputs(),
                        scanner),
                new OutboxResultSink(new MemoryOutbox(), new StationId("s", "l", "t"), () -> "x", new SystemStationClock()),
                new Sequence(new Sequence.Settings("TQ", null, 500), false), Map.of("M", pattern),
                JointMonitor.replayConditioning(p), 1_000_000_000L, StationListener.NONE, Throwable::printStackTrace);
        StationRunner runner = new StationRunner(agent).start();
        try {
            scans.add(new PartIdentity("SN-1", "M"));
            assertThat(within(5_000, () -> tool.enabled)).as("tool enabled for the prompted position").isTrue();
        } finally {
            runner.close();
        }
        assertThat(tool.enabled).isFalse();
        assertThat(agent.errors()).isZero();
    }
}
