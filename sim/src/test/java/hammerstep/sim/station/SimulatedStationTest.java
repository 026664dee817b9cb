package hammerstep.sim.station;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationId;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Order;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.station.PartIdentity;
import hammerstep.station.VirtualClock;
import hammerstep.station.loop.RecordingListener;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

class SimulatedStationTest {

    private static final double RATE = 20_000;

    private static JointProgram program(String id, double min, double target, double max, double shutoff, int rehit) {
        return new JointProgram(id, "", new JointProgram.Torque(min, target, max), FinalTorque.MAX_PEAK,
                new JointProgram.Blows(20, 10, 1, 60, 7.5), new JointProgram.Rundown(10, 150, 5000), shutoff, rehit);
    }

    private static final Pattern HUB = new Pattern("hub-5", "", List.of("1", "2", "3", "4", "5"), List.of(
            new Pattern.Pass("snug", program("snug", 40, 60, 90, 55, 0), Order.cross(5), 3, Acknowledge.OPERATOR,
                    AfterNoGo.REJECT),
            new Pattern.Pass("final", program("final", 150, 165, 190, 160, 1), Order.cross(5), 2,
                    Acknowledge.OPERATOR, AfterNoGo.REJECT)));

    private final RecordingListener reports = new RecordingListener();
    private final List<JointOutcome> joints = reports.joints;
    private final List<PartOutcome> parts = reports.parts;
    private final List<Throwable> errors = new ArrayList<>();

    private SimulatedStation build(Habits habits, long seed, boolean confirm, int count) {
        VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
        VirtualStation hw = new VirtualStation(new StepTool(5, RATE, 25, 400, 3300),
                new VirtualStation.Fixture(5, true, confirm, 0), RATE, 64, 16, 1_200_000_000L);
        long[] ids = {0};
        ResultSink sink = new OutboxResultSink(new MemoryOutbox(), new StationId("s", "l", "t"),
                () -> "j" + ids[0]++, new VirtualClock(Instant.EPOCH));
        List<PartIdentity> list = new ArrayList<>();
        for (int i = 0; i < count; i++) {
            list.add(new PartIdentity("SN-" + (100 + i), "HX"));
        }
        return new SimulatedStation(clock, hw, sink, Map.of("HX", HUB), new Sequence.Settings("TQ-SIM", null, 1500),
                JointMonitor.replayConditioning(HUB.passes().get(0).program()), 1_000_000_000L, habits, list, seed,
                reports, errors::add);
    }

    private void run(SimulatedStation s) {
        long limit = 3_600_000_000_000L;
        while (!s.finished() && s.nowNs() < limit) {
            s.step();
        }
        assertThat(s.finished()).as("operator finished within an hour of virtual time").isTrue();
        assertThat(errors).isEmpty();
    }

    @Test
    void aCarefulOperatorFinishesEveryPartGoWithNoBlowAfterShutoff() {
        SimulatedStation s = build(Habits.careful(), 1, true, 3);
        run(s);
        assertThat(parts).hasSize(3).allSatisfy(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(joints).hasSize(30).allSatisfy(j -> {
            assertThat(j.result().verdict()).isEqualTo(Verdict.GO);
            assertThat(j.result().blowsAfterShutoff()).isZero();
        });
        assertThat(joints.subList(0, 5)).extracting(JointOutcome::positionIndex).containsExactly(1, 3, 5, 2, 4);
        assertThat(s.agent().inputStage().gapsOutsideRundowns() + s.agent().inputStage().gapsDuringRundowns())
                .as("data gaps in a simulated shift whose station keeps up").isZero();
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1, 2, 3, 4, 5, 6, 7, 8})
    void anOperatorWithMistakesStillEndsEveryPartAndNoGoPartIsCalledGo(long seed) {
        Habits sloppy = new Habits(400, 700, 150, 4000, 5000, 0.1, 0.1, 0.15, 0.1, 0.2, 6000);
        SimulatedStation s = build(sloppy, seed, seed % 2 == 0, 3);
        run(s);
        assertThat(parts).hasSize(3);
        assertThat(s.operator().mistakes()).isPositive();
        for (PartOutcome p : parts) {
            List<JointOutcome> mine = joints.stream().filter(j -> j.partSerial().equals(p.partSerial())).toList();
            if (p.verdict().equals("GO")) {
                for (Pattern.Pass pass : HUB.passes()) {
                    for (int pos = 1; pos <= 5; pos++) {
                        int position = pos;
                        JointOutcome last = mine.stream()
                                .filter(j -> j.pass().equals(pass.name()) && j.positionIndex() == position)
                                .reduce((a, b) -> b).orElseThrow();
                        assertThat(last.result().verdict()).isEqualTo(Verdict.GO);
                    }
                }
            }
        }
        assertThat(joints).allSatisfy(j -> assertThat(j.result().blowsAfterShutoff()).isZero());
    }

    @Test
    void theSameSeedGivesTheSameResults() {
        Habits sloppy = new Habits(400, 700, 150, 4000, 5000, 0.1, 0.1, 0.15, 0.1, 0.2, 6000);
        run(build(sloppy, 42, false, 2));
        List<String> first = joints.stream().map(j -> j.positionIndex() + ":" + j.result().finalTorqueNm()).toList();
        joints.clear();
        parts.clear();
        run(build(sloppy, 42, false, 2));
        assertThat(joints.stream().map(j -> j.positionIndex() + ":" + j.result().finalTorqueNm()).toList())
                .isEqualTo(first);
    }
}
