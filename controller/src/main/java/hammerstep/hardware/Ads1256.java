package hammerstep.hardware;

import hammerstep.station.StationClock;

/**
 * Texas Instruments ADS1256: 24-bit delta-sigma ADC, PGA 1 to 64, up to 30 000 conversions per
 * second, data-ready line, external reference. Written from the register map of the datasheet
 * (SBAS288): registers STATUS 00h, MUX 01h, ADCON 02h, DRATE 03h; commands RREG 1rh, WREG 5rh,
 * RDATAC 03h, SDATAC 0Fh, SELFCAL F0h, RESET FEh. With a 7.68 MHz master clock.
 *
 * <p>For a bridge transducer: excitation across the bridge, the bridge output on a differential
 * input pair, VREF taken from the excitation by a divider to half of it (ratiometric). The part's
 * full-scale input is ±2·VREF / PGA, so {@link #fullScaleInputV()} is 2·VREF, which equals the
 * excitation in that wiring.
 *
 * <p>The driver uses read-data-continuous mode: after start, each conversion is three bytes clocked
 * out after data-ready falls, with no command, and chip select stays asserted until {@link #stop()}.
 * Chip select must be held across a command and its answer (the part needs t6 = 50 master clocks
 * between them), so the link's chip select is a GPIO rather than the SPI controller's own.
 */
public final class Ads1256 implements AdcDriver {

    public static final String PART = "ADS1256";

    // Registers (datasheet table "Register Map")
    static final int REG_STATUS = 0x00;
    static final int REG_MUX = 0x01;
    static final int REG_ADCON = 0x02;
    static final int REG_DRATE = 0x03;

    // Commands (datasheet table "Command Definitions")
    static final int CMD_WAKEUP = 0x00;
    static final int CMD_RDATAC = 0x03;
    static final int CMD_SDATAC = 0x0F;
    static final int CMD_RREG = 0x10;
    static final int CMD_WREG = 0x50;
    static final int CMD_SELFCAL = 0xF0;
    static final int CMD_SYNC = 0xFC;
    static final int CMD_RESET = 0xFE;

    // STATUS bits
    static final int STATUS_ACAL = 0x04;
    static final int STATUS_BUFEN = 0x02;

    /** Input code for AINCOM in MUX (PSEL/NSEL 1xxx). */
    public static final int AINCOM = 8;

    static final double CLOCK_HZ = 7.68e6;
    /** t6: 50 master clocks from the last command byte to the first data bit. */
    static final long T6_NS = (long) Math.ceil(50 / CLOCK_HZ * 1e9);
    /** t11: 4 master clocks after RREG, WREG, RDATA before the next command; 24 after SYNC. */
    static final long T11_NS = (long) Math.ceil(4 / CLOCK_HZ * 1e9);
    static final long T11_SYNC_NS = (long) Math.ceil(24 / CLOCK_HZ * 1e9);
    /** Pause after RESET before data-ready is trusted again (the part restarts its modulator). */
    static final long RESET_SETTLE_NS = 1_000_000L;

    /** Data rates of the DRATE register at 7.68 MHz, fastest first, with their codes. */
    static final double[] RATES_HZ = {30000, 15000, 7500, 3750, 2000, 1000, 500, 100, 60, 50, 30, 25, 15, 10, 5, 2.5};
    static final int[] RATE_CODES = {0xF0, 0xE0, 0xD0, 0xC0, 0xB0, 0xA1, 0x92, 0x82, 0x72, 0x63, 0x53, 0x43, 0x33,
            0x23, 0x13, 0x03};
    static final int[] GAINS = {1, 2, 4, 8, 16, 32, 64};

    private final SpiLink link;
    private final DataReady dataReady;
    private final StationClock clock;
    private final String where;
    private final int positiveInput;
    private final int negativeInput;
    private final int gain;
    private final double rateHz;
    private final double referenceV;
    private final boolean buffer;
    private final byte[] tx = new byte[8];
    private final byte[] rx = new byte[8];
    private boolean continuous;
    private int id = -1;

