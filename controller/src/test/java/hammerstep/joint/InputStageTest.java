package hammerstep.joint;

import hammerstep.signal.Conditioning;
import hammerstep.signal.PulseTrain;
import hammerstep.signal.PulseTrain.Strike;
import hammerstep.signal.SignalFaults;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * The transducer's one input stage: conditioning carries on across program switches, and blocks
 * that do not follow each other in time are data gaps.
 */
class InputStageTest {

    private static final double RATE = 10_000;
    private static final int BLOCK = 100;
    private static final double PERIOD_NS = 1e9 / RATE;
    /** Zero tracked within 10 N·m on blocks spreading less than 5 N·m, 1 s time constant, a 2 kHz low-pass. */
    private static final Conditioning CONDITIONING = new Conditioning(5.0, 10.0, 1000.0, Double.NaN, 0.0, 2000.0);
    private static final JointProgram FINAL = Programs.withoutShutoff(Programs.hubFinal());
    /** Another pass's program: the same start level, another torque window. */
    private static final JointProgram SNUG = new JointProgram("snug", "", new JointProgram.Torque(60, 80, 100),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 1, 30, 7.5), new JointProgram.Rundown(10, 200, 5000),
            Double.NaN, 0);

    /** Strikes every 27 ms with peaks climbing from 80 to 210 N·m. */
    private static List<Strike> rundown(double startS) {
        List<Strike> s = new ArrayList<>();
        for (int i = 0; i < 8; i++) {
            s.add(new Strike(startS + i * 0.027, 0.002, 80 + 130.0 * i / 7, 0.3, 0.2, 0));
        }
        return s;
    }

    private static long ns(long sample) {
        return Math.round(sample * PERIOD_NS);
    }

    // ---- one input stage across program switches ---------------------------------------------

    @Test
    void switchingProgramsAfterADriftGivesWhatOneContinuousChainGives() {
        // 20 s idle while the transducer's offset drifts from 0 to 6 N·m (warming up), then a rundown
        float[] x = PulseTrain.render(RATE, 21.0, rundown(20.1), 0.0, 0.2, 7);
        for (int i = 0; i < x.length; i++) {
            x[i] += (float) (6.0 * Math.min(1.0, i / (18.0 * RATE)));
        }
        int switchAt = (int) (20.0 * RATE);

        // the station: one stage, the snug pass's monitor current while idle, the final pass's from 20 s
        RecordingJointEvents snugEvents = new RecordingJointEvents();
        RecordingJointEvents finalEvents = new RecordingJointEvents();
        InputStage stage = new InputStage(CONDITIONING, RATE, BLOCK);
        JointMonitor snug = new JointMonitor(SNUG, stage, snugEvents);
        JointMonitor pass = new JointMonitor(FINAL, stage, finalEvents);
        for (int off = 0; off < x.length; off += BLOCK) {
            (off < switchAt ? snug : pass).onSamples(x, off, BLOCK, ns(off));
        }
        pass.finish();

        // one continuous chain of the final program over the whole signal
        RecordingJointEvents oneEvents = new RecordingJointEvents();
        JointMonitor one = new JointMonitor(FINAL, CONDITIONING, RATE, BLOCK, oneEvents);
        for (int off = 0; off < x.length; off += BLOCK) {
            one.onSamples(x, off, BLOCK, ns(off));
        }
        one.finish();

        assertThat(snugEvents.results).isEmpty();
        assertThat(finalEvents.results).hasSize(1);
        assertThat(oneEvents.results).hasSize(1);
        assertSameResult(finalEvents.results.get(0), oneEvents.results.get(0));
        assertThat(pass.idleState()).isNotNull().isEqualTo(one.idleState());
        assertThat(stage.conditioner().zeroNm()).isCloseTo(6.0, within(0.2));
        assertThat(finalEvents.faults).isEqualTo(oneEvents.faults).isEmpty();

        // what a conditioner per program gave: the final pass's own zero is the one of its last run
        // (the first 2 s), 6 N·m of drift ago, and every peak reads high by most of it
        RecordingJointEvents ownEvents = new RecordingJointEvents();
        JointMonitor own = new JointMonitor(FINAL, CONDITIONING, RATE, BLOCK, ownEvents);
        for (int off = 0; off < x.length; off += BLOCK) {
            if (off < 2 * RATE || off >= switchAt) {
                own.onSamples(x, off, BLOCK, ns(off));
            }
        }
        own.finish();
        assertThat(ownEvents.results.get(0).finalTorqueNm() - oneEvents.results.get(0).finalTorqueNm())
                .as("a stale zero").isGreaterThan(3.0);
    }

    private static void assertSameResult(JointResult a, JointResult b) {
        assertThat(a.blows()).isEqualTo(b.blows());
        assertThat(a.peaksNm()).containsExactly(b.peaksNm());
        assertThat(a.peakTimesNs()).containsExactly(b.peakTimesNs());
        assertThat(a.widthsMs()).containsExactly(b.widthsMs());
        assertThat(a.finalTorqueNm()).isEqualTo(b.finalTorqueNm());
        assertThat(a.startNs()).isEqualTo(b.startNs());
        assertThat(a.endNs()).isEqualTo(b.endNs());
        assertThat(a.faults()).isEqualTo(b.faults());
        assertThat(a.verdict()).isEqualTo(b.verdict());
        assertThat(a.reasons()).isEqualTo(b.reasons());
    }

    // ---- gaps are faults ----------------------------------------------------------------------

    /** One rundown from 0.1 s (peak blow about 0.29 s), judged GO when every block arrives. */
    private static final float[] RUNDOWN = PulseTrain.render(RATE, 1.0, rundown(0.1), 0.3, 0.2, 3);

    /** Feeds {@link #RUNDOWN} in blocks, leaving out block {@code lost} (-1: none) and shifting stamps by {@code jitterNs}. */
    private static JointMonitor feed(RecordingJointEvents ev, int lost, long[] jitterNs) {
        JointMonitor m = new JointMonitor(FINAL, JointMonitor.replayConditioning(FINAL), RATE, BLOCK, ev);
        for (int b = 0; b * BLOCK < RUNDOWN.length; b++) {
            if (b != lost) {
                m.onSamples(RUNDOWN, b * BLOCK, BLOCK, ns((long) b * BLOCK) + jitterNs[b % jitterNs.length]);
            }
        }
        m.finish();
        return m;
    }

    @Test
    void everyBlockInTimeIsGo() {
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = feed(ev, -1, new long[] {0});
        assertThat(ev.results).singleElement().satisfies(r -> {
            assertThat(r.verdict()).isEqualTo(Verdict.GO);
            assertThat(r.blows()).isEqualTo(8);
        });
        assertThat(m.inputStage().gapsDuringRundowns() + m.inputStage().gapsOutsideRundowns()).isZero();
    }

    @Test
    void aBlockLostInMidRundownIsADataGapAndNeverGo() {
        RecordingJointEvents ev = new RecordingJointEvents();
        // block 29 (0.29 s to 0.30 s) held the peak blow: without it the rest would still read 180+ N·m
        JointMonitor m = feed(ev, 29, new long[] {0});
        assertThat(ev.results).singleElement().satisfies(r -> {
            assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(r.reasons()).contains(Reason.SENSOR_FAULT);
            assertThat(r.faults() & SignalFaults.DATA_GAP).isNotZero();
            assertThat(SignalFaults.names(r.faults())).contains("DATA_GAP");
        });
        assertThat(ev.faults).containsExactly(SignalFaults.DATA_GAP);
        assertThat(m.inputStage().gapsDuringRundowns()).isEqualTo(1);
        assertThat(m.inputStage().gapsOutsideRundowns()).isZero();
        assertThat(m.inputStage().samplesLost()).isEqualTo(BLOCK);
    }

    @Test
    void aBlockLostBeforeTheRundownIsCountedAndTheRundownIsStillGo() {
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = feed(ev, 4, new long[] {0});
        assertThat(ev.results).singleElement().satisfies(r -> assertThat(r.verdict()).isEqualTo(Verdict.GO));
        assertThat(ev.faults).isEmpty();
        assertThat(m.inputStage().gapsOutsideRundowns()).isEqualTo(1);
        assertThat(m.inputStage().gapsDuringRundowns()).isZero();
    }

    @Test
    void stampsWithinHalfASamplePeriodAreContinuousAndBeyondItAreAGap() {
        long[] jitter = {0, 20_000, -20_000, 10_000, -24_000}; // the period is 100 µs: steps of at most 44 µs
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = feed(ev, -1, jitter);
        assertThat(ev.results).singleElement().satisfies(r -> assertThat(r.verdict()).isEqualTo(Verdict.GO));
        assertThat(m.inputStage().gapsOutsideRundowns() + m.inputStage().gapsDuringRundowns()).isZero();

        // one block 60 µs late, inside the rundown: the block before it ended earlier than that
        long[] late = new long[40];
        late[25] = 60_000;
        RecordingJointEvents ev2 = new RecordingJointEvents();
        feed(ev2, -1, late);
        assertThat(ev2.results).singleElement().satisfies(r -> {
            assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(r.faults() & SignalFaults.DATA_GAP).isNotZero();
        });
    }

    @Test
    void aBlockStampedEarlierThanTheEndOfTheOneBeforeIsAGapToo() {
        long[] back = new long[40];
        back[22] = -100_000; // one period early: overlapping samples, the time base is broken
        RecordingJointEvents ev = new RecordingJointEvents();
        feed(ev, -1, back);
        assertThat(ev.results).singleElement().satisfies(r -> assertThat(r.reasons()).contains(Reason.SENSOR_FAULT));
    }

    @Test
    void aLossAnnouncedByTheSourceIsAGapEvenWithUnbrokenStamps() {
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(FINAL, JointMonitor.replayConditioning(FINAL), RATE, BLOCK, ev);
        for (int b = 0; b * BLOCK < RUNDOWN.length; b++) {
            if (b == 15) {
                m.inputStage().gap(); // e.g. missed conversions, the stamps re-anchored
            }
            m.onSamples(RUNDOWN, b * BLOCK, BLOCK, ns((long) b * BLOCK));
        }
        m.finish();
        assertThat(ev.results).singleElement().satisfies(r -> {
            assertThat(r.verdict()).isEqualTo(Verdict.NO_GO);
            assertThat(r.faults()).isEqualTo(SignalFaults.DATA_GAP);
        });
        assertThat(m.inputStage().gapsDuringRundowns()).isEqualTo(1);
        assertThat(m.inputStage().samplesLost()).isZero();
    }

    /**
     * Without impulse rejection: its look-ahead would shift the conditioned samples against the
     * blocks, and its flat-top check would take the test's square pulse for a clipped one.
     */
    private static final Conditioning EDGES = Conditioning.forReplay(0).withImpulse(0);

    @Test
    void aGapRightBeforeARundownThatBeginsAtTheBlocksFirstSampleTakesTheRundown() {
        // 1 kHz, blocks of 10: quiet, then torque from the first sample of block 3 on
        JointProgram p = new JointProgram("edges", "", new JointProgram.Torque(50, 60, 70), FinalTorque.MAX_PEAK,
                new JointProgram.Blows(40, 20, 1, 10, 3), new JointProgram.Rundown(10, 5, 50), Double.NaN, 0);
        float[] x = new float[80];
        for (int i = 30; i < 45; i++) {
            x[i] = 55;
        }
        RecordingJointEvents straight = new RecordingJointEvents();
        JointMonitor a = new JointMonitor(p, EDGES, 1000, 10, straight);
        RecordingJointEvents atStart = new RecordingJointEvents();
        JointMonitor b = new JointMonitor(p, EDGES, 1000, 10, atStart);
        for (int k = 0; k < 8; k++) {
            a.onSamples(x, k * 10, 10, k * 10_000_000L);
            if (k != 2) { // block 2 lost: the rundown may have begun in it
                b.onSamples(x, k * 10, 10, k * 10_000_000L);
            }
        }
        assertThat(straight.results).singleElement().satisfies(r -> assertThat(r.verdict()).isEqualTo(Verdict.GO));
        assertThat(atStart.results).singleElement().satisfies(r -> assertThat(r.faults()).isEqualTo(SignalFaults.DATA_GAP));
        assertThat(b.inputStage().gapsDuringRundowns()).isEqualTo(1);

        // lost block 1 instead: block 2 is quiet at its start, the rundown starts after the gap
        RecordingJointEvents later = new RecordingJointEvents();
        JointMonitor c = new JointMonitor(p, EDGES, 1000, 10, later);
        for (int k = 0; k < 8; k++) {
            if (k != 1) {
                c.onSamples(x, k * 10, 10, k * 10_000_000L);
            }
        }
        assertThat(later.results).singleElement().satisfies(r -> assertThat(r.verdict()).isEqualTo(Verdict.GO));
        assertThat(c.inputStage().gapsOutsideRundowns()).isEqualTo(1);
    }
}
