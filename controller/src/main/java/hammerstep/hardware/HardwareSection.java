package hammerstep.hardware;

import hammerstep.config.ConfigNode;
import hammerstep.config.MapReader;
import hammerstep.config.Problems;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads the station file's {@code hardware:} section: {@code adc}, {@code outputs}, {@code inputs}.
 * Pins are BCM GPIO numbers 2 to 27; a pin is used once; SPI0's pins (7 to 11) are not GPIO here.
 * A line is a pin number, or a map {@code { pin: 5, active: low }} (inputs also {@code pull},
 * {@code debounce_ms}). Outputs are active high by default; inputs active low with pull-up (a
 * contact to ground), the usual wiring of buttons and NPN sensors.
 */
public final class HardwareSection {

    static final int MIN_PIN = 2;
    static final int MAX_PIN = 27;
    private static final Map<Integer, String> SPI0 = Map.of(7, "SPI0 CE1", 8, "SPI0 CE0", 9, "SPI0 MISO",
            10, "SPI0 MOSI", 11, "SPI0 SCLK");
    static final double DEFAULT_DEBOUNCE_MS = 20.0;

    private final Problems problems;
    private final Map<Integer, String> used = new HashMap<>();

    private HardwareSection(Problems problems) {
        this.problems = problems;
    }

    /** Reads {@code hardware} (a required map) from the root of a station file; problems go to the reader's list. */
    public static HardwareSettings read(MapReader hardware) {
        return new HardwareSection(hardware.problems()).readAll(hardware);
    }

    private HardwareSettings readAll(MapReader hw) {
        AdcSettings adc = readAdc(hw.map("adc"));
        MapReader out = hw.map("outputs");
        OutputLine enable = output(out, "tool_enable", true);
        OutputLine shunt = output(out, "shunt_cal", false);
        Map<String, OutputLine> tower = new LinkedHashMap<>();
        MapReader towerMap = out.optionalMap("tower");
        if (towerMap != null) {
            for (String colour : HardwareSettings.TOWER) {
                OutputLine line = output(towerMap, colour, false);
                if (line != null) {
                    tower.put(colour, line);
                }
            }
            towerMap.finish();
        }
        List<OutputLine> positions = new ArrayList<>();
        List<ConfigNode> items = out.list("positions", true);
        if (items.isEmpty() && out.has("positions")) {
            out.problem("positions", "'" + out.path("positions") + "': expected at least one position lamp");
        }
        for (int i = 0; i < items.size(); i++) {
            OutputLine line = outputLine(items.get(i), out.path("positions") + "[" + i + "]");
            if (line != null) {
                positions.add(line);
            }
        }
        out.finish();
        MapReader in = hw.map("inputs");
        InputLine ack = input(in, "acknowledge", true);
        InputLine key = input(in, "supervisor_key", true);
        InputLine present = input(in, "part_present", false);
        InputLine trigger = input(in, "trigger", false);
        List<InputLine> confirm = new ArrayList<>();
        List<ConfigNode> sensors = in.list("confirm", false);
        for (int i = 0; i < sensors.size(); i++) {
            InputLine line = inputLine(sensors.get(i), in.path("confirm") + "[" + i + "]");
            if (line != null) {
                confirm.add(line);
            }
        }
        if (!confirm.isEmpty() && confirm.size() != positions.size()) {
            in.problem("confirm", "'" + in.path("confirm") + "' has " + confirm.size() + " sensors for "
                    + positions.size() + " position lamps: fit one per position, or none");
        }
        in.finish();
        hw.finish();
        return new HardwareSettings(adc, enable, shunt, tower, positions, ack, key, present, trigger, confirm);
    }

    private AdcSettings readAdc(MapReader adc) {
        AdcSettings.Type type = null;
        if (!adc.has("type")) {
            adc.problem("type", "missing key '" + adc.path("type") + "': expected one of ads1256, mcp3208");
        } else {
            String t = adc.choice("type", "", List.of("ads1256", "mcp3208"));
            type = t.equals("ads1256") ? AdcSettings.Type.ADS1256 : t.equals("mcp3208") ? AdcSettings.Type.MCP3208 : null;
        }
        int bus = adc.integer("spi_bus", 0, 0, 6);
        int ce = adc.integer("spi_chip_select", 0, 0, 2);
        boolean ads = type == AdcSettings.Type.ADS1256;
        int clock = adc.integer("spi_clock_hz", ads ? 1_920_000 : 1_000_000, 10_000, 20_000_000);
        int cs = pin(adc, "cs_pin", ads);
        int drdy = pin(adc, "data_ready_pin", ads);
        int reset = pin(adc, "reset_pin", false);
        int positive = adc.integer("input_positive", 0, 0, ads ? Ads1256.AINCOM : 7);
        int negative = -1;
        double gain;
        double rate;
        double vref;
        boolean buffer = adc.bool("buffer", true);
        if (ads) {
            negative = adc.integer("input_negative", 1, 0, Ads1256.AINCOM);
            if (positive == negative && adc.has("input_negative")) {
                adc.problem("input_negative", "'" + adc.path("input_negative") + "' is the positive input too: "
                        + "wire the bridge output to two different inputs");
            }
            gain = adc.requiredNumber("gain", 0, Double.MAX_VALUE);
            if (!Double.isNaN(gain) && Arrays.stream(Ads1256.GAINS).noneMatch(g -> g == gain)) {
                adc.problem("gain", "'" + adc.path("gain") + "' is " + fmt(gain) + ": the ADS1256 PGA takes 1, 2, 4, 8, 16, 32 or 64");
            }
            rate = adc.requiredNumber("rate_hz", 0, Double.MAX_VALUE);
            if (!Double.isNaN(rate) && Arrays.stream(Ads1256.RATES_HZ).noneMatch(r -> r == rate)) {
                adc.problem("rate_hz", "'" + adc.path("rate_hz") + "' is " + fmt(rate) + ": the ADS1256 runs at 30000, 15000,"
                        + " 7500, 3750, 2000, 1000, 500, 100, 60, 50, 30, 25, 15, 10, 5 or 2.5 Hz");
            }
            vref = adc.requiredNumber("reference_v", 0.5, 2.6);
        } else {
            if (adc.has("input_negative")) {
                adc.problem("input_negative", "'" + adc.path("input_negative") + "': the MCP3208 is read single-ended; remove the key");
            }
            if (drdy >= 0) {
                adc.problem("data_ready_pin", "'" + adc.path("data_ready_pin") + "': the MCP3208 has no data-ready line; remove the key");
            }
            gain = adc.requiredNumber("gain", 0.01, 1.0);
            rate = adc.requiredNumber("rate_hz", 100, 100_000);
            vref = adc.requiredNumber("reference_v", 0.25, 5.5);
        }
        int block = adc.integer("block_samples", 256, 16, 8192);
        adc.finish();
        if (type == null) {
            return null;
        }
        return new AdcSettings(type, bus, ce, clock, cs, drdy, reset, positive, negative, gain, rate, vref, buffer, block);
    }

