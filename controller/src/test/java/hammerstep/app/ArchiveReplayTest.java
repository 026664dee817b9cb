package hammerstep.app;

import hammerstep.trace.StoredTrace;
import hammerstep.trace.SyntheticRundown;
import hammerstep.trace.TraceStore;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code replay} over an archive: several traces and directories of stored traces in one run, and
 * {@code --compare} with the station's results. The stored program is {@code good.yaml} (torque
 * 180..230 N·m); the what-if widens the bottom to 165 and lowers the top to 220 N·m, so a joint of
 * 225 N·m turns NO_GO and one of 170 N·m turns GO (invented joints).
 */
class ArchiveReplayTest {

    private static final String STORED_PROGRAM = "src/test/resources/programs/good.yaml";

    @TempDir
    Path dir;

    private Path archive;
    private Path changed;
    private final List<String> names = new ArrayList<>();

    private void store(TraceStore store, String part, String position, String program, double lastPeakNm,
                       String verdict) throws Exception {
        float[] x = SyntheticRundown.samples(8, Math.min(130, lastPeakNm - 30), lastPeakNm, 55);
        Map<String, String> meta = new LinkedHashMap<>();
        meta.put("part_serial", part);
        meta.put("position", position);
        meta.put("pass", "final");
        meta.put("attempt", "1");
        meta.put("program", program);
        meta.put("program_revision", "0123456789ab");
        meta.put("verdict", verdict);
        Path p = store.save(part + "_" + position + "_final_1", meta, x, x.length, SyntheticRundown.RATE_HZ, 5_000_000_000L);
        names.add(p.getFileName().toString());
    }

    @BeforeEach
    void archive() throws Exception {
        archive = dir.resolve("archive");
        TraceStore monday = new TraceStore(archive.resolve("monday"), 100, 1 << 30, StoredTrace.Encoding.FLOAT32);
        store(monday, "WH-1", "1", "hub-final", 200, "GO");
        store(monday, "WH-1", "2", "hub-final", 225, "GO");
        store(monday, "WH-1", "3", "hub-final", 170, "NO_GO");
        TraceStore tuesday = new TraceStore(archive.resolve("tuesday/late"), 100, 1 << 30, StoredTrace.Encoding.FLOAT32);
        store(tuesday, "WH-2", "1", "hub-final", 240, "NO_GO");
        store(tuesday, "WH-2", "2", "hub-final", 210, "GO");
        store(tuesday, "WH-2", "snug", "hub-snug", 60, "GO");
        changed = dir.resolve("changed.yaml");
        Files.writeString(changed, """
                id: hub-final
                torque: { min: 165.0, target: 200.0, max: 220.0 }
                blows: { count_above: 40.0, min: 4, max: 30 }
                rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 5000 }
                shutoff_at: 205.0
                rehit_blows: 2
                """);
    }

    private static String joint(String id, long seq, String part, String position, double finalNm, String verdict,
                                String reasons, String trace) {
        return "{\"schema\":\"hammerstep.joint.v1\",\"id\":\"" + id + "\",\"seq\":" + seq
                + ",\"site\":\"s\",\"line\":\"l\",\"station\":\"st\",\"time\":\"2026-03-04T05:06:07.089Z\","
                + "\"part_serial\":\"" + part + "\",\"part_model\":\"hub-5\",\"pattern\":\"hub-5\",\"position\":\"" + position
                + "\",\"position_index\":1,\"pass\":\"final\",\"attempt\":1,\"program\":\"hub-final\","
                + "\"program_revision\":\"0123456789ab\",\"blows\":8,\"final_torque_nm\":" + finalNm
                + ",\"verdict\":\"" + verdict + "\",\"reasons\":[" + reasons + "]"
                + ",\"limits\":{\"torque_nm\":{\"min\":180.0,\"max\":230.0},\"blows\":{\"min\":4,\"max\":30}}"
                + (trace == null ? "" : ",\"trace\":\"/var/lib/hammerstep/traces/" + trace + "\"") + "}";
    }

