package hammerstep.app;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import javax.imageio.ImageIO;
import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class StatsCommandTest {

    static final Path HAND = Paths.get("src/test/resources/analysis/hand-example.jsonl");

    @TempDir
    Path dir;

    /*
     * hand-example.jsonl: program flange-m12, window 80..100 N·m, blows 4..12; five GO joints with final
     * torques 92, 94, 96, 93, 95 and blows 6, 7, 8, 7, 7, one part message, one SENSOR_FAULT joint.
     * By hand: mean 94.0, s = sqrt(10/4) = 1.5811, Cm = 20/9.4868 = 2.108, Cmk = 6/4.7434 = 1.265;
     * blows mean 7, s = 0.7071, Cm = 8/4.2426 = 1.886, Cmk = 3/2.1213 = 1.414 (VDI/VDE 2645-2 style indices).
     */
    @Test
    @DisplayName("stats --json gives the figures of the hand-worked example")
    void jsonGivesTheHandWorkedFigures() throws Exception {
        Captured run = Captured.run("stats", HAND.toString(), "--json");

        assertThat(run.exit()).isZero();
        JsonNode doc = new ObjectMapper().readTree(run.out());
        assertThat(doc.get("joints").asInt()).isEqualTo(6);
        assertThat(doc.get("sensor_fault_excluded").asInt()).isEqualTo(1);
        assertThat(doc.get("other_lines_skipped").asInt()).isEqualTo(1);
        JsonNode all = doc.get("groups").get(0);
        assertThat(all.get("program").asText()).isEqualTo("flange-m12");
        assertThat(all.has("position")).isFalse();
        assertThat(all.get("n").asInt()).isEqualTo(5);
        assertThat(all.get("mean_nm").asDouble()).isEqualTo(94.0);
        assertThat(all.get("sd_nm").asDouble()).isCloseTo(1.5811, within(1e-4));
        assertThat(all.get("cm").asDouble()).isEqualTo(2.108);
        assertThat(all.get("cmk").asDouble()).isEqualTo(1.265);
        assertThat(all.get("blows_mean").asDouble()).isEqualTo(7.0);
        assertThat(all.get("blows_cm").asDouble()).isEqualTo(1.886);
        assertThat(all.get("blows_cmk").asDouble()).isEqualTo(1.414);
        assertThat(all.get("flags")).extracting(JsonNode::asText)
                .containsExactly("CMK_LOW", "BLOWS_CMK_LOW", "FEW_JOINTS");
        assertThat(all.get("limits").get("torque_nm").get("min").asDouble()).isEqualTo(80.0);
        JsonNode p2 = doc.get("groups").get(2);
        assertThat(p2.get("position").asText()).isEqualTo("2");
        assertThat(p2.get("cmk").asDouble()).isEqualTo(3.064);
        assertThat(p2.get("blows_cm").isNull()).as("no spread in blows: index undefined").isTrue();
    }

    @Test
    void aSubscribersRawLogGivesTheFiguresOfTheCleanFileAndSaysWhatItDropped() throws Exception {
        Path log = SubscriberLog.write(HAND, dir.resolve("qs.log"));
        Captured clean = Captured.run("stats", HAND.toString(), "--json");
        Captured raw = Captured.run("stats", log.toString(), "--json");

        assertThat(raw.exit()).as(raw.err()).isZero();
        JsonNode c = new ObjectMapper().readTree(clean.out());
        JsonNode r = new ObjectMapper().readTree(raw.out());
        assertThat(r.get("groups")).as("every joint once: n not doubled, sd not 0").isEqualTo(c.get("groups"));
        assertThat(r.get("joints")).isEqualTo(c.get("joints"));
        assertThat(r.get("duplicates_dropped").asInt()).as("each of the 7 messages came twice").isEqualTo(7);
        assertThat(c.get("duplicates_dropped").asInt()).isZero();
        assertThat(r.get("unreadable_lines_skipped").asInt()).as("the cut line of no topic").isEqualTo(1);

        Captured table = Captured.run("stats", log.toString());
        assertThat(table.out()).contains("7 repeated messages (same id) dropped",
                "1 line that is no message, skipped (first: line 14)");
    }

    @Test
    void theSameIdWithOtherContentIsRefusedNamingBothLines() throws Exception {
        List<String> lines = Files.readAllLines(HAND);
        Path f = dir.resolve("mixed.jsonl");
        List<String> mixed = new ArrayList<>(lines);
        mixed.add(lines.get(0).replace("\"final_torque_nm\": 92.0", "\"final_torque_nm\": 99.0"));
        Files.write(f, mixed);

        Captured run = Captured.run("stats", f.toString());

        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err().strip()).isEqualTo(f + ":" + mixed.size() + ": message id \"j-0001\" came on line 1"
                + " with other content; a station never sends two different messages under one id (logs of two"
                + " stations or two journals mixed?): which one is the result cannot be told");
    }

    @Test
    void aJointCutShortIsRefusedNotLeftOut() throws Exception {
        String first = Files.readAllLines(HAND).get(0);
        Path f = dir.resolve("cut.jsonl");
        Files.write(f, List.of(first.replace("j-0001", "j-0009"), first.substring(0, 60)));

        Captured run = Captured.run("stats", f.toString());

        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err().strip()).startsWith(f + ":2: not a JSON object").contains("a joint result that cannot be read");
    }

    @Test
    void tablePrintsFlagsAndTheRule() {
        Captured run = Captured.run("stats", HAND.toString());

        assertThat(run.exit()).isZero();
        assertThat(run.out()).contains("flange-m12", "CMK_LOW", "1 with a sensor fault left out", "VDI/VDE 2645-2");
    }

    @Test
    void drawsAReadablePng() throws Exception {
        Path png = dir.resolve("cap.png");

        Captured run = Captured.run("stats", HAND.toString(), "--plot", png.toString());

        assertThat(run.exit()).isZero();
        BufferedImage image = ImageIO.read(png.toFile());
        assertThat(image.getWidth()).isEqualTo(1000);
        assertThat(image.getHeight()).isEqualTo(840);
    }

    @Test
    void drawsAnSvg() throws Exception {
        Path svg = dir.resolve("cap.svg");

        assertThat(Captured.run("stats", HAND.toString(), "--plot", svg.toString()).exit()).isZero();
        assertThat(Files.readString(svg)).contains("<svg").contains("</svg>");
    }

    @Test
    void refusesAnUnknownPictureFormat() {
        Captured run = Captured.run("stats", HAND.toString(), "--plot", dir.resolve("x.jpg").toString());

        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err()).contains("must end in .png or .svg");
    }

    @Test
    void aMissingFileIsOneLineAndExit2() {
        Captured run = Captured.run("stats", dir.resolve("none.jsonl").toString());

        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err().strip()).isEqualTo(dir.resolve("none.jsonl") + ": no such file");
    }
}
