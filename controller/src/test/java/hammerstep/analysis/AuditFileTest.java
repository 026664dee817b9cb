package hammerstep.analysis;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class AuditFileTest {

    @TempDir
    Path dir;

    @Test
    void readsRowsByIdAndByPositionInAnyColumnOrder() throws Exception {
        Path f = write("# audits of line 2, week 14", "method,residual_nm,joint_id,part_serial,position",
                "first_movement,86.5,j-000123,,", "breakaway, 91.0 ,,TR-1001,3", "");

        List<Audit> a = AuditFile.read(f);

        assertThat(a).containsExactly(new Audit(3, "j-000123", "", "", Audit.Method.FIRST_MOVEMENT, 86.5),
                new Audit(4, "", "TR-1001", "3", Audit.Method.BREAKAWAY, 91.0));
    }

    @Test
    void namesAnUnknownMethod() throws Exception {
        Path f = write("joint_id,method,residual_nm", "j-1,click,80");

        assertThatThrownBy(() -> AuditFile.read(f))
                .hasMessage(f + ":2: method 'click': expected first_movement, breakaway or mark_return");
    }

    @Test
    void namesARowWithoutItsJoint() throws Exception {
        Path f = write("joint_id,part_serial,position,method,residual_nm", ",TR-1,,breakaway,80");

        assertThatThrownBy(() -> AuditFile.read(f)).hasMessage(f + ":2: give joint_id, or part_serial and position");
    }

    @Test
    void namesABadTorque() throws Exception {
        Path f = write("joint_id,method,residual_nm", "j-1,breakaway,-3");

        assertThatThrownBy(() -> AuditFile.read(f)).hasMessage(f + ":2: residual_nm -3 must be a positive torque in N·m, within any transducer's range");
    }

    @Test
    void namesAnUnknownColumn() throws Exception {
        Path f = write("joint,method,residual_nm");

        assertThatThrownBy(() -> AuditFile.read(f)).hasMessageStartingWith(f + ":1: unknown column 'joint'");
    }

    private Path write(String... lines) throws Exception {
        Path f = dir.resolve("audits.csv");
        Files.write(f, List.of(lines));
        return f;
    }
}
