package hammerstep.analysis;

import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/** Seeded random damage to results and audit files: the readers either read or refuse with one line naming the file. */
class InputRobustnessTest {

    static final Path RESULTS = Paths.get("src/test/resources/analysis/hand-example.jsonl");
    static final Path AUDITS = Paths.get("src/test/resources/analysis/hand-audits.csv");

    @TempDir
    Path dir;

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1, 2, 3, 4, 5, 6, 7, 8})
    void damagedResultsAreReadOrRefusedWithOneLine(long seed) throws Exception {
        byte[] good = Files.readAllBytes(RESULTS);
        Random rnd = new Random(seed);
        for (int round = 0; round < 40; round++) {
            Path f = dir.resolve("r.jsonl");
            Files.write(f, damage(good, rnd));
            try {
                ResultsFile.read(f);
            } catch (InputException e) {
                assertThat(e.getMessage()).startsWith(f.toString()).doesNotContain("\n");
            }
        }
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1, 2, 3, 4, 5, 6, 7, 8})
    void damagedAuditsAreReadOrRefusedWithOneLine(long seed) throws Exception {
        byte[] good = Files.readAllBytes(AUDITS);
        Random rnd = new Random(seed);
        for (int round = 0; round < 40; round++) {
            Path f = dir.resolve("a.csv");
            Files.write(f, damage(good, rnd));
            try {
                for (Audit a : AuditFile.read(f)) {
                    assertThat(a.residualNm()).isPositive();
                }
            } catch (InputException e) {
                assertThat(e.getMessage()).startsWith(f.toString()).doesNotContain("\n");
            }
        }
    }

    static byte[] damage(byte[] good, Random rnd) {
        byte[] b = good.clone();
        int n = 1 + rnd.nextInt(6);
        String alphabet = ",:{}[]\"\n0123456789.-eE xyz#";
        for (int k = 0; k < n; k++) {
            int at = rnd.nextInt(b.length);
            b[at] = rnd.nextInt(5) == 0 ? (byte) rnd.nextInt(256)
                    : (byte) alphabet.charAt(rnd.nextInt(alphabet.length()));
        }
        if (rnd.nextInt(5) == 0) {
            return new String(b, 0, rnd.nextInt(b.length), StandardCharsets.ISO_8859_1).getBytes(StandardCharsets.ISO_8859_1);
        }
        return b;
    }
}
