package hammerstep.web;

import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.analysis.CapabilityStudy;
import hammerstep.analysis.ResultsFile;
import hammerstep.joint.Direction;
import hammerstep.joint.Reason;
import hammerstep.results.JointFields;
import hammerstep.web.ResultLog.JointRow;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

class CapabilityViewTest {

    @TempDir
    Path dir;

    /** 60 seeded joints on two positions, a duplicate delivery and a loosening among them. */
    private static ResultLog log(long seed) {
        ResultLog log = new ResultLog(1000);
        Random rnd = new Random(seed);
        for (int i = 0; i < 60; i++) {
            double nm = 205 + 6 * rnd.nextGaussian();
            int blows = 8 + rnd.nextInt(5);
            List<Reason> reasons = nm < 180 ? List.of(Reason.TORQUE_LOW) : nm > 230 ? List.of(Reason.TORQUE_HIGH) : List.of();
            Joints.add(log, "j" + i, i + 1, Joints.joint(Joints.FLANGE, "P-" + i / 2, i % 2 == 0 ? "D1" : "D2", "final",
                    nm, blows, reasons, i));
        }
        // the same message again (a redelivery): one joint, never counted twice
        Joints.add(log, "j7", 8, log.joints().get(7).joint());
        Joints.add(log, "loose", 61, Joints.joint(Joints.FLANGE, "P-99", "D1", "final", -150, 3,
                List.of(Reason.LOOSENED), 61, Direction.LOOSEN));
        return log;
    }

    /** The joints as the quality system received them: one joint message a line. */
    private Path asResultsFile(List<JointRow> rows) throws Exception {
        ObjectMapper json = new ObjectMapper();
        List<String> lines = new ArrayList<>();
        for (JointRow r : rows) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("schema", ResultsFile.JOINT_SCHEMA);
            m.put("id", r.id());
            m.put("seq", r.seq());
            m.put("part_serial", r.joint().partSerial());
            m.put("position", r.joint().position());
            m.putAll(JointFields.of(r.joint().result()));
            lines.add(json.writeValueAsString(m));
        }
        Path file = dir.resolve("results.jsonl");
        Files.write(file, lines);
        return file;
    }

    @Test
    void givesTheFiguresOfStatsOnTheSameResultsWithoutDuplicates() throws Exception {
        ResultLog log = log(17);
        List<JointRow> rows = log.joints();
        CapabilityStudy.Report web = CapabilityView.of(rows);

        // what `hammerstep stats` computes from the delivered messages, with the redelivery dropped as it drops it
        List<hammerstep.analysis.JointRecord> delivered = new ArrayList<>(ResultsFile.read(asResultsFile(rows)).joints());
        java.util.Set<String> seen = new java.util.HashSet<>();
        delivered.removeIf(j -> !seen.add(j.id()));
        CapabilityStudy.Report stats = CapabilityStudy.of(delivered, true);

        assertThat(web.joints()).isEqualTo(60).isEqualTo(stats.joints());
        assertThat(web.entries()).hasSameSizeAs(stats.entries()).hasSize(3);
        for (int i = 0; i < web.entries().size(); i++) {
            CapabilityStudy.Entry a = web.entries().get(i);
            CapabilityStudy.Entry b = stats.entries().get(i);
            assertThat(a.position()).isEqualTo(b.position());
            assertThat(a.torque()).isEqualTo(b.torque());
            assertThat(a.blows()).isEqualTo(b.blows());
            assertThat(a.flags()).isEqualTo(b.flags());
        }
        assertThat(web.entries().get(0).torque().n()).as("all positions").isEqualTo(60);
        assertThat(web.entries().get(1).torque().n()).as("D1").isEqualTo(30);
    }

    @Test
    void aDuplicateByIdIsCountedOnce() {
        ResultLog log = new ResultLog(10);
        var j = Joints.joint(Joints.FLANGE, "P-1", "D1", "final", 200, 8, List.of(), 0);
        Joints.add(log, "same", 1, j);
        Joints.add(log, "same", 1, j);
        Joints.add(log, "other", 2, Joints.joint(Joints.FLANGE, "P-1", "D2", "final", 210, 8, List.of(), 1));
        assertThat(CapabilityView.records(log.joints())).hasSize(2);
        assertThat(CapabilityView.of(log.joints()).entries().get(0).torque().mean()).isEqualTo(205.0);
    }

    @Test
    void chartsCarryTheLimitsAndEveryJoint() {
        CapabilityStudy.Entry e = CapabilityView.of(log(3).joints()).entries().get(0);
        String hist = CapabilitySvg.histogram(e);
        String run = CapabilitySvg.runChart(e);
        assertThat(hist).startsWith("<svg").contains("class=\"limit\"").contains("class=\"bin\"");
        assertThat(run.split("class=\"runpoint\"", -1)).hasSize(61);
    }
}
