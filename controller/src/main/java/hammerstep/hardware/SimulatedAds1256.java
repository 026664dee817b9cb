package hammerstep.hardware;

/**
 * The serial side of an ADS1256 as the part answers it, byte by byte: registers with their reset
 * values, WREG, RREG, RDATA, RDATAC/SDATAC, RESET; calibration and sync commands are taken and do
 * nothing. Conversions come from a {@link CountSource}. For {@code --hardware mock} and for tests;
 * no timing is modelled (the data-ready line of a simulated part is a timer).
 */
public final class SimulatedAds1256 implements SimulatedPart {

    static final int[] RESET_VALUES = {0x31, 0x01, 0x20, 0xF0, 0xE0, 0, 0, 0, 0, 0, 0};

    private final CountSource source;
    private final int[] registers = RESET_VALUES.clone();
    private boolean continuous;
    private int pendingCommand = -1; // RREG/WREG waiting for their count byte
    private int register;
    private int remainingIn; // WREG data bytes still to take
    private final int[] out = new int[16];
    private int outLength;
    private int outIndex;
    private long conversions;

    public SimulatedAds1256(CountSource source) {
        this.source = source;
    }

    /** Register {@code index} as the part holds it now. */
    public int register(int index) {
        return registers[index];
    }

    public boolean continuous() {
        return continuous;
    }

    /** Conversions clocked out so far. */
    public long conversions() {
        return conversions;
    }

    @Override
    public void exchange(byte[] tx, int txOffset, byte[] rx, int rxOffset, int length) {
        for (int i = 0; i < length; i++) {
            int b = tx == null ? 0 : tx[txOffset + i] & 0xFF;
            int answer = take(b);
            if (rx != null) {
                rx[rxOffset + i] = (byte) answer;
            }
        }
    }

    private int take(int b) {
        if (continuous) {
            if (b == Ads1256.CMD_SDATAC) {
                continuous = false;
                outLength = 0;
                return 0;
            }
            if (b == Ads1256.CMD_RESET) {
                reset();
                return 0;
            }
            if (outIndex >= outLength) {
                loadConversion();
            }
            return out[outIndex++];
        }
        if (outIndex < outLength) {
            return out[outIndex++];
        }
        if (remainingIn > 0) {
            if (register < registers.length) {
                registers[register] = register == Ads1256.REG_STATUS ? (registers[0] & 0xF1) | (b & 0x0E) : b;
            }
            register++;
            remainingIn--;
            return 0;
        }
        if (pendingCommand >= 0) {
            int count = (b & 0x0F) + 1;
            if (pendingCommand == Ads1256.CMD_WREG) {
                remainingIn = count;
            } else {
                outLength = 0;
                outIndex = 0;
                for (int k = 0; k < count; k++) {
                    int r = register + k;
                    out[outLength++] = r < registers.length ? registers[r] : 0;
                }
            }
            pendingCommand = -1;
            return 0;
        }
        switch (b & 0xF0) {
            case Ads1256.CMD_RREG, Ads1256.CMD_WREG -> {
                pendingCommand = b & 0xF0;
                register = b & 0x0F;
                return 0;
            }
            default -> {
                // single-byte commands below
            }
        }
        if (b == 0x01) { // RDATA
            loadConversion();
        } else if (b == Ads1256.CMD_RDATAC) {
            continuous = true;
            outLength = 0;
            outIndex = 0;
        } else if (b == Ads1256.CMD_RESET) {
            reset();
        }
        return 0;
    }

    private void loadConversion() {
        int counts = Math.max(-0x800000, Math.min(0x7FFFFF, source.nextCounts()));
        out[0] = (counts >> 16) & 0xFF;
        out[1] = (counts >> 8) & 0xFF;
        out[2] = counts & 0xFF;
        outLength = 3;
        outIndex = 0;
        conversions++;
    }

    private void reset() {
        System.arraycopy(RESET_VALUES, 0, registers, 0, registers.length);
        continuous = false;
        pendingCommand = -1;
        remainingIn = 0;
        outLength = 0;
        outIndex = 0;
    }
}
