package hammerstep.sim.physics;

import hammerstep.joint.Direction;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The tool in reverse ({@link Rig#setReverse}): a bolt tightened by the tool, then loosened by it. The
 * reverse strikes read negative with positive rebound lobes; the truth's reverse peaks are negative;
 * the controller's chain judges the tightening a tightening and the loosening a loosening, with the
 * truth's reverse blows. Cam-and-ball (cordless-three-dog) and twin-hammer (air-twin-hammer) tools.
 */
class ReverseTest {

    static Stream<Arguments> cases() {
        List<Arguments> list = new ArrayList<>();
        for (String tool : List.of("cordless-three-dog", "air-twin-hammer")) {
            for (double rate : new double[] {20_000, 50_000, 100_000}) {
                list.add(Arguments.of(tool, rate));
            }
        }
        return list.stream();
    }

    private static void run(Rig rig, JointMonitor monitor, float[] block, double ms, float[] lowHigh) {
        long samples = Math.round(ms * 1e-3 * rig.rateHz());
        while (samples > 0) {
            int n = (int) Math.min(block.length, samples);
            long firstNs = (long) (rig.samplesElapsed() * 1e9 / rig.rateHz());
            rig.fill(block, 0, n);
            for (int i = 0; i < n; i++) {
                lowHigh[0] = Math.min(lowHigh[0], block[i]);
                lowHigh[1] = Math.max(lowHigh[1], block[i]);
            }
            monitor.onSamples(block, 0, n, firstNs);
            samples -= n;
        }
    }

    @ParameterizedTest(name = "{0} at {1} Hz")
    @MethodSource("cases")
    void aBoltTightenedThenLoosenedGivesATighteningAndALoosening(String tool, double rate) throws Exception {
        // the cross-check's program with blows released below 80 N·m: loosening, the nut keeps turning
        // between strikes under some 40 to 55 N·m of the tool's push, above the default release (50)
        // and the tool's re-contact time as the dead time, as the truth merges contacts (docs/simulator.md)
        Rig rig = Rig.create(Presets.tool(tool), Presets.joint("iso-hard"), Presets.defaultTransducer(), rate, 1);
        JointProgram iso = CrossCheckTest.program();
        JointProgram program = new JointProgram(iso.id(), iso.revision(), iso.torque(), iso.finalTorque(),
                new JointProgram.Blows(iso.blows().countAboveNm(), 80, iso.blows().min(), iso.blows().max(),
                        rig.recontactS() * 1e3), iso.rundown(), iso.shutoffAtNm(), iso.rehitBlows());
        rig.setBlowThresholdNm(program.blows().countAboveNm());
        List<JointResult> results = new ArrayList<>();
        JointEvents events = results::add;
        JointMonitor monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), rate, 1000, events);
        float[] block = new float[1000];
        float[] forward = {Float.MAX_VALUE, -Float.MAX_VALUE};
        run(rig, monitor, block, 100, forward);
        rig.setTrigger(true);
        run(rig, monitor, block, 700, forward);
        rig.setTrigger(false);
        run(rig, monitor, block, 400, forward);
        int tightening = rig.blows();

        rig.setReverse(true);
        float[] reverse = {Float.MAX_VALUE, -Float.MAX_VALUE};
        rig.setTrigger(true);
        run(rig, monitor, block, 700, reverse);
        rig.setTrigger(false);
        run(rig, monitor, block, 400, reverse);
        monitor.finish();

        int loosening = rig.blows() - tightening;
        assertThat(loosening).as("reverse blows in the truth").isPositive();
        for (int i = tightening; i < rig.blows(); i++) {
            assertThat(rig.blowPeakNm(i)).as("truth peak of reverse blow %d", i - tightening).isNegative();
        }
        // negative strikes, and their rebound lobes positive
        assertThat(reverse[0]).isLessThan((float) -program.blows().countAboveNm());
        assertThat(reverse[1]).isPositive();
        assertThat(rig.angleAfterSnugDeg()).as("the bolt gave up its clamp angle").isLessThan(1.0);

        assertThat(results).hasSize(2);
        JointResult t = results.get(0);
        assertThat(t.direction()).isEqualTo(Direction.TIGHTEN);
        assertThat(t.blows()).isEqualTo(tightening);
        JointResult l = results.get(1);
        assertThat(l.direction()).isEqualTo(Direction.LOOSEN);
        assertThat(l.verdict()).isEqualTo(Verdict.NO_GO);
        assertThat(l.reasons()).contains(Reason.LOOSENED);
        // The count within one or two of the truth's: the truth and the detector still tell the first
        // strikes after the dogs cross the free travel (a strike and its re-contact 8 to 9 ms later)
        // apart differently, as they do forward (issue 15, "one definition of a blow"). Never fewer than
        // 90 % of the truth's blows, and every detected peak a reverse one.
        assertThat(l.blows()).isBetween(loosening - 2, loosening + 2);
        double strongest = 0;
        for (int i = tightening; i < rig.blows(); i++) {
            strongest = Math.min(strongest, rig.blowPeakNm(i));
        }
        for (double peak : l.peaksNm()) {
            assertThat(peak).isNegative();
        }
        // max(4 %, 10 N·m); at 20 kHz the top of a short peak is missed as forward (docs/simulator.md)
        double fraction = rate < 50_000 ? 0.10 : 0.04;
        assertThat(l.finalTorqueNm()).as("strongest reverse strike")
                .isCloseTo(strongest, org.assertj.core.api.Assertions.within(fraction * -strongest));
    }
}
