package hammerstep.sim.station;

import hammerstep.config.ConfigException;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.ProgramFile;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationId;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.sim.physics.Presets;
import hammerstep.station.PartIdentity;
import hammerstep.station.VirtualClock;
import hammerstep.station.loop.RecordingListener;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Shut-off on the physics rig: the demo's snug and final programs on the demo's joint, with the cordless tools
 * at their nominal 18 V, from about 1200 to about 3100 blows per minute (demo runs reach 3350 on single
 * joints). Overdriven (21 V and more) the modelled hammer can carry enough energy for one more strike
 * after the cut; that is outside the demo's tools and is noted in docs/design.md. The station drops the relay within one 0.8 ms
 * block of the crossing; no blow may begin after it, neither in the measurement nor in the model.
 */
class ShutoffWithRigTest {

    private static final double RATE = 20_000;
    private static final int BLOCK = 16;

    @ParameterizedTest(name = "{0} at {1} V, mains {2} Hz named")
    @CsvSource({
            "cordless-skip-dog, 18.0, 0",
            "cordless-two-dog, 18.0, 0",
            "cordless-three-dog, 18.0, 0",
            "cordless-three-dog, 18.0, 50"})
    void noBlowBeginsAfterShutoff(String toolName, double volts, double mainsHz) throws ConfigException {
        JointProgram snug = ProgramFile.load(Path.of("../config/demo/programs/flange-snug.yaml"));
        JointProgram fin = ProgramFile.load(Path.of("../config/demo/programs/flange-final.yaml"));
        Pattern pattern = new Pattern("ring-4", "", List.of("1", "2", "3", "4"), List.of(
                new Pattern.Pass("snug", snug, Order.cross(4), 3, Acknowledge.OPERATOR, AfterNoGo.CONTINUE),
                new Pattern.Pass("final", fin, Order.cross(4), 3, Acknowledge.OPERATOR, AfterNoGo.CONTINUE)));
        RigToolModel tool = new RigToolModel(Presets.tool(toolName), Presets.joint("flange-m16"),
                Presets.defaultTransducer(), RATE, 11, 4, 400_000);
        tool.setBatteryVoltage(volts);
        tool.setBlowThresholdNm(fin.blows().countAboveNm());
        VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
        VirtualStation hw = new VirtualStation(tool, new VirtualStation.Fixture(4, true, true, 0), RATE, BLOCK, 64,
                1_200_000_000L);
        RecordingListener reports = new RecordingListener();
        List<JointOutcome> joints = reports.joints;
        List<PartOutcome> parts = reports.parts;
        List<Throwable> errors = new ArrayList<>();
        long[] ids = {0};
        SimulatedStation s = new SimulatedStation(clock, hw,
                new OutboxResultSink(new MemoryOutbox(), new StationId("t", "t", "t"), () -> "j" + ids[0]++,
                        new VirtualClock(Instant.EPOCH)),
                Map.of("R", pattern), new Sequence.Settings("TQ", null, 500),
                // as the station conditions it: the transducer's range is known (a quantised crest of an
                // unknown range can pass for a flat top, see docs/design.md)
                JointMonitor.replayConditioning(fin).withRange(Presets.defaultTransducer().ratedTorqueNm())
                        .withMains(mainsHz), 1_000_000_000L, Habits.careful(),
                List.of(new PartIdentity("R-1", "R"), new PartIdentity("R-2", "R")), 3,
                reports, errors::add);
        while (!s.finished() && s.nowNs() < 300_000_000_000L) {
            s.step();
        }
        assertThat(errors).isEmpty();
        assertThat(parts).hasSize(2);
        assertThat(joints).isNotEmpty().allSatisfy(j -> {
            assertThat(j.result().shutoffReached()).isTrue();
            // A hammer already thrown back by the shut-off blow is driven into the jaw again by its cam
            // spring: one rebound strike about 12 ms later, at about a third of the peak, that no relay can
            // prevent (docs/simulator.md, "Known disagreements"). More than that would be the station's fault.
            assertThat(j.result().blowsAfterShutoff()).isLessThanOrEqualTo(1);
        });
        assertThat(tool.blowsAfterRelayOff()).as("blows in the model after the relay dropped, at most one rebound per joint")
                .isLessThanOrEqualTo(joints.size());
        // from the crossing sample to the relay: within one block, plus the impulse rejector's look-ahead
        // (the conditioner hands a sample on only once it knows it is no electrical impulse); the hum
        // canceller, where the mains frequency is named, adds nothing to it
        long lookAheadNs = Math.round(new hammerstep.signal.Conditioner(JointMonitor.replayConditioning(fin), RATE)
                .delaySamples() * 1e9 / RATE);
        assertThat(s.agent().maxShutoffToRelayNs()).isBetween(0L, hw.blockNs() + lookAheadNs);
        double fastest = joints.stream().mapToDouble(j -> rateUpToShutoff(j.result())).max().orElse(0);
        assertThat(fastest).isLessThan(3400);
        if (toolName.equals("cordless-three-dog")) {
            assertThat(fastest).as("the demo's tool strikes at about 2700 to 3300 per minute").isGreaterThan(2600);
        }
    }

    /**
     * Blows per minute over a joint's blows up to the shut-off crossing, leaving out rebound re-strikes
     * (peaks below half the joint's highest): the tool's rate, not its rebounds.
     */
    private static double rateUpToShutoff(hammerstep.joint.JointResult r) {
        long[] t = r.peakTimesNs();
        double[] p = r.peaksNm();
        double max = 0;
        for (double v : p) {
            max = Math.max(max, v);
        }
        long first = -1;
        long last = -1;
        int n = 0;
        for (int i = 0; i < t.length; i++) {
            if (p[i] < 0.5 * max || (r.shutoffReached() && t[i] > r.shutoffAtNs() + 2_000_000L)) {
                continue;
            }
            first = first < 0 ? t[i] : first;
            last = t[i];
            n++;
        }
        return n < 2 ? 0.0 : (n - 1) * 60.0 / ((last - first) * 1e-9);
    }
}