    /** A subscriber's log: topics in front, every kind of message, one joint twice, a cleared retained status. */
    private Path results() throws Exception {
        String t = "hammerstep/v1/s/l/st/";
        List<String> lines = List.of(
                t + "status {\"schema\":\"hammerstep.status.v1\",\"state\":\"RUNNING\"}",
                t + "joint " + joint("j1", 1, "WH-1", "1", 200.0, "GO", "", names.get(0)),
                t + "joint " + joint("j2", 2, "WH-1", "2", 225.0, "GO", "", names.get(1)),
                t + "joint " + joint("j2", 2, "WH-1", "2", 225.0, "GO", "", names.get(1)),
                t + "joint " + joint("j3", 3, "WH-1", "3", 170.0, "NO_GO", "\"TORQUE_LOW\"", names.get(2)),
                t + "part {\"schema\":\"hammerstep.part.v1\",\"id\":\"p1\",\"seq\":1,\"verdict\":\"NO_GO\"}",
                t + "event {\"schema\":\"hammerstep.event.v1\",\"id\":\"e1\",\"seq\":1,\"code\":\"STARTED\"}",
                // no trace named: matched by part, position, pass and attempt from the trace's header
                joint("j4", 4, "WH-2", "1", 240.0, "NO_GO", "\"TORQUE_HIGH\"", null),
                t + "status (null)",
                "");
        Path r = dir.resolve("results.jsonl");
        Files.write(r, lines);
        return r;
    }

    @Test
    void comparePrintsEveryJointsStoredAndNewVerdictAndSumsUpTheChanges() throws Exception {
        Captured c = Captured.run("replay", archive.toString(), "--program", changed.toString(),
                "--compare", results().toString());

        assertThat(c.exit()).as(c.err()).isZero();
        String out = c.out();
        assertThat(out.lines().filter(l -> l.contains(".hst"))).hasSize(5);
        assertThat(row(out, names.get(0))).contains(" GO ").endsWith("-");
        assertThat(row(out, names.get(1))).contains("NO_GO TORQUE_HIGH").contains("225.00").endsWith("GO->NO_GO");
        assertThat(row(out, names.get(2))).contains("NO_GO TORQUE_LOW").endsWith("NO_GO->GO");
        assertThat(row(out, names.get(3))).contains("WH-2").endsWith("-");
        assertThat(row(out, names.get(4))).contains("GO (trace header)").endsWith("-");
        assertThat(out).contains("6 traces, 5 replayed; skipped, program not given: hub-snug (1)")
                .contains("4 joint results (1 duplicates by id dropped, 3 other messages skipped);"
                        + " 1 replayed traces without a result there")
                .contains("5 joints compared: 2 would change verdict (1 GO->NO_GO, 1 NO_GO->GO), 0 keep their verdict"
                        + " with other reasons");
        assertThat(out).containsPattern("TORQUE_HIGH +1 +0").containsPattern("TORQUE_LOW +0 +1")
                .containsPattern("  hub-final +5 +1 +1 +0")
                .containsPattern("  hub-final 1 +2 +0 +0 +0")
                .containsPattern("  hub-final 2 +2 +1 +0 +0")
                .containsPattern("  hub-final 3 +1 +0 +1 +0");
        // the changed revision is the what-if's point; these traces name a program but carry no chain state
        assertThat(c.err().lines()).singleElement().asString().startsWith("5 traces replayed with a warning; the first: ")
                .contains("no chain state").doesNotContain("revision");
    }

    private static String row(String out, String name) {
        return out.lines().filter(l -> l.startsWith(name)).findFirst().orElseThrow().strip();
    }

    @Test
    void summaryAloneLeavesOutTheRows() throws Exception {
        Captured c = Captured.run("replay", archive.toString(), "--program", changed.toString(),
                "--compare", results().toString(), "--summary");

        assertThat(c.exit()).as(c.err()).isZero();
        assertThat(c.out()).doesNotContain(".hst").contains("2 would change verdict");
    }

    @Test
    void severalTracesPrintEveryRundownAfterItsTracesPath() throws Exception {
        Path one = archive.resolve("monday").resolve(names.get(0));
        Path two = archive.resolve("monday").resolve(names.get(1));
        Captured c = Captured.run("replay", one.toString(), two.toString(), "--program", STORED_PROGRAM);

        assertThat(c.exit()).as(c.err()).isZero();
        List<String> lines = c.out().lines().toList();
        assertThat(lines).hasSize(2);
        assertThat(lines.get(0)).startsWith("{\"trace\":\"" + one + "\",\"program\":\"hub-final\",\"direction\":\"tighten\",\"blows\":8,")
                .contains("\"final_torque_nm\":200.0", "\"verdict\":\"GO\"");
        assertThat(lines.get(1)).startsWith("{\"trace\":\"" + two + "\"").contains("\"final_torque_nm\":225.0");
    }

