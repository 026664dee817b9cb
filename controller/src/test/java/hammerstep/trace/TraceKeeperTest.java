package hammerstep.trace;

import hammerstep.config.YamlDocument;
import hammerstep.config.MapReader;
import hammerstep.config.Problems;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.results.JointOutcome;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class TraceKeeperTest {

    @TempDir
    Path dir;

    @Test
    void keepsEachJointsSpanAndTheStoredTraceReplaysToTheSameVerdict() throws Exception {
        JointProgram program = ProgramFile.load(Paths.get("src/test/resources/programs/wheel-demo.yaml"));
        TraceKeeper keeper = new TraceKeeper(TraceRecorder.forSeconds(SyntheticRundown.RATE_HZ, 5),
                new TraceStore(dir, 100, Long.MAX_VALUE, StoredTrace.Encoding.INT16), 50);
        List<JointResult> judged = new ArrayList<>();
        JointMonitor station = new JointMonitor(program, JointMonitor.replayConditioning(program),
                SyntheticRundown.RATE_HZ, 64, judged::add);
        float[] x = SyntheticRundown.samples(9, 130, 207, 55);
        // two joints back to back, fed in station-sized blocks: the keeper sees each block first
        float[] both = new float[2 * x.length];
        System.arraycopy(x, 0, both, 0, x.length);
        System.arraycopy(x, 0, both, x.length, x.length);
        List<JointOutcome> kept = new ArrayList<>();
        for (int at = 0; at < both.length; at += 64) {
            int n = Math.min(64, both.length - at);
            long t = Math.round(at * 1e9 / SyntheticRundown.RATE_HZ) + 7_000_000_000L;
            keeper.onSamples(both, at, n, t);
            int before = judged.size();
            station.onSamples(both, at, n, t);
            if (judged.size() > before) {
                kept.add(keeper.keep(outcome(judged.get(judged.size() - 1), kept.size() + 1)));
            }
        }

        assertThat(kept).hasSize(2);
        for (JointOutcome o : kept) {
            Path p = Path.of(o.tracePath());
            assertThat(p).exists();
            StoredTrace.Header h = StoredTrace.readHeader(p);
            assertThat(h.metadata()).containsEntry("program", "wheel-demo").containsEntry("verdict", "GO");
            assertThat(o.result().startNs() - h.firstSampleNs()).isBetween(49_900_000L, 50_100_000L);
            List<JointResult> again = new ArrayList<>();
            JointMonitor replay = new JointMonitor(program, JointMonitor.replayConditioning(program), h.rateHz(), 4096,
                    again::add);
            StoredTrace.read(p, new float[4096], replay::onSamples);
            replay.finish();
            assertThat(again).singleElement().satisfies(r -> {
                assertThat(r.blows()).isEqualTo(9);
                assertThat(r.finalTorqueNm()).isCloseTo(207, org.assertj.core.api.Assertions.within(0.01));
            });
        }
        assertThat(keeper.failures()).isZero();
    }

    @Test
    void aTraceThatCannotBeWrittenLeavesTheJointWithoutOne() throws Exception {
        TraceStore store = new TraceStore(dir.resolve("t"), 10, Long.MAX_VALUE, StoredTrace.Encoding.INT16);
        TraceKeeper keeper = new TraceKeeper(new TraceRecorder(1000, 100), store, 50);
        keeper.onSamples(new float[10], 0, 10, 0);
        Files.delete(dir.resolve("t"));
        Files.writeString(dir.resolve("t"), "a file where the folder was");

        JointOutcome o = keeper.keep(outcome(hammerstep.results.Samples.result(true), 1));

        assertThat(o.tracePath()).isNull();
        assertThat(keeper.failures()).isEqualTo(1);
    }

    @Test
    void readsItsStationFileSection() throws Exception {
        Path f = dir.resolve("s.yaml");
        Files.writeString(f, "traces: { dir: keep, max_count: 300, max_mb: 2.5, encoding: float32, lead_ms: 20 }\n");
        YamlDocument doc = YamlDocument.read(f);
        Problems problems = new Problems(doc.file());
        MapReader root = MapReader.of(problems, doc.root());

        TracesSection.Traces t = TracesSection.INSTANCE.read(root.map("traces"), dir);

        assertThat(problems.list()).isEmpty();
        assertThat(t.dir()).isEqualTo(dir.resolve("keep"));
        assertThat(t.maxCount()).isEqualTo(300);
        assertThat(t.maxBytes()).isEqualTo(2_500_000L);
        assertThat(t.encoding()).isEqualTo(StoredTrace.Encoding.FLOAT32);
        assertThat(t.leadMs()).isEqualTo(20);
    }

    static JointOutcome outcome(JointResult r, int n) {
        return new JointOutcome("TR-" + n, "trailer-hub", "wheel-5", "P1", 1, "final", 1, r, "TQ-1",
                null, Instant.parse("2026-03-04T05:06:07Z"), null);
    }
}
