package hammerstep.station.loop;

import hammerstep.results.MessageKind;
import hammerstep.results.Outbox;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The station process killed with SIGKILL at random moments, 20 times, each time started again on
 * the same state folder. After every kill the journal must hold every record it held before,
 * byte for byte, with per-kind {@code seq} gap-free from 1 and every {@code id} once.
 */
class StationKillIT {

    private static final int KILLS = 20;

    @TempDir
    Path dir;

    @Test
    void noStoredResultIsLostOrChangedAcrossTwentyKills() throws Exception {
        Random rnd = new Random(20);
        Map<String, byte[]> seen = new HashMap<>();
        List<Integer> tornAt = new ArrayList<>();
        long lastCount = 0;
        for (int kill = 0; kill < KILLS; kill++) {
            Process p = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-Xmx64m", "-cp", System.getProperty("java.class.path"), KillableStation.class.getName(),
                    dir.toString()).redirectErrorStream(true).start();
            BufferedReader out = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8));
            String first = out.readLine();
            assertThat(first).as("child start, kill %d", kill).isEqualTo("started");
            Thread.sleep(100 + rnd.nextInt(900)); // the parent waits in real time; the child runs freely
            p.destroyForcibly(); // SIGKILL on Linux
            assertThat(p.waitFor(10, TimeUnit.SECONDS)).isTrue();

            try (FileOutbox box = FileOutbox.open(new StorageSettings(dir, 1 << 20, 64L << 20, 1L << 30, 0, 0),
                    () -> Long.MAX_VALUE)) {
                if (!box.recovery().clean()) {
                    tornAt.add(kill);
                }
                List<Outbox.Entry> all = box.pending(0, Integer.MAX_VALUE);
                Map<MessageKind, Long> nextSeq = new EnumMap<>(MessageKind.class);
                Map<String, byte[]> now = new HashMap<>();
                for (Outbox.Entry e : all) {
                    long expected = nextSeq.getOrDefault(e.kind(), 1L);
                    assertThat(e.seq()).as("kill %d: %s seq", kill, e.kind()).isEqualTo(expected);
                    nextSeq.put(e.kind(), expected + 1);
                    assertThat(now.put(e.id(), e.payload())).as("kill %d: id %s once", kill, e.id()).isNull();
                }
                for (Map.Entry<String, byte[]> before : seen.entrySet()) {
                    assertThat(now).as("kill %d keeps %s", kill, before.getKey()).containsKey(before.getKey());
                    assertThat(Arrays.equals(now.get(before.getKey()), before.getValue()))
                            .as("kill %d: %s unchanged", kill, before.getKey()).isTrue();
                }
                assertThat((long) all.size()).as("kill %d: the station went on storing", kill)
                        .isGreaterThanOrEqualTo(lastCount);
                lastCount = all.size();
                seen = now;
            }
        }
        System.out.println("kill test: " + KILLS + " kills, " + lastCount + " records kept, recoveries after kills "
                + tornAt);
        assertThat(lastCount).isGreaterThan(KILLS);
    }
}
