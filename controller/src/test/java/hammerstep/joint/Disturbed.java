package hammerstep.joint;

import hammerstep.signal.Conditioning;
import hammerstep.signal.PulseTrain;
import hammerstep.signal.PulseTrain.Strike;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * A seeded plant trace with a known answer: rundowns of strikes drawn by {@link PulseTrain} (widths
 * 1 to 3.5 ms, rebounds, humps, ringing), rendered clean, then disturbed in place by the test
 * (spikes, offset, drift, noise, hum, clipping). The truth is the clean trace: its peaks, and the
 * verdict the chain gives it. {@link #assertMatchesTruth} checks the tolerance: blow count
 * exact, each peak within max(4 %, 10 N·m) of the truth, verdict as the truth implies.
 */
final class Disturbed {

    /** 180/200/230 N·m, blows above 60 N·m released below 30, 4 to 30 blows; rundowns start at 30 N·m. */
    static final JointProgram PROGRAM = new JointProgram("plant", "", new JointProgram.Torque(180, 200, 230),
            FinalTorque.MAX_PEAK, new JointProgram.Blows(60, 30, 4, 30, 7.5),
            new JointProgram.Rundown(30, 200, 5000), 205, 2);

    /** The program the chain judges with; {@link #PROGRAM} unless a test sets another. */
    JointProgram program = PROGRAM;
    final double rateHz;
    final List<List<Strike>> rundowns = new ArrayList<>();
    final List<Strike> strikes = new ArrayList<>();
    final float[] clean;
    /** The trace the chain sees; tests disturb it. */
    final float[] x;
    final Random random;

    /** {@code count} rundowns of 6 to 14 blows, 0.6 s of idle before each and 0.5 s after the last. */
    Disturbed(double rateHz, int count, long seed) {
        this.rateHz = rateHz;
        this.random = new Random(seed);
        double t = 0.6;
        for (int k = 0; k < count; k++) {
            int blows = 6 + random.nextInt(9);
            List<Strike> r = PulseTrain.randomRundown(random, t, blows, 80, 212, 1100, 3300);
            rundowns.add(r);
            strikes.addAll(r);
            Strike last = r.get(blows - 1);
            t = last.startS() + last.spanS() + 0.6;
        }
        clean = PulseTrain.render(rateHz, t - 0.1, strikes, 0, 0, seed);
        x = clean.clone();
    }

    int index(double s) {
        return (int) Math.round(s * rateHz);
    }

    /** The sample where strike {@code s} peaks in the clean trace. */
    int peakIndex(Strike s) {
        int from = index(s.startS());
        int to = Math.min(clean.length, index(s.startS() + s.widthS()) + 1);
        int best = from;
        for (int i = from; i < to; i++) {
            if (clean[i] > clean[best]) {
                best = i;
            }
        }
        return best;
    }

    /** A spike of {@code width} samples, {@code nm} high (either sign), its first sample at {@code at}. */
    void spike(int at, int width, double nm) {
        for (int i = at; i < at + width && i < x.length; i++) {
            x[i] += (float) nm;
        }
    }

    /** A random spike height of 100 to 400 N·m, random sign. */
    double spikeNm() {
        return (random.nextBoolean() ? 1 : -1) * (100 + 300 * random.nextDouble());
    }

    /** Gaussian noise of {@code rmsNm}. */
    void noise(double rmsNm) {
        for (int i = 0; i < x.length; i++) {
            x[i] += (float) (rmsNm * random.nextGaussian());
        }
    }

    /** An offset that starts at {@code fromNm} and drifts linearly to {@code toNm} at the end. */
    void drift(double fromNm, double toNm) {
        for (int i = 0; i < x.length; i++) {
            x[i] += (float) (fromNm + (toNm - fromNm) * i / (x.length - 1));
        }
    }

    /** Mains hum: {@code amplitudes[h]} N·m peak at (h+1) × {@code mainsHz}, random phases. */
    void hum(double mainsHz, double... amplitudes) {
        double[] phase = new double[amplitudes.length];
        for (int h = 0; h < phase.length; h++) {
            phase[h] = 2 * Math.PI * random.nextDouble();
        }
        for (int i = 0; i < x.length; i++) {
            double t = i / rateHz;
            double v = 0;
            for (int h = 0; h < amplitudes.length; h++) {
                v += amplitudes[h] * Math.sin(2 * Math.PI * mainsHz * (h + 1) * t + phase[h]);
            }
            x[i] += (float) v;
        }
    }

    /** The chain over the disturbed trace in blocks of {@code block}. */
    List<JointResult> run(Conditioning conditioning, int block) {
        return run(x, conditioning, block);
    }

    List<JointResult> run(float[] trace, Conditioning conditioning, int block) {
        RecordingJointEvents ev = new RecordingJointEvents();
        JointMonitor m = new JointMonitor(program, conditioning, rateHz, block, ev);
        for (int off = 0; off < trace.length; off += block) {
            m.onSamples(trace, off, Math.min(block, trace.length - off), (long) (off * 1e9 / rateHz));
        }
        m.finish();
        return ev.results;
    }

    /** The chain's results on the clean trace: the verdicts the truth implies. */
    List<JointResult> truth(Conditioning conditioning) {
        return run(clean, conditioning, 512);
    }

    /** Blow count exact, every peak within max(4 %, 10 N·m) of the clean trace's, verdict as the truth's. */
    void assertMatchesTruth(List<JointResult> results, Conditioning conditioning) {
        List<JointResult> truth = truth(conditioning);
        assertThat(truth).as("the clean trace itself").hasSize(rundowns.size());
        assertThat(results).as("rundowns").hasSize(rundowns.size());
        for (int k = 0; k < rundowns.size(); k++) {
            List<Strike> r = rundowns.get(k);
            JointResult got = results.get(k);
            assertThat(got.blows()).as("blows of rundown %d", k).isEqualTo(r.size());
            double[] peaks = PulseTrain.truePeaks(rateHz, clean, 0, r);
            for (int b = 0; b < peaks.length; b++) {
                double tol = Math.max(0.04 * peaks[b], 10.0);
                assertThat(got.peaksNm()[b]).as("peak %d of rundown %d", b, k).isCloseTo(peaks[b],
                        org.assertj.core.api.Assertions.within(tol));
            }
            assertThat(got.verdict()).as("verdict of rundown %d", k).isEqualTo(truth.get(k).verdict());
            assertThat(got.reasons()).as("reasons of rundown %d", k).isEqualTo(truth.get(k).reasons());
        }
    }
}
