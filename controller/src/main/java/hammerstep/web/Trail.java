package hammerstep.web;

/**
 * A copy of the rundown under way (or the last one) as the live page draws it: torque decimated to
 * one point per {@code pointMs} (the point of largest magnitude in its interval, so no blow's peak
 * is lost), and each blow's peak.
 *
 * @param generation   which rundown: grows by one at each rundown's start (0: none yet)
 * @param torqueNm     torque from the rundown's start, one point per {@code pointMs}
 * @param blowMs       each blow's peak time, ms from the rundown's start
 * @param blowNm       each blow's peak torque
 * @param running      true while the rundown is under way
 */
public record Trail(long generation, double pointMs, float[] torqueNm, float[] blowMs, float[] blowNm,
                    boolean running) {
}
