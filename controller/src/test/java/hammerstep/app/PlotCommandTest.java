package hammerstep.app;

import hammerstep.trace.StoredTrace;
import hammerstep.trace.SyntheticRundown;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import javax.imageio.ImageIO;
import java.awt.image.BufferedImage;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

class PlotCommandTest {

    static final String PROGRAM = "src/test/resources/programs/wheel-demo.yaml";

    @TempDir
    Path dir;

    @Test
    void drawsAPngWithTheTorqueThePeaksAndTheLimitLines() throws Exception {
        Path csv = dir.resolve("t.csv");
        SyntheticRundown.writeCsv(csv, SyntheticRundown.samples(10, 120, 208, 55));
        Path png = dir.resolve("t.png");

        Captured run = Captured.run("plot", csv.toString(), "--program", PROGRAM, "--out", png.toString());

        assertThat(run.exit()).as(run.err()).isZero();
        assertThat(run.out()).contains("10 blows, final 208.0 N·m, GO");
        BufferedImage image = ImageIO.read(png.toFile());
        assertThat(image.getWidth()).isEqualTo(1200);
        assertThat(image.getHeight()).isEqualTo(600);
        assertThat(colours(image)).as("torque blue, peak red, window green and shut-off orange are all drawn")
                .contains(0x1f4e9a, 0xc01c28, 0x268b3c, 0xe06c00);
    }

    @Test
    void drawsAStoredTraceAsSvgZoomedOnOneRundown() throws Exception {
        float[] x = SyntheticRundown.samples(6, 150, 210, 50);
        Path hst = dir.resolve("j.hst");
        try (OutputStream out = Files.newOutputStream(hst)) {
            StoredTrace.write(out, StoredTrace.Encoding.INT16, SyntheticRundown.RATE_HZ, 0, Map.of(), x, 0, x.length, null);
        }
        Path svg = dir.resolve("j.svg");

        Captured run = Captured.run("plot", hst.toString(), "--program", PROGRAM, "--out", svg.toString(), "--rundown", "1");

        assertThat(run.exit()).as(run.err()).isZero();
        assertThat(Files.readString(svg)).contains("<svg", "</svg>");
        assertThat(run.out()).contains("6 blows");
    }

    @Test
    void refusesARundownTheTraceDoesNotHave() throws Exception {
        Path csv = dir.resolve("t.csv");
        SyntheticRundown.writeCsv(csv, SyntheticRundown.samples(5, 150, 210, 50));

        Captured run = Captured.run("plot", csv.toString(), "--program", PROGRAM, "--out", dir.resolve("x.png").toString(),
                "--rundown", "3");

        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err().strip()).isEqualTo("--rundown 3: the trace has 1 rundowns");
    }

    @Test
    void refusesAnUnknownPictureFormatBeforeReading() {
        Captured run = Captured.run("plot", "none.csv", "--program", PROGRAM, "--out", "t.bmp");

        assertThat(run.exit()).isEqualTo(2);
        assertThat(run.err()).contains("must end in .png or .svg");
    }

    static java.util.Set<Integer> colours(BufferedImage image) {
        java.util.Set<Integer> seen = new java.util.HashSet<>();
        for (int y = 0; y < image.getHeight(); y++) {
            for (int x = 0; x < image.getWidth(); x++) {
                seen.add(image.getRGB(x, y) & 0xffffff);
            }
        }
        return seen;
    }
}
