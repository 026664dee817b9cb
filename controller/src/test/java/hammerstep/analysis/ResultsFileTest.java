package hammerstep.analysis;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class ResultsFileTest {

    static final String LIMITS = "\"limits\":{\"torque_nm\":{\"min\":80.0,\"max\":100.0},\"blows\":{\"min\":4,\"max\":12}}";

    @TempDir
    Path dir;

    @Test
    void readsJointMessagesAndSkipsOtherSchemas() throws Exception {
        Path f = write("{\"schema\":\"hammerstep.joint.v1\",\"id\":\"j1\",\"program\":\"p\",\"position\":\"3\","
                        + "\"part_serial\":\"S1\",\"blows\":6,\"final_torque_nm\":91.5,\"verdict\":\"GO\",\"reasons\":[]," + LIMITS + "}",
                "{\"schema\":\"hammerstep.part.v1\",\"id\":\"p1\"}",
                "",
                "{\"schema\":\"hammerstep.event.v1\",\"code\":\"TOOL_WEAK\"}");

        ResultsFile.Contents c = ResultsFile.read(f);

        assertThat(c.skipped()).isEqualTo(2);
        assertThat(c.joints()).singleElement().satisfies(j -> {
            assertThat(j.id()).isEqualTo("j1");
            assertThat(j.position()).isEqualTo("3");
            assertThat(j.partSerial()).isEqualTo("S1");
            assertThat(j.finalTorqueNm()).isEqualTo(91.5);
            assertThat(j.limits()).isEqualTo(new JointRecord.Limits(80, 100, 4, 12));
            assertThat(j.line()).isEqualTo(1);
        });
    }

    @Test
    void readsReplayOutputWhichHasNoSchema() throws Exception {
        Path f = write("{\"program\":\"p\",\"blows\":6,\"final_torque_nm\":91.5,\"verdict\":\"GO\",\"reasons\":[]," + LIMITS + "}");

        assertThat(ResultsFile.read(f).joints()).hasSize(1);
    }

    @Test
    void readsASubscribersLogWithTopicsInFrontAndEmptyRetainedMessages() throws Exception {
        String t = "hammerstep/v1/s/l/st/";
        Path f = write(t + "joint {\"schema\":\"hammerstep.joint.v1\",\"id\":\"j1\",\"program\":\"p\",\"blows\":6,"
                        + "\"final_torque_nm\":91.5,\"verdict\":\"GO\",\"reasons\":[]," + LIMITS + "}",
                t + "status (null)",
                t + "status",
                t + "part {\"schema\":\"hammerstep.part.v1\",\"id\":\"p1\"}");

        ResultsFile.Contents c = ResultsFile.read(f);

        assertThat(c.joints()).singleElement().satisfies(j -> assertThat(j.finalTorqueNm()).isEqualTo(91.5));
        assertThat(c.skipped()).isEqualTo(1);
    }

    @Test
    void aWordThatIsNoTopicIsNoMessage() throws Exception {
        Path f = write("{\"schema\":\"hammerstep.part.v1\"}", "garbage");

        assertThatThrownBy(() -> ResultsFile.read(f)).hasMessageStartingWith(f + ":2: not a JSON object");
    }

    @Test
    void namesFileAndLineOfBadJson() throws Exception {
        Path f = write("{\"schema\":\"hammerstep.part.v1\"}", "{not json");

        assertThatThrownBy(() -> ResultsFile.read(f)).isInstanceOf(InputException.class)
                .hasMessageStartingWith(f + ":2: not a JSON object");
    }

    @Test
    void namesTheMissingField() throws Exception {
        Path f = write("{\"schema\":\"hammerstep.joint.v1\",\"program\":\"p\",\"blows\":6,\"final_torque_nm\":91.5}");

        assertThatThrownBy(() -> ResultsFile.read(f)).hasMessage(f + ":1: joint result without 'limits' (the windows it was judged against)");
    }

    @Test
    void namesAFieldOfTheWrongType() throws Exception {
        Path f = write("{\"schema\":\"hammerstep.joint.v1\",\"program\":\"p\",\"blows\":6,\"final_torque_nm\":\"high\"," + LIMITS + "}");

        assertThatThrownBy(() -> ResultsFile.read(f)).hasMessage(f + ":1: 'final_torque_nm' must be a number, got \"high\"");
    }

    private Path write(String... lines) throws IOException {
        Path f = dir.resolve("r.jsonl");
        Files.write(f, java.util.List.of(lines));
        return f;
    }
}
