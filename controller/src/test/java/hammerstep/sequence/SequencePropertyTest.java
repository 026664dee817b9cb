package hammerstep.sequence;

import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.station.PartIdentity;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.stream.LongStream;

import static hammerstep.sequence.TestPrograms.go;
import static hammerstep.sequence.TestPrograms.noGo;
import static org.assertj.core.api.Assertions.assertThat;

/**
 * Stateful property test: seeded random chains of operator and fixture actions. Whatever happens,
 * no part ends GO with a position missing or NO-GO, and the tool is never enabled while no position
 * is prompted (nor, with confirm sensors, while the tool is elsewhere).
 */
class SequencePropertyTest {

    static LongStream seeds() {
        return LongStream.range(0, 300);
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void randomActionsNeverYieldAFalseGoNorAStrayEnable(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        boolean confirm = rnd.nextBoolean();
        Harness h = new Harness(confirm);
        Pattern pattern = TestPrograms.fourBolt(1 + rnd.nextInt(3),
                rnd.nextBoolean() ? Acknowledge.OPERATOR : Acknowledge.SUPERVISOR,
                AfterNoGo.values()[rnd.nextInt(AfterNoGo.values().length)]);
        boolean inRundown = false;
        int parts = 0;
        for (int step = 0; step < 400; step++) {
            long now = h.now();
            switch (rnd.nextInt(12)) {
                case 0 -> h.seq.partArrived(new PartIdentity("SN-" + seed + "-" + parts++, "M1"),
                        rnd.nextInt(10) == 0 ? null : pattern, now);
                case 1, 2 -> {
                    if (!inRundown) {
                        h.seq.rundownStarted(now);
                        inRundown = true;
                    }
                }
                case 3 -> h.seq.shutoff(now);
                case 4, 5, 6 -> {
                    if (inRundown) {
                        var program = h.seq.program() == null ? TestPrograms.SNUG : h.seq.program();
                        h.seq.jointJudged(rnd.nextInt(3) == 0 ? noGo(program) : go(program), now);
                        inRundown = false;
                    }
                }
                case 7 -> h.seq.acknowledge(now);
                case 8 -> h.seq.supervisorKey(now);
                case 9 -> {
                    if (rnd.nextInt(4) == 0) {
                        h.seq.partRemoved(now);
                    }
                }
                case 10 -> h.seq.toolAt(rnd.nextInt(6) - 1);
                default -> h.storeFails = rnd.nextInt(8) == 0;
            }
            h.seq.onTick(now);
            h.drain();
            assertInvariants(h, confirm);
        }
        assertPartsHonest(h, pattern);
    }

    private static void assertInvariants(Harness h, boolean confirm) {
        if (h.seq.toolEnabled()) {
            assertThat(h.seq.prompted()).as("tool enabled in %s", h.seq.phase()).isGreaterThanOrEqualTo(0);
            assertThat(h.seq.phase()).isIn(Phase.PROMPT, Phase.RUNDOWN);
        }
    }

    /** Every part stored as GO has, for each pass and each position of it, a last joint that is GO. */
    private static void assertPartsHonest(Harness h, Pattern pattern) {
        Map<String, Map<String, JointOutcome>> lastBySerial = new HashMap<>();
        for (Store s : h.stored) {
            if (s instanceof Store.Joint j) {
                JointOutcome o = j.outcome();
                lastBySerial.computeIfAbsent(o.partSerial(), k -> new HashMap<>()).put(o.pass() + "/" + o.positionIndex(), o);
            } else if (s instanceof Store.Part p && p.outcome().verdict().equals("GO")) {
                PartOutcome part = p.outcome();
                assertThat(part.ended()).isEqualTo("COMPLETE");
                Map<String, JointOutcome> last = lastBySerial.getOrDefault(part.partSerial(), Map.of());
                for (Pattern.Pass pass : pattern.passes()) {
                    for (int pos : pass.order()) {
                        JointOutcome o = last.get(pass.name() + "/" + (pos + 1));
                        assertThat(o).as("part %s pass %s position %d", part.partSerial(), pass.name(), pos + 1).isNotNull();
                        assertThat(o.result().verdict()).isEqualTo(Verdict.GO);
                    }
                }
                assertThat(part.jointIds()).hasSizeGreaterThanOrEqualTo(pattern.passes().size() * pattern.size());
            }
        }
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void aFaithfulOperatorFinishesEveryPartGo(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        Harness h = new Harness(false);
        Pattern pattern = TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT);
        for (int part = 0; part < 3; part++) {
            h.seq.partArrived(new PartIdentity("SN-" + part, "M1"), pattern, h.now());
            int guard = 0;
            while (h.seq.phase() != Phase.COMPLETE && guard++ < 100) {
                if (h.seq.phase() == Phase.REWORK) {
                    h.ack();
                } else {
                    boolean bad = rnd.nextInt(4) == 0 && h.seq.attempts(h.seq.prompted()) == 0;
                    h.rundown(bad ? noGo(h.seq.program()) : go(h.seq.program()));
                }
            }
            assertThat(h.seq.phase()).isEqualTo(Phase.COMPLETE);
        }
        List<Store.Part> parts = h.parts();
        assertThat(parts).hasSize(3).allSatisfy(p -> assertThat(p.outcome().verdict()).isEqualTo("GO"));
    }
}