    private int pin(MapReader m, String key, boolean required) {
        if (!required && !m.has(key)) {
            return -1;
        }
        if (required && !m.has(key)) {
            m.problem(key, "missing key '" + m.path(key) + "': expected a BCM pin number " + MIN_PIN + " to " + MAX_PIN);
            return -1;
        }
        int pin = m.integer(key, MIN_PIN, MAX_PIN);
        claim(m.child(key), m.path(key), pin);
        return pin;
    }

    private void claim(ConfigNode at, String name, int pin) {
        if (at.kind() != ConfigNode.Kind.NUMBER || !at.text().equals(Integer.toString(pin))) {
            return; // the pin was already reported as invalid: its stand-in value claims nothing
        }
        String spi = SPI0.get(pin);
        if (spi != null) {
            problems.add(at, "'" + name + "' is pin " + pin + ", which is " + spi + ": choose another pin");
            return;
        }
        String before = used.putIfAbsent(pin, name);
        if (before != null) {
            problems.add(at, "'" + name + "' is pin " + pin + ", already used by '" + before + "'");
        }
    }

    private OutputLine output(MapReader m, String key, boolean required) {
        ConfigNode n = m.child(key);
        if (n == null || n.kind() == ConfigNode.Kind.NULL) {
            if (required) {
                m.problem(key, "missing key '" + m.path(key) + "': expected a pin number or { pin: N, active: high|low }");
            }
            return null;
        }
        return outputLine(n, m.path(key));
    }

    private OutputLine outputLine(ConfigNode n, String name) {
        if (n.kind() == ConfigNode.Kind.NUMBER) {
            int pin = barePin(n, name);
            return pin < 0 ? null : new OutputLine(name, pin, true);
        }
        MapReader m = MapReader.of(problems, n);
        int pin = m.integer("pin", MIN_PIN, MAX_PIN);
        claim(m.child("pin") == null ? n : m.child("pin"), name, pin);
        boolean high = m.choice("active", "high", List.of("high", "low")).equals("high");
        m.finish();
        return new OutputLine(name, pin, high);
    }

    private InputLine input(MapReader m, String key, boolean required) {
        ConfigNode n = m.child(key);
        if (n == null || n.kind() == ConfigNode.Kind.NULL) {
            if (required) {
                m.problem(key, "missing key '" + m.path(key) + "': expected a pin number or { pin: N, active: high|low }");
            }
            return null;
        }
        return inputLine(n, m.path(key));
    }

    private InputLine inputLine(ConfigNode n, String name) {
        if (n.kind() == ConfigNode.Kind.NUMBER) {
            int pin = barePin(n, name);
            return pin < 0 ? null : new InputLine(name, pin, false, InputLine.Pull.UP, DEFAULT_DEBOUNCE_MS);
        }
        MapReader m = MapReader.of(problems, n);
        int pin = m.integer("pin", MIN_PIN, MAX_PIN);
        claim(m.child("pin") == null ? n : m.child("pin"), name, pin);
        boolean high = m.choice("active", "low", List.of("high", "low")).equals("high");
        String pull = m.choice("pull", high ? "down" : "up", List.of("up", "down", "none"));
        double debounce = m.number("debounce_ms", DEFAULT_DEBOUNCE_MS, 0, 1000);
        m.finish();
        InputLine.Pull p = switch (pull) {
            case "up" -> InputLine.Pull.UP;
            case "down" -> InputLine.Pull.DOWN;
            default -> InputLine.Pull.NONE;
        };
        return new InputLine(name, pin, high, p, debounce);
    }

    private int barePin(ConfigNode n, String name) {
        int pin;
        try {
            pin = Integer.parseInt(n.text());
        } catch (NumberFormatException e) {
            problems.add(n, "'" + name + "': expected a whole number, got " + n.describe());
            return -1;
        }
        if (pin < MIN_PIN || pin > MAX_PIN) {
            problems.add(n, "'" + name + "' is " + pin + ": expected a BCM pin number " + MIN_PIN + " to " + MAX_PIN);
            return -1;
        }
        claim(n, name, pin);
        return pin;
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
