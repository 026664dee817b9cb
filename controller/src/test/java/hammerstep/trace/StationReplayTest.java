package hammerstep.trace;

import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.results.JointOutcome;
import hammerstep.signal.Conditioning;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * A trace kept with its chain state replays to the station's own judgement; the same samples judged
 * from a fresh chain do not (the zero and the filter state at the rundown's start differ).
 */
class StationReplayTest {

    private static final int BLOCK = 16;
    /** The station's conditioning: a low-pass, a slow zero tracker, over-range at the transducer's range. */
    private static final Conditioning STATION = new Conditioning(4.0, 5.0, 300.0, 1000.0, 0.0, 3000.0);

    @TempDir
    Path dir;

    private JointProgram program() throws Exception {
        return ProgramFile.load(Paths.get("src/test/resources/programs/wheel-demo.yaml"));
    }

    /** Two rundowns on a signal with a 1.6 N·m offset and noise, the second with lower peaks. */
    private static float[] shift() {
        float[] a = SyntheticRundown.samples(9, 130, 207, 55);
        float[] b = SyntheticRundown.samples(6, 120, 176, 60);
        int idle = 6000;
        float[] x = new float[idle + a.length + b.length];
        System.arraycopy(a, 0, x, idle, a.length);
        System.arraycopy(b, 0, x, idle + a.length, b.length);
        Random r = new Random(11);
        for (int i = 0; i < x.length; i++) {
            x[i] += (float) (1.6 + 0.02 * r.nextGaussian());
        }
        return x;
    }

    /** Runs the station's monitor with a keeper fed as StationAgent feeds it; returns the kept joints. */
    private List<JointOutcome> station(StoredTrace.Encoding encoding, boolean withChain) throws Exception {
        JointProgram program = program();
        TraceKeeper keeper = new TraceKeeper(TraceRecorder.forSeconds(SyntheticRundown.RATE_HZ, 5),
                new TraceStore(dir.resolve(encoding.name()), 100, Long.MAX_VALUE, encoding), 50);
        List<JointOutcome> kept = new ArrayList<>();
        JointMonitor[] monitor = new JointMonitor[1];
        monitor[0] = new JointMonitor(program, STATION, SyntheticRundown.RATE_HZ, BLOCK, new JointEvents() {
            @Override
            public void onRundownStart(long startNs) {
                keeper.rundownStarted(startNs);
            }

            @Override
            public void onRundown(JointResult result) {
                keeper.rundownJudged(result.startNs());
                kept.add(keeper.keep(TraceKeeperTest.outcome(result, kept.size() + 1)));
            }
        });
        float[] x = shift();
        for (int at = 0; at + BLOCK <= x.length; at += BLOCK) {
            long t = 3_000_000_000L + Math.round(at * 1e9 / SyntheticRundown.RATE_HZ);
            if (withChain) {
                keeper.onBlock(x, at, BLOCK, t, monitor[0].conditioner());
            } else {
                keeper.onSamples(x, at, BLOCK, t);
            }
            monitor[0].onSamples(x, at, BLOCK, t);
        }
        assertThat(kept).hasSize(2);
        return kept;
    }

    private static JointResult replay(Path p, JointProgram program, List<String> warnings) throws TraceException {
        List<JointResult> again = new ArrayList<>();
        StationReplay.replay(p, program, c -> c, 4096, again::add, null, warnings::add);
        assertThat(again).hasSize(1);
        return again.get(0);
    }

    @Test
    void aFloat32TraceReplaysToExactlyTheStationsFigures() throws Exception {
        for (JointOutcome o : station(StoredTrace.Encoding.FLOAT32, true)) {
            List<String> warnings = new ArrayList<>();
            JointResult r = replay(Path.of(o.tracePath()), program(), warnings);
            JointResult s = o.result();

            assertThat(warnings).isEmpty();
            assertThat(r.blows()).isEqualTo(s.blows());
            assertThat(r.peaksNm()).containsExactly(s.peaksNm());
            assertThat(r.finalTorqueNm()).isEqualTo(s.finalTorqueNm());
            assertThat(r.reasons()).isEqualTo(s.reasons());
            assertThat(r.verdict()).isEqualTo(s.verdict());
            assertThat(r.startNs()).isEqualTo(s.startNs());
            assertThat(r.durationMs()).isEqualTo(s.durationMs());
        }
    }

    @Test
    void anInt16TraceReplaysToTheStationsFiguresWithinOneStoredStep() throws Exception {
        for (JointOutcome o : station(StoredTrace.Encoding.INT16, true)) {
            Path p = Path.of(o.tracePath());
            double step = StoredTrace.readHeader(p).resolutionNm();
            JointResult r = replay(p, program(), new ArrayList<>());
            JointResult s = o.result();

            assertThat(step).isPositive().isLessThan(0.01);
            assertThat(r.blows()).isEqualTo(s.blows());
            for (int i = 0; i < s.blows(); i++) {
                assertThat(r.peaksNm()[i]).isCloseTo(s.peaksNm()[i], within(step));
            }
            assertThat(r.reasons()).isEqualTo(s.reasons());
            assertThat(r.verdict()).isEqualTo(s.verdict());
        }
    }

    @Test
    void theSameSamplesFromAFreshChainComeOutHigherByTheOffset() throws Exception {
        JointOutcome o = station(StoredTrace.Encoding.FLOAT32, true).get(0);
        StoredTrace.Loaded t = StoredTrace.load(Path.of(o.tracePath()));
        List<JointResult> fresh = new ArrayList<>();
        JointMonitor m = new JointMonitor(program(), STATION, t.header().rateHz(), 4096, fresh::add);
        m.onSamples(t.samples(), 0, Math.min(4096, t.samples().length), t.timeOf(0));
        for (int at = 4096; at < t.samples().length; at += 4096) {
            m.onSamples(t.samples(), at, Math.min(4096, t.samples().length - at), t.timeOf(at));
        }
        m.finish();

        // the chain state is what makes the difference: without it the offset is not taken off
        assertThat(fresh.get(0).finalTorqueNm() - o.result().finalTorqueNm()).isGreaterThan(1.0);
    }

    @Test
    void theTraceNamesWhatTheChainNeeds() throws Exception {
        JointOutcome o = station(StoredTrace.Encoding.INT16, true).get(1);
        StoredTrace.Header h = StoredTrace.readHeader(Path.of(o.tracePath()));
        StationReplay.Chain chain = StationReplay.chainOf(Path.of(o.tracePath()), h, STATION);

        assertThat(h.metadata()).containsEntry("block_samples", "16").containsEntry("program", "wheel-demo")
                .containsKey("program_revision").containsEntry("blows", "6").containsKey("conditioner.zeroNm");
        assertThat(h.rangeNm()).isEqualTo(1000.0);
        assertThat(chain.input().settings()).isEqualTo(STATION);
        assertThat((double) chain.input().state().zeroNm()).isCloseTo(1.6, within(0.05));
        // the lead (50 ms) before the block the rundown started in
        assertThat(chain.judgeFrom()).isBetween(1000, 1000 + BLOCK);
    }

    @Test
    void anotherRevisionOfTheProgramIsWarnedOnOneLine() throws Exception {
        JointOutcome o = station(StoredTrace.Encoding.FLOAT32, true).get(0);
        JointProgram p = program();
        JointProgram edited = new JointProgram(p.id(), "0123456789ab", p.torque(), p.finalTorque(), p.blows(),
                p.rundown(), p.shutoffAtNm(), p.rehitBlows());
        List<String> warnings = new ArrayList<>();

        replay(Path.of(o.tracePath()), edited, warnings);

        assertThat(warnings).singleElement().satisfies(w -> assertThat(w)
                .startsWith(o.tracePath() + ": judged at the station with wheel-demo revision " + p.revision())
                .contains("replayed with revision 0123456789ab").doesNotContain("\n"));
    }

    @Test
    void anotherProgramIsWarnedByName() throws Exception {
        JointOutcome o = station(StoredTrace.Encoding.FLOAT32, true).get(0);
        JointProgram p = program();
        JointProgram other = new JointProgram("hub-snug", p.revision(), p.torque(), p.finalTorque(), p.blows(),
                p.rundown(), p.shutoffAtNm(), p.rehitBlows());
        List<String> warnings = new ArrayList<>();

        replay(Path.of(o.tracePath()), other, warnings);

        assertThat(warnings).singleElement().asString().contains("program wheel-demo").contains("replayed with hub-snug");
    }

    @Test
    void aTraceKeptWithoutChainStateIsJudgedFromAFreshChainAndSaysSo() throws Exception {
        JointOutcome o = station(StoredTrace.Encoding.FLOAT32, false).get(0);
        List<String> warnings = new ArrayList<>();

        JointResult r = replay(Path.of(o.tracePath()), program(), warnings);

        assertThat(warnings).singleElement().asString().contains("no chain state").contains("fresh chain");
        assertThat(r.blows()).isEqualTo(9);
    }

    @Test
    void aFormatOneTraceIsReadUncheckedAndSaysSo() throws Exception {
        Path p = dir.resolve("old.hst");
        float[] x = SyntheticRundown.samples(5, 150, 200, 60);
        try (OutputStream out = Files.newOutputStream(p)) {
            StoredTrace.write(out, StoredTrace.Encoding.FLOAT32, SyntheticRundown.RATE_HZ, 0,
                    Map.of("program", "wheel-demo"), x, 0, x.length, null);
        }
        byte[] b = Files.readAllBytes(p);
        byte[] v1 = java.util.Arrays.copyOf(b, b.length - 4);
        v1[4] = 1;
        Files.write(p, v1);
        List<String> warnings = new ArrayList<>();

        JointResult r = replay(p, program(), warnings);

        assertThat(warnings).singleElement().asString().contains("format 1").contains("unchecked");
        assertThat(r.blows()).isEqualTo(5);
    }
}
