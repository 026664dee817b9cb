package hammerstep.sim.physics;

/**
 * Inline rotary torque transducer and its ADC. The shaft's compliance joins the tool's train; its
 * response is a 2nd-order low-pass at {@code bandwidthHz}; then noise, offset and gain error, and
 * the ADC quantises to {@code adcBits} over ±{@code adcRangeNm} and clips beyond it.
 *
 * @param name             preset name or file
 * @param ratedTorqueNm    rated (full-scale) torque
 * @param shaftStiffness   N·m/rad
 * @param inertiaKgM2      shaft and flanges (lumped with the train)
 * @param bandwidthHz      -3 dB of the measuring chain
 * @param noiseNmRms       white noise at the ADC input, in N·m
 * @param offsetNm         zero offset
 * @param gainError        relative error of the sensitivity (0.002 reads 0.2 % high)
 * @param adcBits          ADC resolution (signed)
 * @param adcRangeNm       torque at the ADC's full scale: beyond it the reading clips
 */
public record TransducerSpec(String name, double ratedTorqueNm, double shaftStiffness, double inertiaKgM2,
                             double bandwidthHz, double noiseNmRms, double offsetNm, double gainError,
                             int adcBits, double adcRangeNm) {

    /** One ADC step in N·m. */
    public double lsbNm() {
        return adcRangeNm / (1L << (adcBits - 1));
    }
}
