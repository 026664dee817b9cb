package hammerstep.health;

import hammerstep.config.MapReader;
import hammerstep.config.Problems;
import hammerstep.config.YamlDocument;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class ToolHealthSectionTest {

    @TempDir
    Path dir;

    ToolHealthSection.Watch read(String yaml, Problems[] out) throws Exception {
        Path f = dir.resolve("s.yaml");
        Files.writeString(f, yaml);
        YamlDocument doc = YamlDocument.read(f);
        Problems problems = new Problems(doc.file());
        out[0] = problems;
        return ToolHealthSection.INSTANCE.read(MapReader.of(problems, doc.root()).map("tool_health"), dir);
    }

    @Test
    void readsTheSettings() throws Exception {
        Problems[] p = new Problems[1];
        ToolHealthSection.Watch w = read("tool_health: { tool: AW-07, baseline_joints: 20, window: 7, drop_percent: 12,"
                + " min_blows: 4 }\n", p);

        assertThat(p[0].list()).isEmpty();
        assertThat(w.tool()).isEqualTo("AW-07");
        assertThat(w.settings()).isEqualTo(new ToolHealth.Settings(20, 7, 0.12, 4));
    }

    @Test
    void anEvenWindowIsAProblemNamingTheKey() throws Exception {
        Problems[] p = new Problems[1];
        read("tool_health: { window: 4 }\n", p);

        assertThat(p[0].list()).singleElement().asString().contains("tool_health.window", "odd");
    }

    @Test
    void canBeSwitchedOff() throws Exception {
        Problems[] p = new Problems[1];
        assertThat(read("tool_health: { enabled: false }\n", p).enabled()).isFalse();
        assertThat(ToolHealthSection.INSTANCE.absent(dir).enabled()).isTrue();
    }

    @Test
    void aWeakToolIsAWarningEventAndARecoveryANotice() {
        ToolHealth.Change weak = new ToolHealth.Change("AW-07", "hub", true,
                List.of(new ToolHealth.Reading(ToolHealth.Figure.BLOW_PEAK, 420, 330)), 0.075, false);
        ToolHealth.Change ok = new ToolHealth.Change("AW-07", "hub", false,
                List.of(new ToolHealth.Reading(ToolHealth.Figure.BLOW_PEAK, 420, 410)), 0.075, false);

        assertThat(ToolHealthEvents.of(weak, "TR-1", Instant.EPOCH)).satisfies(e -> {
            assertThat(e.code()).isEqualTo("TOOL_WEAK");
            assertThat(e.severity()).isEqualTo(hammerstep.results.StationEvent.Severity.WARNING);
            assertThat(e.message()).contains("blow peak fell 21 % below its baseline");
        });
        assertThat(ToolHealthEvents.of(ok, null, Instant.EPOCH).code()).isEqualTo("TOOL_OK");
    }
}
