package hammerstep.sim.physics;

/**
 * What the thread-torque relation needs of a bolt: pitch, pitch diameter and the mean diameter of the
 * nut's bearing face.
 *
 * <p>Pitch diameter {@code d₂ = d − 0.649519·P} (ISO 724, basic dimensions of ISO metric threads). Bearing
 * face: {@code D_km = (d_w + d_h)/2}, the mean of the bearing face's outer diameter {@code d_w} (the hex
 * nut's, ISO 4032 minimum) and the clearance hole {@code d_h} (ISO 273, medium series); both tables are
 * quoted from memory of those standards.
 *
 * @param diameterMm        nominal diameter d
 * @param pitchMm           pitch P
 * @param pitchDiameterMm   d₂
 * @param bearingDiameterMm D_km
 */
public record ThreadGeometry(double diameterMm, double pitchMm, double pitchDiameterMm, double bearingDiameterMm) {

    /** d, s (across flats), d_w (ISO 4032, min), d_h (ISO 273 medium), mm. From memory of the standards. */
    private static final double[][] HEX = {
            {6, 10, 8.9, 6.6}, {8, 13, 11.6, 9.0}, {10, 16, 14.6, 11.0}, {12, 18, 16.6, 13.5},
            {14, 21, 19.6, 15.5}, {16, 24, 22.5, 17.5}, {18, 27, 24.9, 20.0}, {20, 30, 27.7, 22.0},
            {22, 34, 31.4, 24.0}, {24, 36, 33.3, 26.0}, {27, 41, 38.0, 30.0}, {30, 46, 42.8, 33.0}};

    /** The geometry of an ISO metric thread of {@code diameterMm} and {@code pitchMm} with a standard hex nut; null for a size outside M6–M30. */
    public static ThreadGeometry of(double diameterMm, double pitchMm) {
        for (double[] row : HEX) {
            if (Math.abs(row[0] - diameterMm) < 1e-9 && pitchMm > 0) {
                return new ThreadGeometry(diameterMm, pitchMm, diameterMm - 0.649519 * pitchMm, 0.5 * (row[2] + row[3]));
            }
        }
        return null;
    }

    /** The geometry of a joint's bolt, or of its thread diameter at coarse pitch without one; null if unknown. */
    public static ThreadGeometry of(JointSpec joint) {
        Bolt bolt = joint.bolt();
        double d = bolt != null ? bolt.diameterMm() : Math.round(joint.diameterM() * 1e4) / 10.0;
        double p = bolt != null ? bolt.pitchMm() : Bolt.coarsePitchMm(d);
        return of(d, p);
    }

    /** Flank factor 1/(2·cos 30°) = 0.577 of the 60° ISO thread: the thread friction acts on d₂/2 through the flank. */
    public static final double FLANK = 1.0 / (2.0 * Math.cos(Math.toRadians(30)));

    /**
     * Torque to turn the nut at clamp load {@code clampN} with thread friction {@code muThread} and bearing-face
     * friction {@code muHead}, N·m: {@code T = F·(P/(2π) + μ_th·0.577·d₂ + μ_b·D_km/2)} (the thread-torque
     * relation as VDI 2230 Part 1 writes it, its terms as ISO 16047 defines thread and bearing torque;
     * quoted from memory). Loosening, the pitch term changes sign.
     */
    public double torqueNm(double clampN, double muThread, double muHead, boolean loosen) {
        double pitchTerm = pitchMm / (2.0 * Math.PI);
        return clampN * 1e-3 * ((loosen ? -pitchTerm : pitchTerm) + muThread * FLANK * pitchDiameterMm
                + muHead * 0.5 * bearingDiameterMm);
    }

    /** Nut factor K = T/(F·d) for these coefficients (tightening). */
    public double nutFactor(double muThread, double muHead) {
        return torqueNm(1.0, muThread, muHead, false) / (diameterMm * 1e-3);
    }
}
