package hammerstep.joint;

import hammerstep.config.ConfigException;
import hammerstep.config.YamlDocument;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

/** Values at the very edge of what a program may say are accepted. */
class ProgramEdgesTest {

    private static JointProgram read(String text) throws ConfigException {
        return ProgramFile.read(YamlDocument.parse("edge.yaml", text));
    }

    @Test
    void equalLimitsAndLevelsAreAllowed() throws ConfigException {
        JointProgram p = read("id: edge\n"
                + "torque: { min: 200, target: 200, max: 200 }\n"
                + "blows: { count_above: 40, release_below: 39.9, min: 5, max: 5, max_rate_per_min: 6000 }\n"
                + "rundown: { start_above: 40, end_after_ms: 39, max_ms: 40 }\n"
                + "shutoff_at: 200\n"
                + "rehit_blows: 4\n");
        assertThat(p.torque()).isEqualTo(new JointProgram.Torque(200, 200, 200));
        assertThat(p.blows()).isEqualTo(new JointProgram.Blows(40, 39.9, 5, 5, 5.0));
        assertThat(p.rundown().startAboveNm()).isEqualTo(40);
        assertThat(p.rundown().maxMs()).as("5 blows at 6000/min take 40 ms").isEqualTo(40);
        assertThat(p.shutoffAtNm()).isEqualTo(200);
        assertThat(p.rehitBlows()).isEqualTo(4);
        assertThat(p.hasShutoff()).isTrue();
    }

    @Test
    void deadTimeMayBeGivenDirectly() throws ConfigException {
        JointProgram p = read("id: edge\ntorque: { min: 41, target: 42, max: 43 }\n"
                + "blows: { count_above: 43, min: 0, max: 1, dead_time_ms: 12.5 }\n"
                + "rundown: { start_above: 0, end_after_ms: 1, max_ms: 2 }\n");
        assertThat(p.blows().deadTimeMs()).isEqualTo(12.5);
        assertThat(p.blows().releaseBelowNm()).isEqualTo(21.5);
        assertThat(p.hasShutoff()).isFalse();
        assertThat(p.finalTorque()).isEqualTo(FinalTorque.MAX_PEAK);
    }
}
