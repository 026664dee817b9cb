package hammerstep.hardware;

/**
 * The serial side of an MCP3208 in 8-bit segments: finds the start bit, takes the input selection,
 * and answers the null bit and 12 result bits, which come from a {@link CountSource} (signed,
 * around mid-scale). Framed by chip select, as the real part. For {@code --hardware mock} and tests.
 */
public final class SimulatedMcp3208 implements SimulatedPart {

    private final CountSource source;
    private int bitIndex = -1; // clocks since the start bit, -1 while waiting for it
    private int control;
    private int result;
    private int lastInput = -1;
    private long conversions;

    public SimulatedMcp3208(CountSource source) {
        this.source = source;
    }

    /** The input the last request selected, or −1. */
    public int lastInput() {
        return lastInput;
    }

    public long conversions() {
        return conversions;
    }

    @Override
    public void exchange(byte[] tx, int txOffset, byte[] rx, int rxOffset, int length) {
        for (int i = 0; i < length; i++) {
            int in = tx == null ? 0 : tx[txOffset + i] & 0xFF;
            int answer = 0;
            for (int bit = 7; bit >= 0; bit--) {
                int din = (in >> bit) & 1;
                int dout = clock(din);
                answer |= dout << bit;
            }
            if (rx != null) {
                rx[rxOffset + i] = (byte) answer;
            }
        }
    }

    /** One serial clock: takes DIN, returns DOUT. */
    private int clock(int din) {
        if (bitIndex < 0) {
            if (din == 1) {
                bitIndex = 0;
                control = 0;
            }
            return 0;
        }
        bitIndex++;
        if (bitIndex <= 4) { // SGL/DIFF, D2, D1, D0
            control = (control << 1) | din;
            if (bitIndex == 4) {
                lastInput = control & 0x07;
                int counts = Math.max(-2048, Math.min(2047, source.nextCounts()));
                result = counts + Mcp3208.MID_SCALE;
                conversions++;
            }
            return 0;
        }
        if (bitIndex <= 6) { // sample period, then the null bit
            return 0;
        }
        int resultBit = 18 - bitIndex; // B11 at clock 7 after the start bit
        if (resultBit >= 0) {
            return (result >> resultBit) & 1;
        }
        return 0;
    }

    @Override
    public void deselected() {
        bitIndex = -1;
    }
}
