package hammerstep.app;

import hammerstep.config.ConfigException;
import hammerstep.hardware.HardwareConfig;
import hammerstep.hardware.Sampler;
import hammerstep.hardware.TransducerSettings;
import hammerstep.hardware.pi4j.Pi4jHardware;
import hammerstep.signal.Calibration;
import hammerstep.station.StationClock;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

import java.util.Locale;
import java.util.concurrent.Callable;

/**
 * {@code hammerstep shunt-check}: switches the shunt resistor across one bridge arm and compares
 * the change in output with the bridge formula Vo/E = R / (2R + 4Rs).
 */
@Command(name = "shunt-check", mixinStandardHelpOptions = true,
        description = {"Checks the transducer and its measuring chain with the shunt resistor.",
                "Expected output by Vo/E = R / (2R + 4Rs), measured with the shunt switched in (hardware.outputs.shunt_cal).",
                "Exit 0 when the two agree within --tolerance-pct, 1 otherwise."})
public final class ShuntCheckCommand implements Callable<Integer> {

    @Mixin
    MeasureOptions measure;

    @Option(names = "--tolerance-pct", defaultValue = "0.5", paramLabel = "PCT",
            description = "accepted difference from the expected output, %% (default 0.5, common practice)")
    double tolerancePct;

    @Override
    public Integer call() throws ConfigException {
        HardwareConfig c = measure.begin();
        TransducerSettings t = c.transducer();
        if (!t.hasShunt()) {
            throw new UserError(measure.config() + ": transducer.shunt_ohm is not set (a bridge transducer with a shunt"
                    + " resistor is needed)");
        }
        double expectedMvPerV = t.shuntOutputMvPerV();
        double expectedNm = t.shuntTorqueNm();
        System.out.printf(Locale.ROOT, "expected: %s Ω across a %s Ω arm gives %.4f mV/V = %.2f N·m of %s N·m"
                        + " (Vo/E = R / (2R + 4Rs))%n", MeasureOptions.fmt(t.shuntOhm()), MeasureOptions.fmt(t.bridgeOhm()),
                expectedMvPerV, expectedNm, MeasureOptions.fmt(t.fullScaleNm()));
        if (c.hardware().shuntCal() == null) {
            System.out.println("no hardware.outputs.shunt_cal in the station file: switch the shunt in by hand and compare"
                    + " the reading with the figure above");
            return 0;
        }
        StationClock clock = measure.clock;
        try (Pi4jHardware hw = measure.openStarted(c)) {
            long ns = measure.readingNs();
            long settleNs = Math.max(50_000_000L, (long) (10e9 / hw.adc().rateHz()));
            hw.toolEnable().set(false);
            hw.shuntCal().set(false);
            Sampler.settle(hw.adc(), hw.dataReady(), clock, settleNs);
            Sampler.Reading off = Sampler.measure(hw.adc(), hw.dataReady(), clock, ns);
            hw.shuntCal().set(true);
            Sampler.Reading on;
            try {
                Sampler.settle(hw.adc(), hw.dataReady(), clock, settleNs);
                on = Sampler.measure(hw.adc(), hw.dataReady(), clock, ns);
            } finally {
                hw.shuntCal().set(false);
            }
            hw.adc().stop();
            return report(off, on, hw.calibration(), t, expectedMvPerV);
        }
    }

    private int report(Sampler.Reading off, Sampler.Reading on, Calibration cal, TransducerSettings t, double expectedMvPerV) {
        double deltaNm = (on.meanCounts() - off.meanCounts()) * cal.nmPerCount();
        double measuredMvPerV = deltaNm / t.fullScaleNm() * t.ratedOutput();
        double errPct = (measuredMvPerV - expectedMvPerV) / expectedMvPerV * 100;
        boolean ok = Math.abs(errPct) <= tolerancePct;
        System.out.printf(Locale.ROOT, "measured: %.4f mV/V = %.2f N·m (%s %%): %s ±%s %%%n", measuredMvPerV, deltaNm,
                signedPercent(errPct), ok ? "within" : "OUTSIDE", MeasureOptions.fmt(tolerancePct));
        if (!ok) {
            System.out.println("check the transducer's calibration certificate, the shunt resistor, the cable and the"
                    + " station file's rated output before use");
        }
        return ok ? 0 : 1;
    }

    /** A deviation with its sign and two decimals; one that rounds to zero reads {@code 0.00}, never {@code -0.00}. */
    static String signedPercent(double pct) {
        String s = String.format(Locale.ROOT, "%+.2f", pct);
        return s.equals("+0.00") || s.equals("-0.00") ? "0.00" : s;
    }
}
