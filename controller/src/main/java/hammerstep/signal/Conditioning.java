package hammerstep.signal;

/**
 * Settings of the {@link Conditioner}. A value of 0 (or NaN for a level) switches a check off.
 *
 * @param idleBandNm        the zero tracks only blocks whose samples spread less than this
 * @param zeroLimitNm       largest offset auto-zero may absorb; beyond it {@code ZERO_DRIFT} is raised
 * @param zeroTimeConstantMs time constant of the zero tracker
 * @param overRangeNm       |torque| at or above this raises {@code OVER_RANGE}
 * @param flatLineMs        an exactly constant signal this long raises {@code FLAT_LINE}
 * @param lowPassHz         cut-off of a 2nd-order Butterworth low-pass; 0 for none
 */
public record Conditioning(
        double idleBandNm,
        double zeroLimitNm,
        double zeroTimeConstantMs,
        double overRangeNm,
        double flatLineMs,
        double lowPassHz) {

    /** Replay of recorded N·m traces: auto-zero within ±2 N·m, no range or flat-line checks, no filter. */
    public static Conditioning forReplay(double idleBandNm) {
        return new Conditioning(idleBandNm, 2.0, 1000.0, Double.NaN, 0.0, 0.0);
    }

    public Conditioning withLowPass(double hz) {
        return new Conditioning(idleBandNm, zeroLimitNm, zeroTimeConstantMs, overRangeNm, flatLineMs, hz);
    }

    public Conditioning withOverRange(double nm) {
        return new Conditioning(idleBandNm, zeroLimitNm, zeroTimeConstantMs, nm, flatLineMs, lowPassHz);
    }

    public Conditioning withFlatLine(double ms) {
        return new Conditioning(idleBandNm, zeroLimitNm, zeroTimeConstantMs, overRangeNm, ms, lowPassHz);
    }

    public Conditioning withZeroLimit(double nm) {
        return new Conditioning(idleBandNm, nm, zeroTimeConstantMs, overRangeNm, flatLineMs, lowPassHz);
    }
}
