package hammerstep.sim.demo;

import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.trace.StationReplay;
import hammerstep.trace.StoredTrace;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.OutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * Replay reproduces the station: every trace a seeded demo run stores, replayed with the program it
 * was judged against, gives the station's blow count, its peaks to the trace's stored resolution, and
 * its verdict and reasons, with no warning.
 */
class DemoReplayTest {

    private static final Path STATION = Path.of("../config/demo/station.yaml");
    private static final Path PROGRAMS = Path.of("../config/demo/programs");

    @TempDir
    Path traces;

    @Test
    void everyStoredTraceOfADemoRunReplaysToTheStationsJudgement() throws Exception {
        int exit = new DemoRunner(new DemoOptions(STATION, 2, 3, true, true, 0, traces),
                new PrintStream(OutputStream.nullOutputStream())).run();
        assertThat(exit).isZero();
        List<Path> stored;
        try (Stream<Path> s = Files.list(traces)) {
            stored = s.filter(StoredTrace::isStored).sorted().toList();
        }
        // two parts of the demo: 8 + 4 positions, snug and final, and the operator's reworks
        assertThat(stored).hasSizeGreaterThanOrEqualTo(24);

        Map<String, JointProgram> programs = new HashMap<>();
        int noGo = 0;
        for (Path p : stored) {
            StoredTrace.Header h = StoredTrace.readHeader(p);
            JointProgram program = programs.computeIfAbsent(h.programId(), id -> load(PROGRAMS.resolve(id + ".yaml")));
            List<JointResult> again = new ArrayList<>();
            List<String> warnings = new ArrayList<>();

            StationReplay.replay(p, program, c -> c, 4096, again::add, null, warnings::add);

            Map<String, String> station = h.metadata();
            assertThat(warnings).as(p.toString()).isEmpty();
            assertThat(again).as(p.toString()).hasSize(1);
            JointResult r = again.get(0);
            assertThat(r.blows()).as(p + " blows").isEqualTo(Integer.parseInt(station.get("blows")));
            double[] peaks = Arrays.stream(station.get("peaks_nm").split(",")).filter(t -> !t.isEmpty())
                    .mapToDouble(Double::parseDouble).toArray();
            assertThat(r.peaksNm()).as(p + " peaks").hasSize(peaks.length);
            for (int i = 0; i < peaks.length; i++) {
                assertThat(r.peaksNm()[i]).as(p + " peak " + i).isCloseTo(peaks[i], within(h.resolutionNm()));
            }
            // OUT_OF_SEQUENCE is the sequence's (position sensors), not the chain's: not in a trace
            List<String> reasons = Arrays.stream(station.get("reasons").split(","))
                    .filter(t -> !t.isEmpty() && !t.equals(Reason.OUT_OF_SEQUENCE.name())).toList();
            assertThat(r.reasons().stream().map(Enum::name).toList()).as(p + " reasons").isEqualTo(reasons);
            assertThat(r.verdict()).as(p + " verdict").isEqualTo(reasons.isEmpty() ? Verdict.GO : Verdict.NO_GO);
            noGo += r.verdict() == Verdict.NO_GO ? 1 : 0;
        }
        assertThat(noGo).as("the run holds a NO_GO too").isPositive();
    }

    private static JointProgram load(Path file) {
        try {
            return ProgramFile.load(file);
        } catch (Exception e) {
            throw new AssertionError(e);
        }
    }
}
