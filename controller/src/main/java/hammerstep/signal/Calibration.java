package hammerstep.signal;

/**
 * The transducer and ADC figures that turn ADC counts into torque. A strain-gauge bridge gives
 * r = V / (G · Vexc) volts per volt for an ADC voltage V = counts · Vref / 2^(N−1); torque is
 * r / S · full scale, with S the rated output. With a ratiometric ADC (Vref = Vexc) the excitation
 * cancels.
 *
 * @param ratedOutputMvPerV bridge output at full-scale torque, mV/V
 * @param fullScaleNm       the transducer's rated torque
 * @param gain              amplifier (PGA) gain in front of the ADC
 * @param excitationV       bridge excitation voltage
 * @param referenceV        ADC reference voltage (equal to excitation when ratiometric)
 * @param adcBits           ADC resolution including the sign bit (bipolar input)
 */
public record Calibration(
        double ratedOutputMvPerV,
        double fullScaleNm,
        double gain,
        double excitationV,
        double referenceV,
        int adcBits) {

    public Calibration {
        if (!(ratedOutputMvPerV > 0) || !(fullScaleNm > 0) || !(gain > 0) || !(excitationV > 0) || !(referenceV > 0)) {
            throw new IllegalArgumentException("calibration figures must be positive");
        }
        if (adcBits < 8 || adcBits > 32) {
            throw new IllegalArgumentException("adcBits must be 8 to 32, was " + adcBits);
        }
    }

    /** Volts at the ADC input per count. */
    public double voltsPerCount() {
        return referenceV / Math.scalb(1.0, adcBits - 1);
    }

    /** N·m per ADC count. */
    public double nmPerCount() {
        double bridgeVoltsPerVolt = voltsPerCount() / (gain * excitationV);
        return bridgeVoltsPerVolt / (ratedOutputMvPerV * 1e-3) * fullScaleNm;
    }

    /** Counts the ADC reads at full-scale torque. */
    public double countsAtFullScale() {
        return fullScaleNm / nmPerCount();
    }

    /** Largest positive count the ADC can return (its rail). */
    public int maxCount() {
        return (int) (Math.scalb(1.0, adcBits - 1) - 1);
    }

    /**
     * Converts counts to N·m: {@code out[outOffset + i] = (counts[offset + i] - zeroCounts) · nmPerCount}.
     * Allocation-free.
     */
    public void toTorque(int[] counts, int offset, int length, int zeroCounts, float[] out, int outOffset) {
        float k = (float) nmPerCount();
        for (int i = 0; i < length; i++) {
            out[outOffset + i] = (counts[offset + i] - zeroCounts) * k;
        }
    }

    /**
     * Bridge output produced by a shunt resistor across one arm of a full bridge of equal arms:
     * Vo/E = R / (2R + 4Rs), in mV/V.
     */
    public static double shuntOutputMvPerV(double armOhm, double shuntOhm) {
        return armOhm / (2 * armOhm + 4 * shuntOhm) * 1e3;
    }

    /** Torque that a shunt calibration should read on this transducer. */
    public double shuntTorqueNm(double armOhm, double shuntOhm) {
        return shuntOutputMvPerV(armOhm, shuntOhm) / ratedOutputMvPerV * fullScaleNm;
    }
}
