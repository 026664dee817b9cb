package hammerstep.station.loop;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.results.MessageKind;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.StationId;
import hammerstep.results.UnfinishedPart;
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
 * byte for byte, with per-kind {@code seq} gap-free from 1 and every {@code id} once. The part in
 * work at a kill is closed at the next start with a part record ended {@code INTERRUPTED} listing
 * exactly its joints, after the supervisor key and before any joint of a new part.
 */
class StationKillIT {

    private static final int KILLS = 20;
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    @Test
    void noStoredResultIsLostOrChangedAcrossTwentyKills() throws Exception {
        Random rnd = new Random(20);
        Map<String, byte[]> seen = new HashMap<>();
        List<Integer> tornAt = new ArrayList<>();
        long lastCount = 0;
        String unfinishedBefore = null;
        int interrupted = 0;
        for (int kill = 0; kill < KILLS; kill++) {
            Process p = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-Xmx64m", "-cp", System.getProperty("java.class.path"), KillableStation.class.getName(),
                    dir.toString()).redirectErrorStream(true).start();
            BufferedReader out = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8));
            String first = out.readLine();
            while (first != null && !first.equals("started")) {
                first = out.readLine(); // the station's log lines before it is up
            }
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
                Map<String, String> ended = checkParts(kill, all);
                if (unfinishedBefore != null) {
                    assertThat(ended.get(unfinishedBefore)).as("kill %d: part %s in work at the kill before",
                            kill, unfinishedBefore).isEqualTo("INTERRUPTED");
                    interrupted++;
                }
                UnfinishedPart u = new OutboxResultSink(box, new StationId("s", "l", "st")).unfinishedPart();
                unfinishedBefore = u == null ? null : u.partSerial();
                if (u != null) {
                    assertThat(ended).as("kill %d: %s has no part record yet", kill, u.partSerial())
                            .doesNotContainKey(u.partSerial());
                }
            }
        }
        System.out.println("kill test: " + KILLS + " kills, " + lastCount + " records kept, recoveries after kills "
                + tornAt + ", parts closed as interrupted " + interrupted);
        assertThat(lastCount).isGreaterThan(KILLS);
        assertThat(interrupted).as("kills that hit a part in work").isPositive();
    }

    /**
     * Every part record lists exactly the joints of its serial, in order, stored before it and after
     * the previous part's record, with no joint of another part in between; one record per serial.
     *
     * @return serial → how the part ended
     */
    private static Map<String, String> checkParts(int kill, List<Outbox.Entry> all) throws Exception {
        Map<String, String> ended = new HashMap<>();
        List<String> openIds = new ArrayList<>();
        String openSerial = null;
        for (Outbox.Entry e : all) {
            JsonNode m = JSON.readTree(e.payload());
            if (e.kind() == MessageKind.JOINT) {
                String serial = m.get("part_serial").asText();
                assertThat(openSerial == null || openSerial.equals(serial))
                        .as("kill %d: joint of %s while %s had no part record", kill, serial, openSerial).isTrue();
                openSerial = serial;
                openIds.add(e.id());
            } else if (e.kind() == MessageKind.PART) {
                String serial = m.get("part_serial").asText();
                assertThat(serial).as("kill %d: part record of the part in work", kill).isEqualTo(openSerial);
                List<String> joints = new ArrayList<>();
                m.get("joints").forEach(j -> joints.add(j.asText()));
                assertThat(joints).as("kill %d: joints of %s", kill, serial).isEqualTo(openIds);
                assertThat(ended.put(serial, m.get("ended").asText())).as("kill %d: one part record for %s", kill, serial)
                        .isNull();
                if (m.get("ended").asText().equals("INTERRUPTED")) {
                    assertThat(m.get("verdict").asText()).isEqualTo("NO_GO");
                }
                openSerial = null;
                openIds.clear();
            }
        }
        return ended;
    }
}
