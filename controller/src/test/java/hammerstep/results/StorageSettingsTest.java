package hammerstep.results;

import hammerstep.config.MapReader;
import hammerstep.config.Problems;
import hammerstep.config.YamlDocument;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class StorageSettingsTest {

    private static StorageSettings read(String yaml, Problems problems) throws Exception {
        YamlDocument doc = YamlDocument.parse("station.yaml", yaml.getBytes(StandardCharsets.UTF_8));
        return StorageSettings.read(MapReader.of(problems, doc.root()), Path.of("/etc/hammerstep"));
    }

    @Test
    void readsSizesInMegabytesAndResolvesTheFolder() throws Exception {
        Problems problems = new Problems("station.yaml");
        StorageSettings s = read("dir: outbox\nsegment_mb: 2\nretain_mb: 10\nmax_mb: 100\nlow_free_mb: 30\nmin_free_mb: 5\n",
                problems);
        assertThat(problems.list()).isEmpty();
        assertThat(s.dir()).isEqualTo(Path.of("/etc/hammerstep/outbox"));
        assertThat(s.segmentBytes()).isEqualTo(2L << 20);
        assertThat(s.lowBytes()).isEqualTo(80L << 20);
        assertThat(s.minFreeBytes()).isEqualTo(5L << 20);
    }

    @Test
    void reportsAnUnknownKeyAndAnInconsistentFloorWithTheirLines() throws Exception {
        Problems problems = new Problems("station.yaml");
        read("dir: /data/outbox\nlow_free_mb: 10\nmin_free_mb: 20\nsegmnet_mb: 3\n", problems);
        assertThat(problems.list()).extracting(Object::toString).anySatisfy(p ->
                assertThat(p).startsWith("station.yaml:4:").contains("unknown key 'segmnet_mb'"));
        assertThat(problems.list()).extracting(Object::toString).anySatisfy(p ->
                assertThat(p).startsWith("station.yaml:2:").contains("at least min_free_mb"));
    }
}