    /**
     * @param where         the link's name in messages, e.g. {@code spi0.0}
     * @param positiveInput AIN0..AIN7 as 0..7, AINCOM as {@link #AINCOM}
     * @param referenceV    VREF between VREFP and VREFN
     * @param buffer        the input buffer (high input impedance; input range AGND to AVDD − 2 V)
     */
    public Ads1256(SpiLink link, DataReady dataReady, StationClock clock, String where, int positiveInput,
                   int negativeInput, int gain, double rateHz, double referenceV, boolean buffer) {
        this.link = link;
        this.dataReady = dataReady;
        this.clock = clock;
        this.where = where;
        this.positiveInput = checkInput(positiveInput);
        this.negativeInput = checkInput(negativeInput);
        if (positiveInput == negativeInput) {
            throw new IllegalArgumentException("the two inputs must differ");
        }
        pgaCode(gain);
        rateCode(rateHz);
        this.gain = gain;
        this.rateHz = rateHz;
        this.referenceV = referenceV;
        this.buffer = buffer;
    }

    private static int checkInput(int input) {
        if (input < 0 || input > AINCOM) {
            throw new IllegalArgumentException("ADS1256 inputs are 0..7 (AIN0..AIN7) and 8 (AINCOM), was " + input);
        }
        return input;
    }

    /** The DRATE code of a rate the part supports; throws for any other rate. */
    public static int rateCode(double rateHz) {
        for (int i = 0; i < RATES_HZ.length; i++) {
            if (RATES_HZ[i] == rateHz) {
                return RATE_CODES[i];
            }
        }
        throw new IllegalArgumentException("ADS1256 rates are 30000, 15000, 7500, 3750, 2000, 1000, 500, 100, 60, 50,"
                + " 30, 25, 15, 10, 5, 2.5 Hz; was " + rateHz);
    }

    /** The ADCON PGA bits for a gain of 1, 2, 4, 8, 16, 32 or 64. */
    public static int pgaCode(int gain) {
        for (int i = 0; i < GAINS.length; i++) {
            if (GAINS[i] == gain) {
                return i;
            }
        }
        throw new IllegalArgumentException("ADS1256 gains are 1, 2, 4, 8, 16, 32, 64; was " + gain);
    }

    /** The MUX register: PSEL in the high nibble, NSEL in the low one. */
    public static int muxCode(int positiveInput, int negativeInput) {
        return (positiveInput << 4) | negativeInput;
    }

    /** STATUS as written: MSB first (ORDER 0), auto-calibration on, buffer as asked. */
    static int statusCode(boolean buffer) {
        return STATUS_ACAL | (buffer ? STATUS_BUFEN : 0);
    }

    /**
     * Encodes WREG of {@code values} from register {@code first} into {@code out}: 5rh, then the
     * count less one, then the values. Returns the frame length.
     */
    static int encodeWrite(int first, int[] values, byte[] out) {
        out[0] = (byte) (CMD_WREG | first);
        out[1] = (byte) (values.length - 1);
        for (int i = 0; i < values.length; i++) {
            out[2 + i] = (byte) values[i];
        }
        return 2 + values.length;
    }

    /** Encodes the two command bytes of RREG of {@code count} registers from {@code first}. */
    static void encodeRead(int first, int count, byte[] out) {
        out[0] = (byte) (CMD_RREG | first);
        out[1] = (byte) (count - 1);
    }

    /** A 24-bit two's-complement conversion, most significant byte first, as a signed int. */
    public static int decode24(byte msb, byte mid, byte lsb) {
        int raw = ((msb & 0xFF) << 16) | ((mid & 0xFF) << 8) | (lsb & 0xFF);
        return (raw << 8) >> 8;
    }

    @Override
    public String part() {
        return PART;
    }

    @Override
    public int bits() {
        return 24;
    }

    @Override
    public double rateHz() {
        return rateHz;
    }

    @Override
    public double fullScaleInputV() {
        return 2 * referenceV;
    }

    @Override
    public double gain() {
        return gain;
    }

