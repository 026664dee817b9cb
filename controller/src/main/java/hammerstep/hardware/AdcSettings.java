package hammerstep.hardware;

/**
 * The ADC as the station file's {@code hardware.adc} section sets it.
 *
 * @param type          {@link Type#ADS1256} for mV/V bridge transducers, {@link Type#MCP3208} for amplified outputs
 * @param spiBus        SPI controller (0 for SPI0 on the header)
 * @param spiChipSelect the controller's chip-select line (CE0 = 0, CE1 = 1)
 * @param spiClockHz    serial clock
 * @param csPin         BCM pin driven as chip select, or −1 to use the controller's own
 * @param dataReadyPin  BCM pin of the part's data-ready output, or −1 for parts without one
 * @param resetPin      BCM pin wired to the part's reset input, or −1
 * @param inputPositive positive input (AIN0..AIN7 = 0..7, AINCOM = 8; MCP3208 CH0..CH7)
 * @param inputNegative negative input (ADS1256 only; −1 for the MCP3208)
 * @param gain          ADS1256: PGA gain; MCP3208: front-end ratio, volts at the pin per volt of output
 * @param rateHz        conversions per second
 * @param referenceV    VREF of the part
 * @param buffer        ADS1256 input buffer
 * @param blockSamples  samples per block handed to the station
 */
public record AdcSettings(
        Type type,
        int spiBus,
        int spiChipSelect,
        int spiClockHz,
        int csPin,
        int dataReadyPin,
        int resetPin,
        int inputPositive,
        int inputNegative,
        double gain,
        double rateHz,
        double referenceV,
        boolean buffer,
        int blockSamples) {

    public enum Type {
        ADS1256("ads1256"),
        MCP3208("mcp3208");

        private final String key;

        Type(String key) {
            this.key = key;
        }

        /** The name written in station files. */
        public String key() {
            return key;
        }
    }

    /** Resolution including the sign, as the driver reports it. */
    public int bits() {
        return type == Type.ADS1256 ? 24 : 12;
    }

    /** Volts that read as full positive code at gain 1, as the driver reports it (ADS1256 2·VREF, MCP3208 VREF/2). */
    public double fullScaleInputV() {
        return type == Type.ADS1256 ? 2 * referenceV : referenceV / 2;
    }

    /** The link's name in messages, e.g. {@code spi0.1}. */
    public String where() {
        return "spi" + spiBus + "." + spiChipSelect;
    }
}
