package hammerstep.web;

import hammerstep.joint.Reason;
import hammerstep.web.ResultLog.JointRow;
import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class JointFilterTest {

    private final ResultLog log = new ResultLog(1000);

    JointFilterTest() {
        Joints.add(log, "a", 1, Joints.joint(Joints.SNUG, "P-1", "D1", "snug", 110, 3, List.of(), 0));
        Joints.add(log, "b", 2, Joints.joint(Joints.FLANGE, "P-1", "D1", "final", 210, 8, List.of(), 1));
        Joints.add(log, "c", 3, Joints.joint(Joints.FLANGE, "P-1", "D2", "final", 170, 8, List.of(Reason.TORQUE_LOW), 2));
        Joints.add(log, "d", 4, Joints.joint(Joints.FLANGE, "P-2", "D1", "final", 240, 9, List.of(Reason.TORQUE_HIGH), 3));
        Joints.add(log, "e", 5, Joints.joint(Joints.FLANGE, "P-2", "D2", "final", 205, 2,
                List.of(Reason.BLOWS_FEW, Reason.TORQUE_LOW), 4));
    }

    private List<String> ids(Map<String, String> q) throws JointFilter.BadQuery {
        return JointFilter.of(q).apply(log.joints()).stream().map(JointRow::id).toList();
    }

    @Test
    void withoutCriteriaShowsEveryJointNewestFirst() throws Exception {
        assertThat(ids(Map.of())).containsExactly("e", "d", "c", "b", "a");
    }

    @Test
    void everyCriterionNarrowsTheTable() throws Exception {
        assertThat(ids(Map.of("serial", "P-1"))).containsExactly("c", "b", "a");
        assertThat(ids(Map.of("program", "flange-final", "position", "D1"))).containsExactly("d", "b");
        assertThat(ids(Map.of("pass", "snug"))).containsExactly("a");
        assertThat(ids(Map.of("verdict", "go"))).containsExactly("b", "a");
        assertThat(ids(Map.of("verdict", "NO_GO", "reason", "torque_low"))).containsExactly("e", "c");
        assertThat(ids(Map.of("reason", "BLOWS_FEW"))).containsExactly("e");
        assertThat(ids(Map.of("serial", "P-3"))).isEmpty();
    }

    @Test
    void aTimeRangeIncludesItsStartAndExcludesItsEnd() throws Exception {
        assertThat(ids(Map.of("from", "2026-03-02T06:01", "to", "2026-03-02T06:03"))).containsExactly("c", "b");
        assertThat(ids(Map.of("from", "2026-03-02T06:03:00Z"))).containsExactly("e", "d");
    }

    @Test
    void pagesCutTheMatchingJointsInOrder() throws Exception {
        ResultLog many = new ResultLog(1000);
        for (int i = 0; i < 120; i++) {
            Joints.add(many, "j" + i, i, Joints.joint(Joints.FLANGE, "P", "D1", "final", 200, 8, List.of(), i));
        }
        JointFilter f = JointFilter.of(Map.of("page", "2"));
        List<JointRow> matching = f.apply(many.joints());
        List<JointRow> page = f.page(matching);
        assertThat(page).hasSize(20);
        assertThat(page.get(0).id()).isEqualTo("j19");
        assertThat(f.onPage(9).page(matching)).isEmpty();
    }

    @Test
    void refusesWhatItCannotRead() {
        assertThatThrownBy(() -> JointFilter.of(Map.of("verdict", "MAYBE"))).hasMessageContaining("GO or NO_GO");
        assertThatThrownBy(() -> JointFilter.of(Map.of("from", "yesterday"))).hasMessageContaining("from must be a time");
        assertThatThrownBy(() -> JointFilter.of(Map.of("page", "-1"))).hasMessageContaining("page");
        assertThatThrownBy(() -> JointFilter.of(Map.of("page", "x"))).hasMessageContaining("whole number");
    }

    @Test
    void itsQueryReadsBackToTheSameCriteria() throws Exception {
        JointFilter f = JointFilter.of(Map.of("serial", "P 1&2", "from", "2026-03-02T06:01", "verdict", "NO_GO"));
        JointFilter back = JointFilter.of(WebView.query(f.query()));
        assertThat(back).isEqualTo(f);
    }
}
