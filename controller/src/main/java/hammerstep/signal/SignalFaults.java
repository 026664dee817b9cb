package hammerstep.signal;

import java.util.ArrayList;
import java.util.List;

/** Bits for faults of the torque signal, as carried in an {@code int}. */
public final class SignalFaults {

    /** A sample reached the transducer's rated range (or the ADC's rail). */
    public static final int OVER_RANGE = 1;
    /** The signal stayed exactly constant for the flat-line time: open wire or dead channel. */
    public static final int FLAT_LINE = 1 << 1;
    /** The zero offset wandered past its limit; it is reported, not absorbed. */
    public static final int ZERO_DRIFT = 1 << 2;
    /** A sample was NaN or infinite. */
    public static final int NOT_FINITE = 1 << 3;
    /**
     * Three pulses of a rundown had main lobes far narrower than any strike (strike pulses last
     * about 1 to 5 ms; memory of transducer practice), each following the one before faster than
     * any tool strikes: electrical noise, not blows.
     */
    public static final int NOISE = 1 << 4;
    /**
     * Mains hum (50 or 60 Hz) of {@value Conditioner#HUM_FAULT_NM} N·m or more in the idle while no
     * mains frequency is named, so nothing removes it: it would move every peak by as much.
     */
    public static final int HUM = 1 << 5;
    /**
     * Samples of a rundown are missing: a block the station thread could not take in time (sample
     * ring full), conversions the ADC made and nobody read, or a block that does not start where
     * the one before ended. Set by the input stage ({@code hammerstep.joint.InputStage}), not by
     * the conditioner; outside a rundown a gap is only counted. (Bit 8 leaves room below for
     * further conditioner faults.)
     */
    public static final int DATA_GAP = 1 << 8;

    private SignalFaults() {
    }

    /** Names of the set bits, e.g. {@code [OVER_RANGE, FLAT_LINE]}. Allocates: not for the sample path. */
    public static List<String> names(int faults) {
        List<String> names = new ArrayList<>(4);
        if ((faults & OVER_RANGE) != 0) {
            names.add("OVER_RANGE");
        }
        if ((faults & FLAT_LINE) != 0) {
            names.add("FLAT_LINE");
        }
        if ((faults & ZERO_DRIFT) != 0) {
            names.add("ZERO_DRIFT");
        }
        if ((faults & NOT_FINITE) != 0) {
            names.add("NOT_FINITE");
        }
        if ((faults & NOISE) != 0) {
            names.add("NOISE");
        }
        if ((faults & HUM) != 0) {
            names.add("HUM");
        }
        if ((faults & DATA_GAP) != 0) {
            names.add("DATA_GAP");
        }
        return names;
    }
}
