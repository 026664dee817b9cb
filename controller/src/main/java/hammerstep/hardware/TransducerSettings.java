package hammerstep.hardware;

import hammerstep.signal.Calibration;

import java.time.LocalDate;

/**
 * The torque transducer as the station file's {@code transducer:} section describes it, from its
 * calibration certificate.
 *
 * @param serial             serial number as on the certificate
 * @param output             a bare strain-gauge bridge (mV/V) or an amplified voltage output
 * @param ratedOutput        bridge: rated output in mV/V; voltage: volts at full-scale torque
 * @param fullScaleNm        rated torque
 * @param excitationV        bridge excitation (bridge output only)
 * @param bridgeOhm          resistance of one bridge arm (bridge output only)
 * @param shuntOhm           shunt calibration resistor, or NaN when none is fitted
 * @param calibrationDue     date by which the transducer must be recalibrated
 * @param zeroCounts         zero captured with {@code hammerstep zero}, in ADC counts (0 when not captured)
 */
public record TransducerSettings(
        String serial,
        Output output,
        double ratedOutput,
        double fullScaleNm,
        double excitationV,
        double bridgeOhm,
        double shuntOhm,
        LocalDate calibrationDue,
        int zeroCounts) {

    public enum Output { BRIDGE, VOLTAGE }

    /** The counts-to-N·m figures of this transducer on {@code adc}. */
    public Calibration calibration(AdcDriver adc) {
        return calibration(adc.fullScaleInputV(), adc.gain(), adc.bits());
    }

    /**
     * The counts-to-N·m figures for an ADC whose full positive code stands for {@code fullScaleInputV}
     * at gain 1. An amplified output is mapped onto the bridge formula with an excitation of 1 V, so that
     * its rated output in volts reads as mV/V × 1000.
     */
    public Calibration calibration(double fullScaleInputV, double gain, int bits) {
        if (output == Output.BRIDGE) {
            return new Calibration(ratedOutput, fullScaleNm, gain, excitationV, fullScaleInputV, bits);
        }
        return new Calibration(ratedOutput * 1000, fullScaleNm, gain, 1.0, fullScaleInputV, bits);
    }

    public boolean hasShunt() {
        return output == Output.BRIDGE && shuntOhm > 0;
    }

    /** Bridge output the shunt produces, mV/V (Vo/E = R / (2R + 4Rs)). */
    public double shuntOutputMvPerV() {
        return Calibration.shuntOutputMvPerV(bridgeOhm, shuntOhm);
    }

    /** Torque the shunt should read. */
    public double shuntTorqueNm() {
        return shuntOutputMvPerV() / ratedOutput * fullScaleNm;
    }

    /** True when the calibration is due on or before {@code today}. */
    public boolean calibrationDue(LocalDate today) {
        return !today.isBefore(calibrationDue);
    }
}
