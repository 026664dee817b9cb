package hammerstep.analysis;

import com.fasterxml.jackson.databind.ObjectMapper;
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
    void aLineThatCannotBeAJointIsSkippedAndCountedWithItsLine() throws Exception {
        Path f = write("{\"schema\":\"hammerstep.part.v1\"}", "garbage", "{\"serial\":", "{not json");

        ResultsFile.Contents c = ResultsFile.read(f);

        assertThat(c.joints()).isEmpty();
        assertThat(c.unreadable()).isEqualTo(3);
        assertThat(c.firstUnreadableLine()).isEqualTo(2);
    }

    @Test
    void aLineThatMayBeAJointIsRefusedNamingFileAndLine() throws Exception {
        Path f = write("{\"schema\":\"hammerstep.part.v1\"}", "{\"schema\":\"hammerstep.joint.v1\",\"id\":\"j");

        assertThatThrownBy(() -> ResultsFile.read(f)).isInstanceOf(InputException.class)
                .hasMessageStartingWith(f + ":2: not a JSON object");
        Path onTopic = write("hammerstep/v1/s/l/st/joint {\"id\":");
        assertThatThrownBy(() -> ResultsFile.read(onTopic)).hasMessageStartingWith(onTopic + ":1: not a JSON object");
    }

    @Test
    void commandsAndTheirCutPayloadsAreSkippedByTopic() throws Exception {
        String t = "hammerstep/v1/s/l/st/";
        Path f = write(t + "cmd/part {\"serial\":", t + "cmd/part {\"serial\":\"A\",\"model\":\"B\"}", t + "cmd/reload {}",
                t + "joint " + joint("j1", 91.5));

        ResultsFile.Contents c = ResultsFile.read(f);

        assertThat(c.joints()).hasSize(1);
        assertThat(c.skipped()).isEqualTo(3);
        assertThat(c.unreadable()).isZero();
    }

    @Test
    void aMessageRepeatedUnderItsIdIsUsedOnceAndCounted() throws Exception {
        String t = "hammerstep/v1/s/l/st/";
        // the same message as the station sent it and as a subscriber re-serialised it (spacing, key order)
        Path f = write(t + "joint " + joint("j1", 91.5), joint("j2", 93.0), joint("j1", 91.5).replace(",", ", "),
                "{\"id\":\"j2\"," + joint("j2", 93.0).substring(1).replace("\"id\":\"j2\",", ""));

        ResultsFile.Contents c = ResultsFile.read(f);

        assertThat(c.joints()).extracting(JointRecord::id).containsExactly("j1", "j2");
        assertThat(c.duplicates()).isEqualTo(2);
        assertThat(c.leftOut()).isEqualTo("2 repeated messages (same id) dropped");
    }

    @Test
    void theSameIdWithOtherContentIsAnErrorNamingBothLines() throws Exception {
        Path f = write(joint("j1", 91.5), joint("j2", 93.0), joint("j1", 95.5));

        assertThatThrownBy(() -> ResultsFile.read(f)).isInstanceOf(InputException.class)
                .hasMessageStartingWith(f + ":3: message id \"j1\" came on line 1 with other content");
    }

    @Test
    void otherContentWhoseHashCodesAgreeIsStillOtherContent() throws Exception {
        // "Aa" and "BB" share String.hashCode, so the two messages share JsonNode.hashCode too
        String a = joint("j1", 91.5).replace("\"program\":\"p\"", "\"program\":\"Aa\"");
        String b = joint("j1", 91.5).replace("\"program\":\"p\"", "\"program\":\"BB\"");
        ObjectMapper json = new ObjectMapper();
        assertThat(json.readTree(a).hashCode()).isEqualTo(json.readTree(b).hashCode());
        Path f = write(a, b);

        assertThatThrownBy(() -> ResultsFile.read(f)).isInstanceOf(InputException.class)
                .hasMessageStartingWith(f + ":2: message id \"j1\" came on line 1 with other content");
    }

    private static String joint(String id, double finalNm) {
        return "{\"schema\":\"hammerstep.joint.v1\",\"id\":\"" + id + "\",\"program\":\"p\",\"blows\":6,"
                + "\"final_torque_nm\":" + finalNm + ",\"verdict\":\"GO\",\"reasons\":[]," + LIMITS + "}";
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
