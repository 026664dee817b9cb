package hammerstep.sim.physics;

import hammerstep.config.ConfigException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class PresetsTest {

    @Test
    void loadsEveryBundledPresetByName() throws ConfigException {
        for (String name : Presets.TOOLS) {
            assertThat(Presets.tool(name).name()).isEqualTo(name);
        }
        for (String name : Presets.JOINTS) {
            assertThat(Presets.joint(name).name()).isEqualTo(name);
        }
        for (String name : Presets.TRANSDUCERS) {
            assertThat(Presets.transducer(name).name()).isEqualTo(name);
        }
        assertThat(Presets.defaultTransducer().name()).isEqualTo(Presets.DEFAULT_TRANSDUCER);
    }

    @Test
    void bundledListsMatchTheFilesUnderConfigSim() throws IOException {
        Path root = Path.of("..", "config", "sim");
        assertThat(names(root.resolve("tools"))).containsExactlyInAnyOrderElementsOf(Presets.TOOLS);
        assertThat(names(root.resolve("joints"))).containsExactlyInAnyOrderElementsOf(Presets.JOINTS);
        assertThat(names(root.resolve("transducers"))).containsExactlyInAnyOrderElementsOf(Presets.TRANSDUCERS);
    }

    private static java.util.List<String> names(Path dir) throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.map(p -> p.getFileName().toString()).filter(n -> n.endsWith(".yaml"))
                    .map(n -> n.substring(0, n.length() - 5)).toList();
        }
    }

    @Test
    void loadsAPresetFromAFile(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("my-joint.yaml");
        Files.writeString(file, """
                prevailing_torque_nm: 2
                free_angle_deg: 360
                full_torque_nm: 100
                angle_to_full_deg: 45
                friction: { static_ratio: 1.2 }
                thread: { diameter_mm: 12, k_factor: 0.2 }
                """);
        JointSpec j = Presets.joint(file.toString());
        assertThat(j.name()).isEqualTo(file.toString());
        assertThat(j.fullTorqueNm()).isEqualTo(100.0);
        assertThat(j.staticFrictionRatio()).isEqualTo(1.2);
    }

    @Test
    void reportsBadKeysWithFileLineAndColumn(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("bad.yaml");
        Files.writeString(file, """
                prevailing_torque_nm: 2
                free_angle_deg: 360
                full_torque_nm: lots
                angle_to_full_deg: 45
                frction: { static_ratio: 1.2 }
                thread: { diameter_mm: 12, k_factor: 0.2 }
                """);
        assertThatThrownBy(() -> Presets.joint(file.toString()))
                .isInstanceOf(ConfigException.class)
                .satisfies(e -> assertThat(((ConfigException) e).problems()).extracting(Object::toString)
                        .anyMatch(s -> s.startsWith(file + ":3:17: 'full_torque_nm': expected a number"))
                        .anyMatch(s -> s.startsWith(file + ":5:1: unknown key 'frction'")));
    }

    @Test
    void rejectsGearsThatCannotMesh(@TempDir Path dir) throws Exception {
        String text = Files.readString(Path.of("..", "config", "sim", "tools", "cordless-two-dog.yaml"))
                .replace("ring_teeth: 80", "ring_teeth: 79");
        Path file = dir.resolve("tool.yaml");
        Files.writeString(file, text);
        assertThatThrownBy(() -> Presets.tool(file.toString()))
                .isInstanceOf(ConfigException.class)
                .hasMessageContaining("ring = sun + 2 × planet (80)");
    }

    @Test
    void namesTheBundledPresetsWhenANameIsUnknown() {
        assertThatThrownBy(() -> Presets.tool("cordless-nine-dog"))
                .isInstanceOf(ConfigException.class)
                .hasMessageContaining("no tool preset of that name")
                .hasMessageContaining("cordless-two-dog");
    }
}
