package hammerstep.signal;

/**
 * Settings of the {@link Conditioner}. A value of 0 (or NaN for a level) switches a check off.
 *
 * @param idleBandNm        a block counts as quiet (the zero may follow it) when none of its samples
 *                          lies further than this from the block's mean
 * @param zeroLimitNm       largest offset auto-zero may absorb; beyond it {@code ZERO_DRIFT} is raised
 * @param zeroTimeConstantMs time constant of the zero tracker
 * @param overRangeNm       |torque| at or above this raises {@code OVER_RANGE}
 * @param flatLineMs        an exactly constant signal this long raises {@code FLAT_LINE}
 * @param lowPassHz         cut-off of a 2nd-order Butterworth low-pass; 0 for none
 * @param impulseNm         an excursion at least this far from its neighbours' course, shorter than any
 *                          strike, is an electrical impulse and is replaced (see {@link ImpulseRejector});
 *                          the same level arms the flat-top (clipping) check. 0 switches both off
 * @param mainsHz           the mains frequency (50 or 60 Hz) whose hum and harmonics are learned in idle and
 *                          subtracted (see {@link HumCanceller}); 0 for none
 */
public record Conditioning(
        double idleBandNm,
        double zeroLimitNm,
        double zeroTimeConstantMs,
        double overRangeNm,
        double flatLineMs,
        double lowPassHz,
        double impulseNm,
        double mainsHz) {

    /** Impulse level, as a fraction of the transducer's range, where the range is known. */
    public static final double IMPULSE_FRACTION_OF_RANGE = 0.025;
    /** Impulse level where the range is unknown (a bare CSV), N·m. */
    public static final double IMPULSE_NM_UNKNOWN_RANGE = 25.0;
    /** Zero limit, as a fraction of the transducer's range, where the range is known. */
    public static final double ZERO_FRACTION_OF_RANGE = 0.02;
    /** Zero limit where the range is unknown (a bare CSV), N·m. */
    public static final double ZERO_NM_UNKNOWN_RANGE = 10.0;

    /** Without hum cancelling. */
    public Conditioning(double idleBandNm, double zeroLimitNm, double zeroTimeConstantMs, double overRangeNm,
                        double flatLineMs, double lowPassHz, double impulseNm) {
        this(idleBandNm, zeroLimitNm, zeroTimeConstantMs, overRangeNm, flatLineMs, lowPassHz, impulseNm, 0.0);
    }

    /** Without impulse rejection and flat-top check: the conditioning as it was before either existed. */
    public Conditioning(double idleBandNm, double zeroLimitNm, double zeroTimeConstantMs, double overRangeNm,
                        double flatLineMs, double lowPassHz) {
        this(idleBandNm, zeroLimitNm, zeroTimeConstantMs, overRangeNm, flatLineMs, lowPassHz, 0.0, 0.0);
    }

    /**
     * Replay of recorded N·m traces whose range is unknown: auto-zero within ±10 N·m, impulses of
     * 25 N·m and more rejected, no range or flat-line checks, no filter. {@link #withRange} sets
     * what a known range implies.
     */
    public static Conditioning forReplay(double idleBandNm) {
        return new Conditioning(idleBandNm, ZERO_NM_UNKNOWN_RANGE, 1000.0, Double.NaN, 0.0, 0.0,
                IMPULSE_NM_UNKNOWN_RANGE);
    }

    /**
     * What a transducer's range implies: over-range at the range, zero limit at 2 % of it, impulse
     * level at 2.5 % of it. A range that is NaN or not positive changes nothing.
     */
    public Conditioning withRange(double rangeNm) {
        if (!(rangeNm > 0) || Double.isInfinite(rangeNm)) {
            return this;
        }
        return new Conditioning(idleBandNm, ZERO_FRACTION_OF_RANGE * rangeNm, zeroTimeConstantMs, rangeNm,
                flatLineMs, lowPassHz, impulseNm > 0 ? IMPULSE_FRACTION_OF_RANGE * rangeNm : 0.0, mainsHz);
    }

    public Conditioning withLowPass(double hz) {
        return new Conditioning(idleBandNm, zeroLimitNm, zeroTimeConstantMs, overRangeNm, flatLineMs,
                hz, impulseNm, mainsHz);
    }

    public Conditioning withOverRange(double nm) {
        return new Conditioning(idleBandNm, zeroLimitNm, zeroTimeConstantMs, nm, flatLineMs,
                lowPassHz, impulseNm, mainsHz);
    }

    public Conditioning withFlatLine(double ms) {
        return new Conditioning(idleBandNm, zeroLimitNm, zeroTimeConstantMs, overRangeNm, ms,
                lowPassHz, impulseNm, mainsHz);
    }

    public Conditioning withZeroLimit(double nm) {
        return new Conditioning(idleBandNm, nm, zeroTimeConstantMs, overRangeNm, flatLineMs,
                lowPassHz, impulseNm, mainsHz);
    }

    public Conditioning withImpulse(double nm) {
        return new Conditioning(idleBandNm, zeroLimitNm, zeroTimeConstantMs, overRangeNm, flatLineMs,
                lowPassHz, nm, mainsHz);
    }

    /** Hum of {@code hz} (50 or 60) and its harmonics cancelled; 0 for none. */
    public Conditioning withMains(double hz) {
        return new Conditioning(idleBandNm, zeroLimitNm, zeroTimeConstantMs, overRangeNm, flatLineMs, lowPassHz,
                impulseNm, hz);
    }
}
