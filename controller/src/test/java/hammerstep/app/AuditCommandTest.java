package hammerstep.app;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import javax.imageio.ImageIO;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class AuditCommandTest {

    static final String AUDITS = "src/test/resources/analysis/hand-audits.csv";
    static final String RESULTS = "src/test/resources/analysis/hand-audit-results.jsonl";

    @TempDir
    Path dir;

    /* The figures worked by hand in AuditStudyTest.matchesTheHandWorkedExample (same five pairs). */
    @Test
    @DisplayName("audit --json gives the hand-worked fit and window (least squares, t prediction interval)")
    void jsonGivesTheHandWorkedFigures() throws Exception {
        Captured run = Captured.run("audit", AUDITS, RESULTS, "--spec", "85:105", "--json");

        assertThat(run.exit()).as(run.err()).isZero();
        JsonNode doc = new ObjectMapper().readTree(run.out());
        assertThat(doc.get("audits").asInt()).isEqualTo(6);
        assertThat(doc.get("unpaired_lines")).extracting(JsonNode::asInt).containsExactly(8);
        JsonNode g = doc.get("groups").get(0);
        assertThat(g.get("program").asText()).isEqualTo("cover-m10");
        assertThat(g.get("method").asText()).isEqualTo("first_movement");
        assertThat(g.get("n").asInt()).isEqualTo(5);
        assertThat(g.get("r").asDouble()).isEqualTo(0.9978);
        assertThat(g.get("a_nm").asDouble()).isEqualTo(7.2);
        assertThat(g.get("b").asDouble()).isEqualTo(0.74);
        assertThat(g.get("se_nm").asDouble()).isEqualTo(0.8944);
        assertThat(g.get("mean_offset_nm").asDouble()).isEqualTo(-24.0);
        assertThat(g.get("t").asDouble()).isEqualTo(3.1824);
        assertThat(g.get("dynamic_window").get("min_nm").asDouble()).isEqualTo(109.54);
        assertThat(g.get("dynamic_window").get("max_nm").asDouble()).isEqualTo(127.84);
    }

    @Test
    void aSubscribersRawLogPairsEachJointOnceAndSaysWhatItDropped() throws Exception {
        Path log = SubscriberLog.write(Path.of(RESULTS), dir.resolve("qs.log"));
        Captured clean = Captured.run("audit", AUDITS, RESULTS, "--spec", "85:105", "--json");
        Captured raw = Captured.run("audit", AUDITS, log.toString(), "--spec", "85:105", "--json");

        assertThat(raw.exit()).as(raw.err()).isZero();
        JsonNode c = new ObjectMapper().readTree(clean.out());
        JsonNode r = new ObjectMapper().readTree(raw.out());
        assertThat(r.get("groups")).as("the same pairs, not each twice").isEqualTo(c.get("groups"));
        assertThat(r.get("duplicates_dropped").asInt()).isEqualTo(5);
        assertThat(Captured.run("audit", AUDITS, log.toString(), "--spec", "85:105").out())
                .contains(log + ": 5 joint results used, 5 repeated messages (same id) dropped");
    }

    @Test
    void textNamesTheWindowAndItsUncertainty() {
        Captured run = Captured.run("audit", AUDITS, RESULTS, "--spec", "85:105");

        assertThat(run.exit()).isZero();
        assertThat(run.out()).contains("dynamic window 109.5 .. 127.8 N·m", "at 95 % (prediction interval, t with 3 dof)",
                "not paired: lines [8]");
    }

    @Test
    void drawsTheScatter() throws Exception {
        Path png = dir.resolve("a.png");

        assertThat(Captured.run("audit", AUDITS, RESULTS, "--spec", "85:105", "--plot", png.toString()).exit()).isZero();
        assertThat(ImageIO.read(png.toFile()).getHeight()).isEqualTo(600);
    }

    @Test
    void refusesABadSpec() {
        Captured run = Captured.run("audit", AUDITS, RESULTS, "--spec", "105:85");

        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err().strip()).isEqualTo("--spec '105:85': MIN must be at least 0 and below MAX");
    }

    /* The same audits as the hand-worked example, their joints carrying residual estimates 80..120 N·m
       (EstimateFitTest works that fit by hand). */
    @Test
    void bothFitsSideBySideAndTheCalibrationAProgramCanCarry() throws Exception {
        String estimates = "src/test/resources/analysis/hand-audit-estimates.jsonl";
        Captured text = Captured.run("audit", AUDITS, estimates);
        assertThat(text.exit()).as(text.err()).isZero();
        assertThat(text.out()).contains("against dynamic torque", "against the residual estimate",
                "7.200 + 0.74000 * dynamic", "22.000 + 0.74000 * estimate", "±3.60 N·m",
                "program key: residual_calibration: { factor: 0.74000, offset_nm: 22.000, band_nm: 3.60, audits: 5, date: ");

        Captured json = Captured.run("audit", AUDITS, estimates, "--json");
        JsonNode fit = new ObjectMapper().readTree(json.out()).get("groups").get(0).get("estimate_fit");
        assertThat(fit.get("kind").asText()).isEqualTo("line");
        assertThat(fit.get("factor").asDouble()).isEqualTo(0.74);
        assertThat(fit.get("offset_nm").asDouble()).isEqualTo(22.0);
        assertThat(fit.get("band_nm").asDouble()).isEqualTo(3.6);
        assertThat(fit.get("n").asInt()).isEqualTo(5);
    }

    @Test
    void withoutEstimatesInTheResultsTheTextSaysSo() {
        Captured run = Captured.run("audit", AUDITS, RESULTS);
        assertThat(run.out()).contains("against the residual estimate: fewer than 2 audited joints carry one");
    }
}
