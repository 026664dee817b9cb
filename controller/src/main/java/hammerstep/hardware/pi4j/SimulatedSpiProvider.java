package hammerstep.hardware.pi4j;

import com.pi4j.io.spi.Spi;
import com.pi4j.io.spi.SpiBase;
import com.pi4j.io.spi.SpiConfig;
import com.pi4j.io.spi.SpiProvider;
import com.pi4j.io.spi.SpiProviderBase;
import hammerstep.hardware.SimulatedPart;

/**
 * A Pi4J SPI provider whose device is a simulated ADC part: every transfer is one chip-select
 * frame of the SPI controller, answered by the {@link SimulatedPart}. Used for
 * {@code --hardware mock} (Pi4J's own mock SPI only echoes what was written) and in tests.
 */
final class SimulatedSpiProvider extends SpiProviderBase {

    static final String ID = "hammerstep-simulated-spi";

    private final SimulatedPart part;

    SimulatedSpiProvider(SimulatedPart part) {
        super(ID, "hammerstep simulated ADC on SPI");
        this.part = part;
    }

    @Override
    public int getPriority() {
        return 0;
    }

    @Override
    public Spi create(SpiConfig config) {
        Spi spi = new SimulatedSpi(this, config, part);
        context.registry().add(spi);
        return spi;
    }

    private static final class SimulatedSpi extends SpiBase {

        private final SimulatedPart part;

        SimulatedSpi(SpiProvider provider, SpiConfig config, SimulatedPart part) {
            super(provider, config);
            this.part = part;
        }

        @Override
        public int transfer(byte[] write, int writeOffset, byte[] read, int readOffset, int length) {
            part.exchange(write, writeOffset, read, readOffset, length);
            part.deselected();
            return length;
        }

        @Override
        public int read() {
            byte[] b = new byte[1];
            transfer(null, 0, b, 0, 1);
            return b[0] & 0xFF;
        }

        @Override
        public int read(byte[] buffer, int offset, int length) {
            return transfer(null, 0, buffer, offset, length);
        }

        @Override
        public int write(byte b) {
            return transfer(new byte[] {b}, 0, null, 0, 1);
        }

        @Override
        public int write(byte[] data, int offset, int length) {
            return transfer(data, offset, null, 0, length);
        }
    }
}