    @Test
    void manyTracesOnSeveralWorkersComeOutInNameOrderAsOneThreadWouldPrintThem() throws Exception {
        TraceStore store = new TraceStore(dir.resolve("many"), 1000, 1 << 30, StoredTrace.Encoding.INT16);
        List<Path> written = new ArrayList<>();
        for (int i = 0; i < 150; i++) {
            float[] x = SyntheticRundown.samples(4 + i % 5, 100, 180 + i % 40, 55);
            Map<String, String> meta = Map.of("program", "hub-final", "part_serial", "P" + i, "position", "1",
                    "pass", "final", "attempt", "1");
            written.add(store.save("P" + i, meta, x, x.length, SyntheticRundown.RATE_HZ, 0));
        }
        Captured c = Captured.run("replay", dir.resolve("many").toString(), "--program", STORED_PROGRAM);

        assertThat(c.exit()).as(c.err()).isZero();
        List<String> lines = c.out().lines().toList();
        assertThat(lines).hasSize(150);
        for (int i = 0; i < 150; i++) {
            assertThat(lines.get(i)).startsWith("{\"trace\":\"" + written.get(i) + "\"")
                    .contains("\"blows\":" + (4 + i % 5) + ",");
        }
    }

    @Test
    void twoProgramsReplayEachTraceWithItsOwn() throws Exception {
        Path snug = dir.resolve("snug.yaml");
        Files.writeString(snug, """
                id: hub-snug
                torque: { min: 50.0, target: 60.0, max: 70.0 }
                blows: { count_above: 20.0, min: 2, max: 30 }
                rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 5000 }
                """);
        Captured c = Captured.run("replay", archive.resolve("tuesday").toString(), "--program", STORED_PROGRAM,
                "--program", snug.toString());

        assertThat(c.exit()).as(c.err()).isZero();
        assertThat(c.out().lines()).hasSize(3).anySatisfy(l -> assertThat(l)
                .contains("\"program\":\"hub-snug\"", "\"final_torque_nm\":60.0", "\"verdict\":\"GO\""));
    }

    @Test
    void aDamagedTraceIsRefusedInOneLineAndTheOthersStillRun() throws Exception {
        Path junk = archive.resolve("monday/0000000099-junk.hst");
        Files.write(junk, new byte[] {1, 2, 3});
        Captured c = Captured.run("replay", archive.toString(), "--program", changed.toString(),
                "--compare", results().toString(), "--summary");

        assertThat(c.exit()).isEqualTo(2);
        List<String> err = c.err().lines().toList();
        assertThat(err).hasSize(2);
        assertThat(err.get(0)).startsWith(junk + ": ");
        assertThat(err.get(1)).startsWith("5 traces replayed with a warning; the first: ").contains("no chain state");
        assertThat(c.out()).contains("5 joints compared").contains("1 refused (unreadable, see above)");
    }

    @Test
    void badResultsAndMissingPathsAreOneLineAndExitTwo() throws Exception {
        Path bad = dir.resolve("bad.jsonl");
        Files.writeString(bad, "{\"schema\":\"hammerstep.joint.v1\",\"id\":\"a\"}\n{\"schema\":\"hammerstep.joint.v1\",\"id\n");
        Captured c = Captured.run("replay", archive.toString(), "--program", changed.toString(), "--compare", bad.toString());
        assertThat(c.exit()).isEqualTo(2);
        assertThat(c.err().strip()).startsWith(bad + ":2: not a JSON object");

        Captured missing = Captured.run("replay", dir.resolve("nowhere").toString(), archive.toString(),
                "--program", changed.toString());
        assertThat(missing.exit()).isEqualTo(2);
        assertThat(missing.err().strip()).isEqualTo(dir.resolve("nowhere") + ": no such file or directory");

        Path empty = Files.createDirectories(dir.resolve("empty"));
        Captured none = Captured.run("replay", empty.toString(), "--program", changed.toString());
        assertThat(none.exit()).isEqualTo(2);
        assertThat(none.err().strip()).isEqualTo(empty + ": no stored traces (.hst) found");
    }
}
