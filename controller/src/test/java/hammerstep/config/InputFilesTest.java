package hammerstep.config;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class InputFilesTest {

    @TempDir
    Path dir;

    private List<String> lines(String text, int max, boolean[] ended) throws IOException {
        Path f = dir.resolve("t.txt");
        Files.writeString(f, text);
        List<String> out = new ArrayList<>();
        try (InputFiles.Lines l = InputFiles.lines(f, max)) {
            String s;
            while ((s = l.next()) != null) {
                out.add(l.lineNo() + ":" + s);
            }
            ended[0] = l.lastLineEnded();
        }
        return out;
    }

    @Test
    void readsLinesEndingInLineFeedOrCarriageReturnLineFeed() throws IOException {
        boolean[] ended = new boolean[1];
        assertThat(lines("a\r\n\nbc\n", 10, ended)).containsExactly("1:a", "2:", "3:bc");
        assertThat(ended[0]).isTrue();
    }

    @Test
    void tellsALastLineWithoutItsLineBreak() throws IOException {
        boolean[] ended = new boolean[1];
        assertThat(lines("a\n12.", 10, ended)).containsExactly("1:a", "2:12.");
        assertThat(ended[0]).isFalse();
    }

    @Test
    void takesALineOfTheLimitAndRefusesOneCharacterMore() throws IOException {
        boolean[] ended = new boolean[1];
        assertThat(lines("x".repeat(10) + "\n", 10, ended)).containsExactly("1:" + "x".repeat(10));
        assertThatThrownBy(() -> lines("ok\n" + "x".repeat(20_000) + "\n", 10, ended))
                .isInstanceOf(InputFiles.Refused.class).hasMessage("line 2 is longer than 10 characters");
    }

    @Test
    void refusesADirectoryAndAFileOverItsSizeBeforeReadingIt() throws IOException {
        assertThatThrownBy(() -> InputFiles.check(dir, 0)).hasMessage("is a directory, not a file");
        Path f = dir.resolve("big.yaml");
        Files.write(f, new byte[2048]);
        assertThatThrownBy(() -> InputFiles.readAll(f, 1024))
                .hasMessage("is 2.0 KB, more than the 1.0 KB this kind of file may be");
        assertThat(InputFiles.readAll(f, 2048)).hasSize(2048);
    }

    @Test
    void cutsAnErrorLineToThreeHundredCharactersOnOneLine() {
        assertThat(InputFiles.errorLine("a\nb")).isEqualTo("a b");
        String cut = InputFiles.errorLine("e".repeat(1_000_000));
        assertThat(cut).hasSize(300).endsWith("...");
    }
}
