package hammerstep.sim.physics;

import java.util.SplittableRandom;

/**
 * The measuring chain: a 2nd-order Butterworth low-pass at the transducer's bandwidth, run at the
 * simulator's internal rate on the shaft torque; then, at each ADC sample, gain error, offset and
 * white noise, quantisation to the ADC's steps and clipping at its range. Allocation-free.
 */
final class Transducer {

    private final TransducerSpec spec;
    private final SplittableRandom random;
    private final double b0, b1, b2, a1, a2;
    private final double lsb;
    private final long maxCount;
    private double z1, z2;
    private double y;

    Transducer(TransducerSpec spec, double internalRateHz, SplittableRandom random) {
        this.spec = spec;
        this.random = random;
        double kk = Math.tan(Math.PI * spec.bandwidthHz() / internalRateHz);
        double q = Math.sqrt(0.5);
        double norm = 1.0 / (1.0 + kk / q + kk * kk);
        b0 = kk * kk * norm;
        b1 = 2.0 * b0;
        b2 = b0;
        a1 = 2.0 * (kk * kk - 1.0) * norm;
        a2 = (1.0 - kk / q + kk * kk) * norm;
        lsb = spec.lsbNm();
        maxCount = (1L << (spec.adcBits() - 1)) - 1;
    }

    /** One internal step of the shaft torque through the transducer's response. */
    void filter(double shaftNm) {
        double out = b0 * shaftNm + z1;
        z1 = b1 * shaftNm - a1 * out + z2;
        z2 = b2 * shaftNm - a2 * out;
        y = out;
    }

    /** The ADC reading now, converted to N·m at the nominal sensitivity. */
    float sample() {
        double v = y * (1.0 + spec.gainError()) + spec.offsetNm();
        if (spec.noiseNmRms() > 0) {
            v += spec.noiseNmRms() * random.nextGaussian();
        }
        long counts = Math.round(v / lsb);
        if (counts > maxCount) {
            counts = maxCount;
        } else if (counts < -maxCount - 1) {
            counts = -maxCount - 1;
        }
        return (float) (counts * lsb);
    }

    TransducerSpec spec() {
        return spec;
    }
}
