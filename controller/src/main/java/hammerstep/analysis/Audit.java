package hammerstep.analysis;

import java.util.Locale;

/**
 * One residual-torque audit reading entered by the engineer: which joint (by the joint message's
 * id, or by part serial and position), how it was measured, and the residual torque.
 *
 * @param line the line of the audit file, for messages
 */
public record Audit(int line, String jointId, String partSerial, String position, Method method, double residualNm) {

    /** How residual torque was measured (Bickford & Nassar's audit methods; memory of the handbook's chapter). */
    public enum Method {
        /** Torque at which the fastener first moves on in the tightening direction. */
        FIRST_MOVEMENT,
        /** Torque at which a fastener breaks loose in the loosening direction. */
        BREAKAWAY,
        /** Torque to bring a marked fastener, loosened, back to its mark. */
        MARK_RETURN;

        public String key() {
            return name().toLowerCase(Locale.ROOT);
        }

        public static Method ofKey(String key) {
            for (Method m : values()) {
                if (m.key().equals(key)) {
                    return m;
                }
            }
            return null;
        }
    }
}
