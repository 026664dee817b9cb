package hammerstep.hardware.pi4j;

import hammerstep.hardware.AdcDriver;
import hammerstep.hardware.AdcSettings;
import hammerstep.hardware.Ads1256;
import hammerstep.hardware.DataReady;
import hammerstep.hardware.DigitalIn;
import hammerstep.hardware.DigitalOut;
import hammerstep.hardware.GpioLamps;
import hammerstep.hardware.GpioOperatorInputs;
import hammerstep.hardware.HardwareSettings;
import hammerstep.hardware.InputLine;
import hammerstep.hardware.LineDataReady;
import hammerstep.hardware.Mcp3208;
import hammerstep.hardware.OutputLine;
import hammerstep.hardware.PacedDataReady;
import hammerstep.hardware.RelayToolEnable;
import hammerstep.hardware.SimulatedAds1256;
import hammerstep.hardware.SimulatedMcp3208;
import hammerstep.hardware.SimulatedPart;
import hammerstep.hardware.SimulatedTransducer;
import hammerstep.hardware.TransducerSettings;
import hammerstep.signal.Calibration;
import hammerstep.station.StationClock;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The station's hardware as the station file wires it, on Pi4J: the ADC with its data-ready, the
 * lamps, the tool enable relay, the shunt output and the operator inputs. {@link Mode#GPIO} opens
 * the Raspberry Pi's GPIO (gpiod) and SPI (spidev via linuxfs); {@link Mode#MOCK} opens Pi4J's mock
 * GPIO and a simulated ADC of the configured type, with a transducer at rest. No Pi4J type is part
 * of this class's interface. Closing drops the relay and switches every output off.
 */
public final class Pi4jHardware implements AutoCloseable {

    public enum Mode { GPIO, MOCK }

    /** Zero offset and noise of the simulated transducer in mock mode, in counts. */
    static final int MOCK_OFFSET_COUNTS = 1200;
    static final int MOCK_NOISE_COUNTS = 40;

    private final Pi4jBoard board;
    private final AdcDriver adc;
    private final DataReady dataReady;
    private final Calibration calibration;
    private final RelayToolEnable toolEnable;
    private final DigitalOut shuntCal;
    private final GpioLamps lamps;
    private final GpioOperatorInputs inputs;
    private final List<DigitalOut> outputs = new ArrayList<>();
    private final SimulatedTransducer simulated;

    private Pi4jHardware(Pi4jBoard board, HardwareSettings hw, TransducerSettings td, StationClock clock,
                         SimulatedTransducer simulated) {
        this.board = board;
        this.simulated = simulated;
        AdcSettings a = hw.adc();
        try {
            this.toolEnable = new RelayToolEnable(out(hw.toolEnable()));
            this.shuntCal = hw.shuntCal() == null ? null : out(hw.shuntCal());
            List<DigitalOut> positions = new ArrayList<>();
            hw.positions().forEach(line -> positions.add(out(line)));
            Map<String, DigitalOut> tower = new LinkedHashMap<>();
            hw.tower().forEach((colour, line) -> tower.put(colour, out(line)));
            this.lamps = new GpioLamps(positions, tower);
            List<GpioOperatorInputs.Line> confirm = new ArrayList<>();
            hw.confirm().forEach(line -> confirm.add(in(line)));
            this.inputs = new GpioOperatorInputs(clock, in(hw.acknowledge()), in(hw.supervisorKey()),
                    hw.partPresent() == null ? null : in(hw.partPresent()),
                    hw.trigger() == null ? null : in(hw.trigger()), confirm);
            if (a.resetPin() >= 0) {
                DigitalOut reset = out(new OutputLine("hardware.adc.reset_pin", a.resetPin(), false));
                reset.set(false);
            }
            if (a.type() == AdcSettings.Type.ADS1256) {
                var link = board.spi("ADS1256", a.spiBus(), a.spiChipSelect(), a.spiClockHz(), 1, a.csPin());
                this.dataReady = board.isMock() ? new PacedDataReady(a.rateHz())
                        : new LineDataReady(board.input(new InputLine("hardware.adc.data_ready_pin", a.dataReadyPin(),
                        false, InputLine.Pull.NONE, 0)), a.rateHz());
                this.adc = new Ads1256(link, dataReady, clock, a.where(), a.inputPositive(), a.inputNegative(),
                        (int) a.gain(), a.rateHz(), a.referenceV(), a.buffer());
            } else {
                var link = board.spi("MCP3208", a.spiBus(), a.spiChipSelect(), a.spiClockHz(), 0, a.csPin());
                this.dataReady = new PacedDataReady(a.rateHz());
                this.adc = new Mcp3208(link, a.where(), a.inputPositive(), a.rateHz(), a.referenceV(), a.gain());
            }
            this.calibration = td.calibration(adc);
            if (simulated != null && shuntCal != null) {
                simulated.shunt(shuntCal::isActive);
            }
        } catch (RuntimeException e) {
            board.close();
            throw e;
        }
    }

    /** Opens the station's hardware; a machine without GPIO fails with a one-line {@link hammerstep.hardware.HardwareException}. */
    /** For tests: the hardware on a given board (a mock board with a recorded part). */
    static Pi4jHardware open(Pi4jBoard board, HardwareSettings hw, TransducerSettings td, StationClock clock) {
        return new Pi4jHardware(board, hw, td, clock, null);
    }

    Pi4jBoard board() {
        return board;
    }

    public static Pi4jHardware open(Mode mode, HardwareSettings hw, TransducerSettings td, StationClock clock) {
        if (mode == Mode.GPIO) {
            return new Pi4jHardware(Pi4jBoard.gpio(hw.adc().spiBus(), hw.adc().spiChipSelect()), hw, td, clock, null);
        }
        AdcSettings a = hw.adc();
        Calibration cal = td.calibration(a.fullScaleInputV(), a.gain(), a.bits());
        int offset = a.type() == AdcSettings.Type.ADS1256 ? MOCK_OFFSET_COUNTS : 3;
        int noise = a.type() == AdcSettings.Type.ADS1256 ? MOCK_NOISE_COUNTS : 1;
        SimulatedTransducer transducer = new SimulatedTransducer(cal, td, offset, noise, 42);
        SimulatedPart part = a.type() == AdcSettings.Type.ADS1256 ? new SimulatedAds1256(transducer)
                : new SimulatedMcp3208(transducer);
        return new Pi4jHardware(Pi4jBoard.mock(part), hw, td, clock, transducer);
    }

    private DigitalOut out(OutputLine line) {
        DigitalOut o = board.output(line);
        outputs.add(o);
        return o;
    }

    private GpioOperatorInputs.Line in(InputLine line) {
        DigitalIn i = board.input(line);
        return new GpioOperatorInputs.Line(i, line.debounceNs());
    }

    public boolean isMock() {
        return board.isMock();
    }

    public AdcDriver adc() {
        return adc;
    }

    public DataReady dataReady() {
        return dataReady;
    }

    /** Counts to N·m for this ADC and transducer. */
    public Calibration calibration() {
        return calibration;
    }

    public RelayToolEnable toolEnable() {
        return toolEnable;
    }

    /** The shunt calibration output, or null when the station file fits none. */
    public DigitalOut shuntCal() {
        return shuntCal;
    }

    public GpioLamps lamps() {
        return lamps;
    }

    public GpioOperatorInputs inputs() {
        return inputs;
    }

    /** The simulated transducer in mock mode (to set a torque), or null on real hardware. */
    public SimulatedTransducer simulatedTransducer() {
        return simulated;
    }

    /** Drops the relay, switches every output off, and releases the lines. */
    @Override
    public void close() {
        try {
            toolEnable.set(false);
            for (DigitalOut o : outputs) {
                o.set(false);
            }
        } finally {
            board.close();
        }
    }
}
