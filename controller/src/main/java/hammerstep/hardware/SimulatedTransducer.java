package hammerstep.hardware;

import hammerstep.signal.Calibration;

import java.util.function.BooleanSupplier;

/**
 * A transducer at rest on a simulated ADC, for {@code --hardware mock}: a zero offset, a little
 * seeded noise, the torque it is set to, and the shunt resistor's output while the shunt output is
 * energised. Counts come from the same {@link Calibration} the controller converts with, so a
 * simulated shunt check reads what the bridge formula expects.
 */
public final class SimulatedTransducer implements CountSource {

    private final double countsPerNm;
    private final double shuntCounts;
    private final int offsetCounts;
    private final int noiseCounts;
    private volatile double torqueNm;
    private volatile BooleanSupplier shunt = () -> false;
    private long seed;

    /**
     * @param offsetCounts the zero the transducer reads at rest
     * @param noiseCounts  peak-to-peak of uniform noise in counts (0 for none)
     */
    public SimulatedTransducer(Calibration calibration, TransducerSettings transducer, int offsetCounts,
                               int noiseCounts, long seed) {
        this.countsPerNm = 1 / calibration.nmPerCount();
        this.shuntCounts = transducer.hasShunt() ? transducer.shuntTorqueNm() * countsPerNm : 0;
        this.offsetCounts = offsetCounts;
        this.noiseCounts = noiseCounts;
        this.seed = seed;
    }

    public void torqueNm(double nm) {
        this.torqueNm = nm;
    }

    /** Where the simulation sees whether the shunt is switched in (the shunt output's state). */
    public void shunt(BooleanSupplier engaged) {
        this.shunt = engaged;
    }

    @Override
    public int nextCounts() {
        double counts = offsetCounts + torqueNm * countsPerNm;
        if (shunt.getAsBoolean()) {
            counts += shuntCounts;
        }
        if (noiseCounts > 0) {
            seed = seed * 6364136223846793005L + 1442695040888963407L;
            counts += (int) ((seed >>> 33) % (noiseCounts + 1)) - noiseCounts / 2;
        }
        return (int) Math.round(counts);
    }
}