    /** The chip ID from STATUS bits 7..4 as read at start, or −1 before. */
    public int chipId() {
        return id;
    }

    @Override
    public void start() {
        stop();
        command(CMD_RESET, RESET_SETTLE_NS);
        awaitDataReady("after reset");
        command(CMD_SDATAC, T11_NS);
        int[] settings = {statusCode(buffer), muxCode(positiveInput, negativeInput), pgaCode(gain), rateCode(rateHz)};
        link.select();
        int n = encodeWrite(REG_STATUS, settings, tx);
        link.exchange(tx, rx, n);
        link.release();
        link.pauseNs(T11_NS);
        verify(settings);
        command(CMD_SELFCAL, T11_NS);
        awaitDataReady("after self-calibration");
        command(CMD_SYNC, T11_SYNC_NS);
        command(CMD_WAKEUP, T11_NS);
        awaitDataReady("after sync");
        link.select();
        tx[0] = (byte) CMD_RDATAC;
        link.exchange(tx, rx, 1);
        link.pauseNs(T6_NS);
        continuous = true; // chip select stays asserted: each conversion is framed by data-ready
    }

    private void verify(int[] settings) {
        link.select();
        encodeRead(REG_STATUS, settings.length, tx);
        link.exchange(tx, rx, 2);
        link.pauseNs(T6_NS);
        for (int i = 0; i < settings.length; i++) {
            tx[i] = 0;
        }
        link.exchange(tx, rx, settings.length);
        link.release();
        link.pauseNs(T11_NS);
        boolean allSame = true;
        for (int i = 1; i < settings.length; i++) {
            allSame &= rx[i] == rx[0];
        }
        if (allSame && (rx[0] == 0 || rx[0] == (byte) 0xFF)) {
            throw new HardwareException(PART + " on " + where + " does not answer (registers read "
                    + hex(rx, settings.length) + "): check wiring, power and chip select");
        }
        id = (rx[0] & 0xF0) >> 4;
        boolean same = (rx[0] & 0x0E) == (settings[0] & 0x0E);
        for (int i = 1; i < settings.length; i++) {
            same &= (rx[i] & 0xFF) == settings[i];
        }
        if (!same) {
            throw new HardwareException(PART + " on " + where + " did not take its settings: wrote "
                    + hexInts(settings) + ", read back " + hex(rx, settings.length));
        }
    }

    private void command(int command, long afterNs) {
        link.select();
        tx[0] = (byte) command;
        link.exchange(tx, rx, 1);
        link.release();
        link.pauseNs(afterNs);
    }

    private void awaitDataReady(String when) {
        long now = clock.nanoTime();
        long deadline = now + 100_000_000L + (long) (4e9 / rateHz);
        while (!dataReady.ready(now)) {
            if (now - deadline > 0) {
                throw new HardwareException(PART + " on " + where + ": no data-ready " + when
                        + ": check the DRDY wiring and the master clock");
            }
            Thread.onSpinWait();
            now = clock.nanoTime();
        }
    }

    @Override
    public int read() {
        tx[0] = 0;
        tx[1] = 0;
        tx[2] = 0;
        link.exchange(tx, rx, 3);
        return decode24(rx[0], rx[1], rx[2]);
    }

    @Override
    public void stop() {
        if (continuous) {
            tx[0] = (byte) CMD_SDATAC;
            link.exchange(tx, rx, 1);
            link.release();
            link.pauseNs(T11_NS);
            continuous = false;
        }
    }

    private static String hex(byte[] b, int n) {
        StringBuilder s = new StringBuilder();
        for (int i = 0; i < n; i++) {
            s.append(i == 0 ? "" : " ").append(String.format("%02x", b[i] & 0xFF));
        }
        return s.toString();
    }

    private static String hexInts(int[] v) {
        StringBuilder s = new StringBuilder();
        for (int i = 0; i < v.length; i++) {
            s.append(i == 0 ? "" : " ").append(String.format("%02x", v[i] & 0xFF));
        }
        return s.toString();
    }
}
