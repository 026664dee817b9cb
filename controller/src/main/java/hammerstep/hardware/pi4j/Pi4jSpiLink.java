package hammerstep.hardware.pi4j;

import com.pi4j.io.spi.Spi;
import hammerstep.hardware.DigitalOut;
import hammerstep.hardware.HardwareException;
import hammerstep.hardware.SpiLink;

/**
 * An {@link SpiLink} on a Pi4J SPI device. With a GPIO chip select, {@link #select()} and
 * {@link #release()} drive it (active low) and the controller's own chip-select line is left
 * unconnected; without one, every exchange is its own frame on the controller's line.
 */
final class Pi4jSpiLink implements SpiLink {

    private final Spi spi;
    private final DigitalOut chipSelect;

    Pi4jSpiLink(Spi spi, DigitalOut chipSelect) {
        this.spi = spi;
        this.chipSelect = chipSelect;
    }

    @Override
    public void select() {
        if (chipSelect != null) {
            chipSelect.set(true);
        }
    }

    @Override
    public void release() {
        if (chipSelect != null) {
            chipSelect.set(false);
        }
    }

    @Override
    public void exchange(byte[] tx, byte[] rx, int length) {
        int n = spi.transfer(tx, 0, rx, 0, length);
        if (n != length) {
            throw new HardwareException("SPI transfer moved " + n + " of " + length + " bytes");
        }
    }

    @Override
    public void pauseNs(long ns) {
        long end = System.nanoTime() + ns;
        while (System.nanoTime() - end < 0) {
            Thread.onSpinWait();
        }
    }
}
