package hammerstep.hardware.pi4j;

import com.pi4j.Pi4J;
import com.pi4j.context.Context;
import com.pi4j.io.gpio.digital.DigitalInput;
import com.pi4j.io.gpio.digital.DigitalOutput;
import com.pi4j.io.gpio.digital.DigitalState;
import com.pi4j.io.gpio.digital.PullResistance;
import com.pi4j.io.spi.Spi;
import com.pi4j.io.spi.SpiMode;
import com.pi4j.plugin.gpiod.provider.gpio.digital.GpioDDigitalInputProvider;
import com.pi4j.plugin.gpiod.provider.gpio.digital.GpioDDigitalOutputProvider;
import com.pi4j.plugin.linuxfs.provider.spi.LinuxFsSpiProvider;
import com.pi4j.plugin.mock.provider.gpio.digital.MockDigitalInput;
import com.pi4j.plugin.mock.provider.gpio.digital.MockDigitalInputProvider;
import com.pi4j.plugin.mock.provider.gpio.digital.MockDigitalOutputProvider;
import hammerstep.hardware.DigitalIn;
import hammerstep.hardware.DigitalOut;
import hammerstep.hardware.HardwareException;
import hammerstep.hardware.InputLine;
import hammerstep.hardware.OutputLine;
import hammerstep.hardware.SimulatedPart;
import hammerstep.hardware.SpiLink;

import java.io.File;
import java.util.Locale;

/**
 * The Pi4J context and the lines made from it. The context is built explicitly, never
 * auto-detected: on the Raspberry Pi (4 and 5) GPIO comes from the gpiod providers and SPI from
 * linuxfs (spidev); in mock mode from Pi4J's mock GPIO providers and a simulated ADC on SPI.
 * Pi4J types stay in this package.
 */
final class Pi4jBoard implements AutoCloseable {

    private final Context context;
    private final boolean mock;
    private final String inputProvider;
    private final String outputProvider;
    private final String spiProvider;

    private Pi4jBoard(Context context, boolean mock) {
        this.context = context;
        this.mock = mock;
        this.inputProvider = mock ? MockDigitalInputProvider.ID : GpioDDigitalInputProvider.ID;
        this.outputProvider = mock ? MockDigitalOutputProvider.ID : GpioDDigitalOutputProvider.ID;
        this.spiProvider = mock ? SimulatedSpiProvider.ID : LinuxFsSpiProvider.ID;
    }

    /** The Raspberry Pi's own GPIO and SPI; throws a one-line {@link HardwareException} on a machine without them. */
    static Pi4jBoard gpio(int spiBus, int spiChipSelect) {
        requireGpio(spiBus, spiChipSelect);
        Context context = Pi4J.newContextBuilder()
                .noAutoDetect()
                .disableShutdownHook() // hammerstep run closes the board itself, after the loops stopped
                .add(GpioDDigitalInputProvider.newInstance(), GpioDDigitalOutputProvider.newInstance(),
                        LinuxFsSpiProvider.newInstance())
                .build();
        return new Pi4jBoard(context, false);
    }

    /** Pi4J's mock GPIO, and {@code adc} answering on SPI. */
    static Pi4jBoard mock(SimulatedPart adc) {
        Context context = Pi4J.newContextBuilder()
                .noAutoDetect()
                .disableShutdownHook() // hammerstep run closes the board itself, after the loops stopped
                .add(MockDigitalInputProvider.newInstance(), MockDigitalOutputProvider.newInstance(),
                        new SimulatedSpiProvider(adc))
                .build();
        return new Pi4jBoard(context, true);
    }

    /**
     * Fails with one line when this machine has no GPIO character device, is not an ARM board the
     * gpiod native library is built for, or lacks the spidev node.
     */
    static void requireGpio(int spiBus, int spiChipSelect) {
        File[] chips = new File("/dev").listFiles((dir, name) -> name.startsWith("gpiochip"));
        if (chips == null || chips.length == 0) {
            throw new HardwareException("no GPIO on this machine (no /dev/gpiochip*): run on the Raspberry Pi,"
                    + " or add --hardware mock for simulated hardware");
        }
        String arch = System.getProperty("os.arch", "").toLowerCase(Locale.ROOT);
        if (!(arch.equals("aarch64") || arch.startsWith("arm"))) {
            throw new HardwareException("GPIO access is built for the Raspberry Pi's ARM processor, this machine is "
                    + arch + ": add --hardware mock for simulated hardware");
        }
        String spidev = "/dev/spidev" + spiBus + "." + spiChipSelect;
        if (!new File(spidev).exists()) {
            throw new HardwareException("no " + spidev + ": enable SPI (dtparam=spi=on in config.txt) and reboot");
        }
    }

