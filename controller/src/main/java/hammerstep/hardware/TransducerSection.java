package hammerstep.hardware;

import hammerstep.config.ConfigNode;
import hammerstep.config.MapReader;

import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.List;

/**
 * Reads the station file's {@code transducer:} section. A bridge transducer gives
 * {@code rated_output_mv_per_v}, {@code excitation_v}, {@code bridge_ohm} and optionally
 * {@code shunt_ohm}; an amplified one gives {@code rated_output_v}. Both give {@code serial},
 * {@code full_scale_nm} and {@code calibration_due} (YYYY-MM-DD).
 */
public final class TransducerSection {

    private TransducerSection() {
    }

    public static TransducerSettings read(MapReader t) {
        String serial = t.string("serial");
        if (t.has("serial") && serial.isBlank()) {
            t.problem("serial", "'" + t.path("serial") + "': expected the serial number from the calibration certificate");
        }
        String kind = t.choice("output", "bridge", List.of("bridge", "voltage"));
        TransducerSettings.Output output = kind.equals("voltage") ? TransducerSettings.Output.VOLTAGE
                : TransducerSettings.Output.BRIDGE;
        double fullScale = t.requiredNumber("full_scale_nm", 0.1, 100_000);
        double rated;
        double excitation = Double.NaN;
        double arm = Double.NaN;
        double shunt = Double.NaN;
        if (output == TransducerSettings.Output.BRIDGE) {
            rated = t.requiredNumber("rated_output_mv_per_v", 0.1, 10);
            excitation = t.number("excitation_v", 5.0, 1.0, 12.0);
            arm = t.number("bridge_ohm", 350.0, 50, 10_000);
            shunt = t.number("shunt_ohm", Double.NaN, 1_000, 10_000_000);
        } else {
            rated = t.requiredNumber("rated_output_v", 0.5, 10);
            for (String key : List.of("rated_output_mv_per_v", "excitation_v", "bridge_ohm", "shunt_ohm")) {
                if (t.has(key)) {
                    t.problem(key, "'" + t.path(key) + "' belongs to a bridge transducer: with output: voltage remove it");
                }
            }
        }
        LocalDate due = date(t, "calibration_due");
        int zero = t.integer("zero_counts", 0, -8_388_608, 8_388_607);
        t.finish();
        return new TransducerSettings(serial, output, rated, fullScale, excitation, arm, shunt, due, zero);
    }

    private static LocalDate date(MapReader t, String key) {
        ConfigNode n = t.child(key);
        if (n == null || n.kind() == ConfigNode.Kind.NULL) {
            t.problem(key, "missing key '" + t.path(key) + "': expected the date the calibration is due, as YYYY-MM-DD");
            return LocalDate.MIN;
        }
        try {
            return LocalDate.parse(n.text());
        } catch (DateTimeParseException e) {
            t.problem(key, "'" + t.path(key) + "' is " + n.describe() + ": expected a date as YYYY-MM-DD");
            return LocalDate.MIN;
        }
    }
}
