package hammerstep.joint;

import java.util.List;

/**
 * One judged rundown: its figures, its verdict and the program windows it was judged against.
 * Created once per rundown (not on the per-sample path).
 *
 * @param startNs           time of the sample that started the rundown
 * @param endNs             time of the last sample above the rundown threshold
 * @param peaksNm           peak torque of each blow, in order (at most {@link JointMonitor#MAX_STORED_BLOWS})
 * @param peakTimesNs       time of each peak
 * @param widthsMs          time each blow's main lobe stayed above the release level
 * @param impulsesNms       ∫T dt of each blow over its lobes above the release level, N·m·s
 * @param blows             number of blows, even past the stored arrays
 * @param finalTorqueNm     per the program's {@code final_torque}; 0 when there was no blow
 * @param durationMs        from start to the last sample above the rundown threshold
 * @param shutoffAtNs       time the shut-off level was first reached; {@link Long#MIN_VALUE} when not
 * @param blowsAfterShutoff blows that began after the shut-off crossing
 * @param faults            sensor faults seen during the rundown (bits of {@link hammerstep.signal.SignalFaults})
 * @param direction         {@link Direction#LOOSEN} when the rundown's strikes went against the tightening
 *                          sense; its peaks are then those reverse strikes, negative, and it is NO-GO
 *                          ({@link Reason#LOOSENED})
 * @param rejectedImpulses  electrical impulses the conditioner replaced while the rundown was under way
 * @param residual          the residual-torque estimate (or the reason there is none); null for a loosening
 *                          and for results built without one
 */
public record JointResult(
        JointProgram program,
        long startNs,
        long endNs,
        int blows,
        double[] peaksNm,
        long[] peakTimesNs,
        double[] widthsMs,
        double[] impulsesNms,
        double finalTorqueNm,
        double durationMs,
        long shutoffAtNs,
        int blowsAfterShutoff,
        int faults,
        Verdict verdict,
        List<Reason> reasons,
        Direction direction,
        int rejectedImpulses,
        ResidualEstimate residual) {

    /** A result without a residual estimate. */
    public JointResult(JointProgram program, long startNs, long endNs, int blows, double[] peaksNm,
                       long[] peakTimesNs, double[] widthsMs, double[] impulsesNms, double finalTorqueNm,
                       double durationMs, long shutoffAtNs, int blowsAfterShutoff, int faults, Verdict verdict,
                       List<Reason> reasons, Direction direction, int rejectedImpulses) {
        this(program, startNs, endNs, blows, peaksNm, peakTimesNs, widthsMs, impulsesNms, finalTorqueNm,
                durationMs, shutoffAtNs, blowsAfterShutoff, faults, verdict, reasons, direction, rejectedImpulses, null);
    }

    /** A tightening rundown without rejected impulses (built in code, or from before either existed). */
    public JointResult(JointProgram program, long startNs, long endNs, int blows, double[] peaksNm,
                       long[] peakTimesNs, double[] widthsMs, double[] impulsesNms, double finalTorqueNm,
                       double durationMs, long shutoffAtNs, int blowsAfterShutoff, int faults, Verdict verdict,
                       List<Reason> reasons) {
        this(program, startNs, endNs, blows, peaksNm, peakTimesNs, widthsMs, impulsesNms, finalTorqueNm,
                durationMs, shutoffAtNs, blowsAfterShutoff, faults, verdict, reasons, Direction.TIGHTEN, 0);
    }

    /** A result without rejected impulses. */
    public JointResult(JointProgram program, long startNs, long endNs, int blows, double[] peaksNm,
                       long[] peakTimesNs, double[] widthsMs, double[] impulsesNms, double finalTorqueNm,
                       double durationMs, long shutoffAtNs, int blowsAfterShutoff, int faults, Verdict verdict,
                       List<Reason> reasons, Direction direction) {
        this(program, startNs, endNs, blows, peaksNm, peakTimesNs, widthsMs, impulsesNms, finalTorqueNm,
                durationMs, shutoffAtNs, blowsAfterShutoff, faults, verdict, reasons, direction, 0);
    }

    /** True for a loosening (the tool in reverse). */
    public boolean loosening() {
        return direction == Direction.LOOSEN;
    }

    public boolean shutoffReached() {
        return shutoffAtNs != Long.MIN_VALUE;
    }

    /** Blows per minute over the span from first to last peak; 0 with fewer than two blows. */
    public double blowRatePerMin() {
        int n = peakTimesNs.length;
        if (n < 2) {
            return 0.0;
        }
        double spanS = (peakTimesNs[n - 1] - peakTimesNs[0]) * 1e-9;
        return spanS <= 0 ? 0.0 : (n - 1) * 60.0 / spanS;
    }
}