    Context context() {
        return context;
    }

    boolean isMock() {
        return mock;
    }

    /** An output driven to its inactive level now and again when the context shuts down. */
    DigitalOut output(OutputLine line) {
        DigitalState inactive = line.activeHigh() ? DigitalState.LOW : DigitalState.HIGH;
        DigitalOutput out;
        try {
            out = context.create(DigitalOutput.newConfigBuilder(context)
                    .id(id("out", line.pin()))
                    .name(line.name())
                    .address(line.pin())
                    .initial(inactive)
                    .shutdown(inactive)
                    .provider(outputProvider)
                    .build());
        } catch (RuntimeException e) {
            throw new HardwareException("cannot drive '" + line.name() + "' on GPIO " + line.pin() + ": " + message(e), e);
        }
        return new Output(out, line.activeHigh());
    }

    /** An input with its bias; in mock mode it starts at its inactive level. */
    DigitalIn input(InputLine line) {
        DigitalInput in;
        try {
            in = context.create(DigitalInput.newConfigBuilder(context)
                    .id(id("in", line.pin()))
                    .name(line.name())
                    .address(line.pin())
                    .pull(switch (line.pull()) {
                        case UP -> PullResistance.PULL_UP;
                        case DOWN -> PullResistance.PULL_DOWN;
                        case NONE -> PullResistance.OFF;
                    })
                    .debounce(0L)
                    .provider(inputProvider)
                    .build());
        } catch (RuntimeException e) {
            throw new HardwareException("cannot read '" + line.name() + "' on GPIO " + line.pin() + ": " + message(e), e);
        }
        if (in instanceof MockDigitalInput m) {
            m.mockState(line.activeHigh() ? DigitalState.LOW : DigitalState.HIGH);
        }
        return new Input(in, line.activeHigh());
    }

    /**
     * The SPI device at {@code /dev/spidev<bus>.<chipSelect>}; with {@code chipSelect} a GPIO
     * output ({@code csPin} ≥ 0) that the driver holds across a command and its answer.
     */
    SpiLink spi(String name, int bus, int chipSelect, int clockHz, int mode, int csPin) {
        Spi spi;
        try {
            spi = context.create(Spi.newConfigBuilder(context)
                    .id("spi" + bus + "-" + chipSelect)
                    .name(name)
                    .bus(bus)
                    .channel(chipSelect)
                    .baud(clockHz)
                    .mode(SpiMode.getByNumber(mode))
                    .provider(spiProvider)
                    .build());
        } catch (RuntimeException e) {
            throw new HardwareException("cannot open SPI " + bus + "." + chipSelect + " for " + name + ": " + message(e), e);
        }
        DigitalOut cs = csPin < 0 ? null : output(new OutputLine(name + " chip select", csPin, false));
        return new Pi4jSpiLink(spi, cs);
    }

    private static String id(String kind, int pin) {
        return kind + "-gpio" + pin;
    }

    private static String message(RuntimeException e) {
        return e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
    }

    @Override
    public void close() {
        context.shutdown();
    }

    private static final class Output implements DigitalOut {
        private final DigitalOutput out;
        private final DigitalState on;
        private final DigitalState off;

        Output(DigitalOutput out, boolean activeHigh) {
            this.out = out;
            this.on = activeHigh ? DigitalState.HIGH : DigitalState.LOW;
            this.off = activeHigh ? DigitalState.LOW : DigitalState.HIGH;
        }

        @Override
        public void set(boolean active) {
            out.state(active ? on : off);
        }

        @Override
        public boolean isActive() {
            return out.state() == on;
        }
    }

    private static final class Input implements DigitalIn {
        private final DigitalInput in;
        private final DigitalState on;

        Input(DigitalInput in, boolean activeHigh) {
            this.in = in;
            this.on = activeHigh ? DigitalState.HIGH : DigitalState.LOW;
        }

        @Override
        public boolean active() {
            return in.state() == on;
        }
    }
}
