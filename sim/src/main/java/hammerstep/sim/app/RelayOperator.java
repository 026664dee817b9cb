package hammerstep.sim.app;

import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;

/**
 * The station and its operator for {@code simulate --program}: the controller's own chain
 * ({@link JointMonitor}, replay conditioning) watches the transducer's samples as they are made;
 * when a sample reaches the program's {@code shutoff_at} the station's relay drops tool enable at
 * the end of that block, and the operator lets go of the trigger a reaction time after the
 * crossing. Without {@code shutoff_at} the operator holds the trigger the whole hold.
 */
final class RelayOperator implements JointEvents {

    /** Samples per block fed to the chain: the relay acts within one block (0.32 ms at 50 kHz). */
    static final int BLOCK = 16;

    private final JointMonitor monitor;
    private final double rateHz;
    private final float[] slice = new float[BLOCK];
    private long crossingSample = -1;

    RelayOperator(JointProgram program, double rateHz) {
        this.rateHz = rateHz;
        this.monitor = new JointMonitor(program, JointMonitor.replayConditioning(program), rateHz, BLOCK, this);
    }

    /** Feeds {@code length} samples whose first is sample number {@code firstSample} of the trace. */
    void onSamples(float[] samples, int length, long firstSample) {
        monitor.onSamples(samples, 0, length, Math.round(firstSample * 1e9 / rateHz));
    }

    /** A scratch block of {@link #BLOCK} samples for feeding longer blocks slice by slice. */
    float[] slice() {
        return slice;
    }

    /** The sample at which the running rundown reached {@code shutoff_at}; -1 before it has. */
    long crossingSample() {
        return crossingSample;
    }

    /** A new rundown is about to begin: forget the last crossing. */
    void nextRundown() {
        crossingSample = -1;
    }

    void finish() {
        monitor.finish();
    }

    @Override
    public void onShutoff(long crossingNs) {
        crossingSample = Math.round(crossingNs * 1e-9 * rateHz);
    }

    @Override
    public void onRundown(JointResult result) {
        // the verdicts are replay's to give; the operator only needs the shut-off
    }
}
