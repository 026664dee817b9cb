package hammerstep.sim.station;

import hammerstep.config.ConfigException;
import hammerstep.joint.Direction;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.ProgramFile;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;
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
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The void-and-retighten flow in virtual time: the demo's tool and program on a four-bolt part, a
 * station without confirm sensors, and an operator who, after finishing a bolt, sometimes goes back to
 * it with the tool in reverse and loosens it. Every loosening is published as a joint result; the
 * bolt it undid is prompted again and tightened again; a part ends GO only with every position's last
 * joint a GO tightening after its last loosening. (Tightened again, a bolt loosened only until the
 * hammering stopped keeps part of its clamp and may take too few blows: NO-GO, an attempt, as on a line.)
 */
class LooseningStationTest {

    private static final double RATE = 20_000;

    @Test
    void aLoosenedBoltIsPromptedAgainAndThePartEndsOnlyWhenItIsTightenedAgain() throws ConfigException {
        // the demo's final program without its rehit rule: a bolt loosened only until the hammering stops
        // keeps part of its clamp, and its first blow when tightened again reaches torque.min, which
        // rehit_blows: 1 calls REHIT (docs/patterns.md)
        JointProgram demo = ProgramFile.load(Path.of("../config/demo/programs/flange-final.yaml"));
        JointProgram fin = new JointProgram(demo.id(), demo.revision(), demo.torque(), demo.finalTorque(),
                demo.blows(), demo.rundown(), demo.shutoffAtNm(), 0);
        Pattern pattern = new Pattern("ring-4", "", List.of("1", "2", "3", "4"), List.of(
                new Pattern.Pass("final", fin, Order.cross(4), 5, Acknowledge.OPERATOR, AfterNoGo.REJECT)));
        RigToolModel tool = new RigToolModel(Presets.tool("cordless-three-dog"), Presets.joint("flange-m16"),
                Presets.defaultTransducer(), RATE, 11, 4, 400_000);
        tool.setBlowThresholdNm(fin.blows().countAboveNm());
        VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
        VirtualStation hw = new VirtualStation(tool, new VirtualStation.Fixture(4, true, false, 0), RATE, 16, 64,
                1_200_000_000L);
        RecordingListener reports = new RecordingListener();
        List<Throwable> errors = new ArrayList<>();
        long[] ids = {0};
        Habits loosens = new Habits(400, 700, 150, 4000, 5000, 0, 0, 0, 0, 0, 0, 0.3);
        SimulatedStation s = new SimulatedStation(clock, hw,
                new OutboxResultSink(new MemoryOutbox(), new StationId("t", "t", "t"), () -> "j" + ids[0]++,
                        new VirtualClock(Instant.EPOCH)),
                Map.of("R", pattern), new Sequence.Settings("TQ", null, 500),
                JointMonitor.replayConditioning(fin), 1_000_000_000L, loosens,
                List.of(new PartIdentity("R-1", "R"), new PartIdentity("R-2", "R")), 5, reports, errors::add);
        while (!s.finished() && s.nowNs() < 600_000_000_000L) {
            s.step();
        }
        assertThat(errors).isEmpty();
        assertThat(s.finished()).isTrue();

        List<JointOutcome> joints = reports.joints;
        List<JointOutcome> loosenings = joints.stream().filter(j -> j.result().loosening()).toList();
        assertThat(loosenings).as("loosenings published as joint results").isNotEmpty().allSatisfy(j -> {
            assertThat(j.result().direction()).isEqualTo(Direction.LOOSEN);
            assertThat(j.result().verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(j.result().reasons()).contains(Reason.LOOSENED);
            assertThat(j.result().peaksNm()).isNotEmpty();
            assertThat(java.util.Arrays.stream(j.result().peaksNm()).max().orElseThrow()).isNegative();
        });
        List<StationEvent> events = reports.events.stream().filter(e -> e.code().equals("LOOSENED")).toList();
        String story = joints.stream().map(j -> j.partSerial() + "/" + j.positionIndex() + ":"
                + j.result().direction().key() + ":" + j.result().verdict() + j.result().reasons() + Math.round(j.result().finalTorqueNm()) + "/" + j.result().blows()).toList() + " " + events;
        assertThat(events).as("one event per loosening: %s", story).hasSize(loosenings.size());
        assertThat(events.stream().filter(e -> e.severity() == StationEvent.Severity.ALARM))
                .as("GO bolts voided: %s", story).isNotEmpty();
        // no tightening read as a loosening, and no loosening judged as a tightening
        assertThat(joints.stream().filter(j -> !j.result().loosening()))
                .allSatisfy(j -> assertThat(java.util.Arrays.stream(j.result().peaksNm()).min().orElse(1)).isPositive());

        assertThat(reports.parts).hasSize(2);
        // a loosened bolt is tightened again and that tightening is what the part ends on
        boolean retightened = false;
        for (int k = 0; k < joints.size(); k++) {
            JointOutcome a = joints.get(k);
            for (int m = k + 1; a.result().loosening() && m < joints.size(); m++) {
                JointOutcome b = joints.get(m);
                retightened |= !b.result().loosening() && b.result().verdict() == Verdict.GO
                        && b.partSerial().equals(a.partSerial()) && b.positionIndex() == a.positionIndex();
            }
        }
        assertThat(retightened).as("a voided position tightened again GO: %s", story).isTrue();
        assertThat(reports.parts).as("parts: %s %s", story, reports.parts)
                .anySatisfy(p -> assertThat(p.verdict()).isEqualTo("GO"));
        for (PartOutcome p : reports.parts) {
            List<JointOutcome> mine = joints.stream().filter(j -> j.partSerial().equals(p.partSerial())).toList();
            for (int pos = 1; pos <= 4; pos++) {
                int position = pos;
                JointOutcome last = mine.stream().filter(j -> j.positionIndex() == position)
                        .reduce((a, b) -> b).orElseThrow();
                // every loosened bolt was tightened again after it, and that tightening is the one that counts
                assertThat(last.result().loosening()).as("%s position %d ends loosened", p.partSerial(), pos).isFalse();
                if (p.verdict().equals("GO")) {
                    assertThat(last.result().verdict()).isEqualTo(Verdict.GO);
                }
            }
        }
    }
}
