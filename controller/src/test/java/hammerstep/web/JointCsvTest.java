package hammerstep.web;

import hammerstep.joint.Reason;
import org.junit.jupiter.api.Test;

import java.io.StringWriter;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class JointCsvTest {

    @Test
    void writesAHeaderAndOneLinePerJointWithTheMessageFields() throws Exception {
        ResultLog log = new ResultLog(10);
        Joints.add(log, "id-1", 7, Joints.joint(Joints.FLANGE, "P-1", "D2", "final", 170.456, 8,
                List.of(Reason.TORQUE_LOW, Reason.BLOWS_FEW), 2));
        StringWriter out = new StringWriter();
        JointCsv.write(log.joints(), out);
        String[] lines = out.toString().split("\r\n");
        assertThat(lines).hasSize(2);
        assertThat(lines[0]).startsWith("seq,id,at,part_serial").contains(",final_torque_nm,blows,");
        assertThat(lines[1]).isEqualTo("7,id-1,2026-03-02T06:02:00Z,P-1,FL-4,flange-4,D2,final,1,flange-final,3,"
                + "170.46,8,90.00,NO_GO,TORQUE_LOW;BLOWS_FEW,180.00,230.00,4,30,tighten,");
        assertThat(lines[0].split(",")).hasSameSizeAs(lines[1].split(",", -1));
    }

    @Test
    void quotesCommasAndQuotesAndDefusesFormulas() {
        assertThat(JointCsv.field("a,b")).isEqualTo("\"a,b\"");
        assertThat(JointCsv.field("say \"hi\"")).isEqualTo("\"say \"\"hi\"\"\"");
        assertThat(JointCsv.field("=HYPERLINK(\"x\")")).isEqualTo("\"'=HYPERLINK(\"\"x\"\")\"");
        assertThat(JointCsv.field("+1")).isEqualTo("'+1");
        assertThat(JointCsv.field("@A1")).isEqualTo("'@A1");
        assertThat(JointCsv.field("P-100")).isEqualTo("P-100");
        assertThat(JointCsv.field("line\nbreak")).isEqualTo("\"line\nbreak\"");
    }
}
