package hammerstep.hardware;

/**
 * Microchip MCP3208 (and the four-input MCP3204): 12-bit successive-approximation ADC, up to
 * 100 000 conversions per second at 5 V, converting on request. Written from the serial
 * communication section of the datasheet (DS21298): with 8-bit segments the request is
 * {@code 0000 01 S D2 | D1 D0 xx xxxx | xxxx xxxx} (start bit, S = 1 single-ended, D2..D0 the
 * input), and the answer is {@code ???? ???? | ???0 B11..B8 | B7..B0} with a null bit before the
 * result.
 *
 * <p>The part is unipolar (0 to VREF). For an amplified transducer output of ±5 V or ±10 V a
 * front-end network scales and shifts it so that zero torque sits at VREF/2; the driver reports
 * counts relative to mid-scale ({@code raw − 2048}), so 12 bits cover ±VREF/2 at the pin and
 * {@link #fullScaleInputV()} is VREF/2. {@link #gain()} is the network's ratio, volts at the pin per
 * volt of transducer output (e.g. 0.2 maps ±10 V to ±2 V around 2.048 V with VREF 4.096 V).
 */
public final class Mcp3208 implements AdcDriver {

    public static final String PART = "MCP3208";

    static final int MID_SCALE = 2048;
    static final int FRAME = 3;

    private final SpiLink link;
    private final String where;
    private final int input;
    private final double rateHz;
    private final double referenceV;
    private final double frontEndGain;
    private final byte[] tx = new byte[FRAME];
    private final byte[] rx = new byte[FRAME];
    private long badFrames;

    /**
     * @param input        CH0..CH7 as 0..7, single-ended
     * @param rateHz       conversions per second the acquisition requests
     * @param frontEndGain volts at the pin per volt of transducer output
     */
    public Mcp3208(SpiLink link, String where, int input, double rateHz, double referenceV, double frontEndGain) {
        if (input < 0 || input > 7) {
            throw new IllegalArgumentException("MCP3208 inputs are 0..7, was " + input);
        }
        if (!(rateHz > 0 && rateHz <= 100_000)) {
            throw new IllegalArgumentException("MCP3208 converts at most 100000 times a second, asked " + rateHz);
        }
        this.link = link;
        this.where = where;
        this.input = input;
        this.rateHz = rateHz;
        this.referenceV = referenceV;
        this.frontEndGain = frontEndGain;
        encodeRequest(input, tx);
    }

    /** The three request bytes for a single-ended conversion of {@code input}. */
    static void encodeRequest(int input, byte[] out) {
        out[0] = (byte) (0x06 | ((input >> 2) & 0x01));
        out[1] = (byte) ((input & 0x03) << 6);
        out[2] = 0;
    }

    /** The 12-bit result of an answer, or −1 when the null bit is not 0 (nothing drove the data line). */
    static int decode(byte[] answer) {
        if ((answer[1] & 0x10) != 0) {
            return -1;
        }
        return ((answer[1] & 0x0F) << 8) | (answer[2] & 0xFF);
    }

    @Override
    public String part() {
        return PART;
    }

    @Override
    public int bits() {
        return 12;
    }

    @Override
    public double rateHz() {
        return rateHz;
    }

    @Override
    public double fullScaleInputV() {
        return referenceV / 2;
    }

    @Override
    public double gain() {
        return frontEndGain;
    }

    /**
     * Answers whose null bit was not 0 since start. Each reads as the positive rail, so the
     * conditioner's over-range check turns a lost converter into a sensor fault, never a quiet zero.
     */
    public long badFrames() {
        return badFrames;
    }

    /** Checks that the part answers: a floating data line reads all ones, which fails the null bit. */
    @Override
    public void start() {
        badFrames = 0;
        for (int i = 0; i < 4; i++) {
            link.select();
            link.exchange(tx, rx, FRAME);
            link.release();
            if (decode(rx) < 0) {
                throw new HardwareException(PART + " on " + where + " does not answer (null bit high in "
                        + String.format("%02x %02x %02x", rx[0] & 0xFF, rx[1] & 0xFF, rx[2] & 0xFF)
                        + "): check wiring, power and chip select");
            }
        }
    }

    @Override
    public int read() {
        link.select();
        link.exchange(tx, rx, FRAME);
        link.release();
        int raw = decode(rx);
        if (raw < 0) {
            badFrames++;
            return MID_SCALE - 1;
        }
        return raw - MID_SCALE;
    }

    @Override
    public void stop() {
        // converts on request only: nothing to stop
    }
}
