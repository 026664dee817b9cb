package hammerstep.web;

import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Pattern;
import org.junit.jupiter.api.Test;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/** The programs and patterns page: what is in use, with the revisions results carry, and check's lines. */
class ProgramsPageTest {

    private static final Pattern FLANGE_4 = new Pattern("flange-4", "a1b2c3d4e5f6", List.of("D1", "D2", "D3", "D4"),
            List.of(new Pattern.Pass("snug", Joints.SNUG, new int[] {0, 2, 1, 3}, 1, Acknowledge.OPERATOR,
                            AfterNoGo.REJECT),
                    new Pattern.Pass("final", Joints.FLANGE, new int[] {0, 2, 1, 3}, 2, Acknowledge.OPERATOR,
                            AfterNoGo.REJECT)));

    private static Map<String, Pattern> models() {
        Map<String, Pattern> m = new LinkedHashMap<>();
        m.put("FL-4", FLANGE_4);
        m.put("FL-4S", FLANGE_4);
        return m;
    }

    private final LiveBoard board = new LiveBoard(20_000, new ResultLog(10));
    private final Pages pages = new Pages(board, "plant/line/st-1", false);

    @Test
    void showsEachPatternOnceWithItsModelsAndEachProgramWithTheRevisionResultsCarry() {
        String html = ProgramsPage.of(pages, new WebStation(null, models(), List::of)).html();
        assertThat(html).contains("id=\"programs-patterns\"").contains("id=\"programs-programs\"")
                .contains("id=\"programs-valid\"").doesNotContain("id=\"programs-validation\"");
        assertThat(html.split("<tr data-pattern=\"flange-4\"", -1)).as("one row per pass").hasSize(3);
        assertThat(html).contains("FL-4 FL-4S").contains("a1b2c3d4e5f6").contains("D1 D3 D2 D4");
        // the program's revision is the one its joints carry (JointProgram.revision, program_revision in the message)
        assertThat(html).contains("<tr data-program=\"flange-final\"><td>flange-final</td><td class=\"revision\"><code>"
                + Joints.FLANGE.revision() + "</code>");
        assertThat(html).contains("180.0 · 200.0 · 230.0").contains("flange-4 · final").contains("205.0")
                .contains("<tr data-program=\"flange-snug\">");
    }

    @Test
    void showsCheckLinesForTheFilesAsTheyAreNow() {
        List<String> lines = List.of("programs/flange-final.yaml:2:16: 'torque.min' (240.0) is above 'torque.max' (230.0)");
        String html = ProgramsPage.of(pages, new WebStation(null, models(), () -> lines)).html();
        assertThat(html).contains("id=\"programs-validation\"")
                .contains("<li><code>programs/flange-final.yaml:2:16: &#39;torque.min&#39; (240.0) is above")
                .doesNotContain("id=\"programs-valid\"");
    }

    @Test
    void withoutThePatternsThePageSaysSo() {
        assertThat(ProgramsPage.of(pages, WebStation.none()).html()).contains("nothing to show");
    }
}
