package hammerstep.sequence;

import hammerstep.config.ConfigException;
import hammerstep.config.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

class PatternFileTest {

    @TempDir
    Path dir;

    private static final String PROGRAM = """
            id: p-final
            torque: { min: 180.0, target: 200.0, max: 230.0 }
            blows: { count_above: 40.0, min: 2, max: 30 }
            rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 5000 }
            shutoff_at: 205.0
            """;

    private Path write(String name, String text) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, text);
        return p;
    }

    @Test
    void readsPositionsPassesOrdersAndReworkPolicy() throws Exception {
        write("final.yaml", PROGRAM);
        Path file = write("hub.yaml", """
                id: hub-5
                positions: [S1, S2, S3, S4, S5]
                passes:
                  - name: snug
                    program: { id: snug, torque: { min: 30, target: 40, max: 60 },
                               blows: { count_above: 20, min: 1, max: 20 },
                               rundown: { start_above: 10, end_after_ms: 100, max_ms: 3000 } }
                    order: circular
                    rework: { attempts: 2, acknowledge: operator }
                    after_no_go: continue
                  - name: final
                    program: final.yaml
                    rework: { attempts: 1, acknowledge: supervisor }
                  - name: check
                    program: final.yaml
                    order: [2, 4]
                """);
        Pattern p = PatternFile.load(file);
        assertThat(p.id()).isEqualTo("hub-5");
        assertThat(p.positions()).containsExactly("S1", "S2", "S3", "S4", "S5");
        assertThat(p.revision()).hasSize(12);
        assertThat(p.passes()).extracting(Pattern.Pass::name).containsExactly("snug", "final", "check");
        Pattern.Pass snug = p.passes().get(0);
        assertThat(snug.order()).containsExactly(0, 1, 2, 3, 4);
        assertThat(snug.attempts()).isEqualTo(2);
        assertThat(snug.afterNoGo()).isEqualTo(AfterNoGo.CONTINUE);
        Pattern.Pass fin = p.passes().get(1);
        assertThat(fin.order()).containsExactly(0, 2, 4, 1, 3);
        assertThat(fin.acknowledge()).isEqualTo(Acknowledge.SUPERVISOR);
        assertThat(fin.afterNoGo()).isEqualTo(AfterNoGo.REJECT);
        assertThat(fin.program().shutoffAtNm()).isEqualTo(205.0);
        assertThat(p.passes().get(2).order()).containsExactly(1, 3);
    }

    @Test
    void aCountGivesNumberedPositions() throws Exception {
        write("final.yaml", PROGRAM);
        Pattern p = PatternFile.load(write("f.yaml", "id: f8\npositions: 8\npasses: [{name: final, program: final.yaml}]\n"));
        assertThat(p.positions()).containsExactly("1", "2", "3", "4", "5", "6", "7", "8");
        assertThat(p.passes().get(0).order()).containsExactly(0, 4, 2, 6, 1, 5, 3, 7);
    }

    @Test
    void reportsEachProblemWithFileLineAndColumn() throws Exception {
        write("final.yaml", PROGRAM);
        Path file = write("bad.yaml", """
                id: bad
                positions: [A, B, A]
                passes:
                  - name: final
                    program: final.yaml
                    order: [1, 4, 1]
                    rework: { attempts: 0, acknowledge: foreman }
                    after_no_go: shrug
                    colour: red
                """);
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> PatternFile.load(file));
        assertThat(e.problems()).extracting(Problem::toString).contains(
                file + ":2:19: 'positions[2]': position label \"A\" is used twice",
                file + ":6:16: 'passes[0].order[1]' is \"4\": expected a position number from 1 to 3",
                file + ":6:19: 'passes[0].order[2]': position 1 is listed twice in this pass",
                file + ":7:25: 'passes[0].rework.attempts' is 0: expected a whole number from 1 to 99",
                file + ":7:41: 'passes[0].rework.acknowledge' is \"foreman\": expected one of operator, supervisor",
                file + ":8:18: 'passes[0].after_no_go' is \"shrug\": expected one of reject, skip_position, continue");
        assertThat(e.problems()).anySatisfy(pr -> assertThat(pr.toString())
                .startsWith(file + ":9:5: unknown key 'passes[0].colour'"));
    }

    @Test
    void reportsAProgramFileProblemInTheProgramFile() throws Exception {
        Path prog = write("broken.yaml", PROGRAM.replace("min: 180.0", "min: 250.0"));
        Path file = write("p.yaml", "id: p\npositions: 2\npasses: [{name: final, program: broken.yaml}]\n");
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> PatternFile.load(file));
        assertThat(e.problems()).extracting(Problem::file).contains(file.toString(), prog.toString());
        assertThat(e.problems()).anySatisfy(pr -> assertThat(pr.toString())
                .startsWith(file + ":3:").contains("program file broken.yaml is not valid"));
    }

    @Test
    void namesAMissingProgramFile() throws Exception {
        Path file = write("p.yaml", "id: p\npositions: 2\npasses: [{name: final, program: nowhere.yaml}]\n");
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> PatternFile.load(file));
        assertThat(e.problems()).singleElement().satisfies(pr -> assertThat(pr.toString())
                .isEqualTo(file + ":3:33: 'passes[0].program': cannot use program file nowhere.yaml: no such file"));
    }

    @Test
    void requiresPositionsAndPasses() throws Exception {
        Path file = write("p.yaml", "id: p\n");
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> PatternFile.load(file));
        assertThat(e.problems()).extracting(Problem::message).contains(
                "missing key 'positions': expected a list of position labels or a count",
                "missing key 'passes': expected a list");
    }
}
