package hammerstep.hardware;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.MapReader;
import hammerstep.config.Problems;
import hammerstep.config.YamlDocument;

import java.nio.file.Path;

/**
 * The station file's {@code hardware:} and {@code transducer:} sections, read together so that
 * what only makes sense together is checked: a bridge transducer needs the ADS1256, an amplified one
 * the MCP3208, and the transducer's full-scale signal must fit the ADC's input range. Other sections
 * of the station file are left to their own readers.
 */
public record HardwareConfig(HardwareSettings hardware, TransducerSettings transducer) {

    public static HardwareConfig load(Path file) throws ConfigException {
        return read(YamlDocument.read(file));
    }

    public static HardwareConfig read(YamlDocument doc) throws ConfigException {
        Problems problems = new Problems(doc.file());
        MapReader root = MapReader.of(problems, doc.root());
        HardwareSettings hw = HardwareSection.read(root.map("hardware"));
        ConfigNode tdNode = root.child("transducer");
        MapReader td = root.map("transducer");
        TransducerSettings t = TransducerSection.read(td);
        if (problems.isEmpty()) {
            String mismatch = mismatch(hw.adc(), t);
            if (mismatch != null) {
                ConfigNode at = td.child("output") != null ? td.child("output") : tdNode;
                problems.add(at, mismatch);
            }
        }
        problems.throwIfAny();
        return new HardwareConfig(hw, t);
    }

    /** Why this transducer cannot be read by this ADC, or null when it can. */
    static String mismatch(AdcSettings adc, TransducerSettings t) {
        if (t.output() == TransducerSettings.Output.BRIDGE && adc.type() != AdcSettings.Type.ADS1256) {
            return "a bridge transducer (mV/V) needs the ADS1256 bridge ADC; hardware.adc.type is " + adc.type().key()
                    + " (for an amplified output write 'output: voltage' and 'rated_output_v')";
        }
        if (t.output() == TransducerSettings.Output.VOLTAGE && adc.type() != AdcSettings.Type.MCP3208) {
            return "an amplified transducer output (V) is read by the MCP3208; hardware.adc.type is " + adc.type().key();
        }
        double fullScaleV = t.output() == TransducerSettings.Output.BRIDGE
                ? t.ratedOutput() * 1e-3 * t.excitationV() * adc.gain()
                : t.ratedOutput() * adc.gain();
        double rangeV = adc.fullScaleInputV();
        if (fullScaleV > rangeV) {
            return String.format(java.util.Locale.ROOT, "at full-scale torque the ADC sees %.4g V (after gain %s), beyond its"
                    + " input range of ±%.4g V: lower hardware.adc.gain", fullScaleV, fmt(adc.gain()), rangeV);
        }
        return null;
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
